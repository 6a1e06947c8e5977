/**
 * Negation: what a query, or a page's title, summary and aliases, says is NOT there. Juniors describe
 * a plate by what is missing as well as by what is in it ("they didn't shoot a clean plate", "no
 * tracking data"); without this, "clean plate" in such a query counts for the page titled "Rig
 * removal with a clean plate", the one method it rules out.
 *
 * A negator covers the next few content words of its clause ("no clean plate" → clean, plate), up
 * to a clause mark, a conjunction, a question word, an infinitive's "to" or a preposition. What
 * "not" and "didn't" deny depends on the verb (VERB_NEGATORS below): "doesn't match" says what is
 * wrong, "didn't shoot a clean plate" what is missing. Ranking (engine.ts) then lifts pages whose
 * own short fields deny the same thing and lowers pages whose title names it plainly.
 */
import { FILLER_WEIGHT, isPlaceWord, isStopWord, queryWordWeight, tokenize, type Token } from "./text";

// Contractions are typed with or without the apostrophe; tokenize drops it ("didn't" → "didnt").
/** Negators of a noun phrase: what follows is what is missing ("no tracking data", "without markers"). */
const PHRASE_NEGATORS = new Set("no without none nothing nor".split(" "));
/**
 * Negators of a verb or a state. "it isn't sharp", "the grain doesn't match", "didn't remove the
 * wire" say what is wrong, not what is missing, and deny nothing — unless the verb is one of having
 * ("didn't shoot a clean plate", "didn't get any tracking data") or a determiner follows ("there
 * isn't a clean plate"): then what follows is what is missing; or the verb is one of motion ("the
 * camera doesn't move"): whether the camera moves is what splits many methods (locked-off or
 * moving), so the motion itself is denied. "can't", "won't" and the like are about the asker
 * ("can't get rid of the shimmer", "can't remove the wire") and deny nothing.
 */
const VERB_NEGATORS = new Set("not never dont doesnt didnt isnt arent wasnt werent hasnt havent hadnt aint".split(" "));
const HAVING_VERBS = new Set(
  "get gets got have has had shoot shoots shot film filmed capture captured take took taken record recorded grab grabbed give gave given send sent provide provided supply supplied".split(" "),
);
const MOTION_VERBS = new Set("move moves moved moving pan pans panned panning shake shakes shook shaking drift drifts drifted drifting".split(" "));
const DETERMINERS = new Set("an any the enough much many".split(" "));
const AUXILIARIES = new Set("do does did is are was were has have had".split(" "));
/**
 * Where a negation's reach ends: a new clause, a question word, an infinitive, a preposition ("no
 * tracking data on this shot" denies the data, not the shot). The place words of text.ts ("against",
 * "during", "onto"…) end it too (`isPlaceWord`), so they are not repeated here.
 */
const SCOPE_ENDS = new Set(
  (
    "and but or so because if when while then though although until unless how what why where which who whom whose to " +
    "on in at of for from with by into over under behind through across between after before near"
  ).split(" "),
);
/** First after "no", these are about the asker: "no idea what the specks are" denies no speck. */
const HEDGES = new Set("idea clue clues".split(" "));
const CLAUSE_MARK = /[.,;:!?()[\]"]/;
/** Content words one negator covers at most. */
export const NEGATION_REACH = 3;

export type NegatedWord = {
  word: string;
  /**
   * "without" often states a circumstance, not what is missing from the plate ("a clean pass
   * without the rig" is the clean plate the method needs): such words lift pages that deny them too
   * but lower no page.
   */
  isCircumstance: boolean;
};

/** One negator and what it covers: `start`–`end` spans the text from the negator to its last word. */
type Denial = { words: NegatedWord[]; start: number; end: number };

/** Each denial in `text`: the words it covers, and the phrase as written ("didn't shoot a clean plate"). */
export function readDenials(text: string): { words: NegatedWord[]; phrase: string }[] {
  return denials(text).map((d) => ({ words: d.words, phrase: text.slice(d.start, d.end) }));
}

function denials(text: string): Denial[] {
  const tokens = tokenize(text);
  const isNewClause = (j: number): boolean => CLAUSE_MARK.test(text.slice((tokens[j - 1] as Token).end, (tokens[j] as Token).start));
  const out: Denial[] = [];
  for (let i = 0; i < tokens.length; i++) {
    const negator = tokens[i] as Token;
    // "does not move" reads better whole than "not move".
    const auxiliary = negator.word === "not" && i > 0 && AUXILIARIES.has((tokens[i - 1] as Token).word) ? (tokens[i - 1] as Token) : negator;
    let from = i + 1;
    if (VERB_NEGATORS.has(negator.word)) {
      const next = tokens[from];
      if (!next || isNewClause(from)) continue;
      if (MOTION_VERBS.has(next.word)) {
        out.push({ words: [{ word: next.word, isCircumstance: false }], start: auxiliary.start, end: next.end });
        continue;
      }
      // "didn't shoot a clean plate": what is missing is the verb's object.
      if (HAVING_VERBS.has(next.word)) from++;
      // "isn't sharp": wrong, not missing. tokenize leaves single letters out, so "a" shows as a gap.
      else if (!DETERMINERS.has(next.word) && !/\ba\b/i.test(text.slice(negator.end, next.start))) continue;
    } else if (!PHRASE_NEGATORS.has(negator.word)) continue;
    const denial: Denial = { words: [], start: auxiliary.start, end: negator.end };
    for (let j = from; j < tokens.length && denial.words.length < NEGATION_REACH; j++) {
      if (isNewClause(j)) break;
      const w = (tokens[j] as Token).word;
      if (SCOPE_ENDS.has(w) || isPlaceWord(w) || PHRASE_NEGATORS.has(w) || VERB_NEGATORS.has(w) || (denial.words.length === 0 && HEDGES.has(w))) break;
      if (isStopWord(w) || queryWordWeight(w) <= FILLER_WEIGHT) continue;
      denial.words.push({ word: w, isCircumstance: negator.word === "without" });
      denial.end = (tokens[j] as Token).end;
    }
    if (denial.words.length > 0) out.push(denial);
  }
  return out;
}

/** The content words that `text` says are not there, in order. */
export function negatedWords(text: string): NegatedWord[] {
  return denials(text).flatMap((d) => d.words);
}

/** How much a page's score changes when the query denies something: see `negationFactor`. */
export const NEGATION_WEIGHTS = { sharedDenial: 1.5, namedInTitle: 0.5 } as const;

/**
 * The factor on a page's score for a query that denies `queryDenies` (stems): × sharedDenial when the
 * page's title, summary or aliases deny one of them too ("Rebuilding the background when no clean
 * plate was shot"), else × namedInTitle when its title names one plainly ("Rig removal with a clean
 * plate"), else 1.
 */
export function negationFactor(queryDenies: ReadonlyMap<string, boolean>, pageDenies: ReadonlySet<string>, titleNames: (stem: string) => boolean): number {
  for (const stem of queryDenies.keys()) if (pageDenies.has(stem)) return NEGATION_WEIGHTS.sharedDenial;
  for (const [stem, isCircumstance] of queryDenies) if (!isCircumstance && titleNames(stem)) return NEGATION_WEIGHTS.namedInTitle;
  return 1;
}
