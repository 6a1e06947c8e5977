/**
 * Negation: what a query, or a page's title, summary and aliases, says is NOT there. Juniors describe
 * a plate by what is missing as often as by what is in it ("they didn't shoot a clean plate", "no
 * tracking data", "the camera doesn't move"); without this, "clean plate" in such a query counts
 * for the page titled "Rig removal with a clean plate", the one method it rules out.
 *
 * A negator covers the next few content words of its clause ("didn't shoot a clean plate" → shoot,
 * clean, plate), up to a clause mark, a conjunction, a question word, an infinitive's "to" or a
 * preposition; a negated hedge ("not sure how to…", "don't know…") is about the asker, not the
 * plate, and covers nothing. Ranking (engine.ts) then lifts pages whose own short fields deny the same thing and
 * lowers pages whose title names it plainly.
 */
import { FILLER_WEIGHT, isStopWord, queryWordWeight, tokenize } from "./text";

// Contractions are typed with or without the apostrophe; tokenize drops it ("didn't" → "didnt").
const NEGATORS = new Set(
  "no not never without none nothing nor dont doesnt didnt isnt arent wasnt werent cant cannot couldnt wont wouldnt shouldnt hasnt havent hadnt".split(" "),
);
/**
 * Where a negation's reach ends: a new clause, a question word, an infinitive, a preposition ("no
 * tracking data on this shot" denies the data, not the shot).
 */
const SCOPE_ENDS = new Set(
  (
    "and but or so because if when while then though although until unless how what why where which who whom whose to " +
    "on in at of for from with by into onto over under behind through across between during after before near"
  ).split(" "),
);
/** Negated first, these are about the asker: "not sure how to remove wires" denies no wire. */
const HEDGES = new Set("sure know understand think idea clue".split(" "));
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

function denials(text: string): Denial[] {
  const tokens = tokenize(text);
  const out: Denial[] = [];
  for (let i = 0; i < tokens.length; i++) {
    const negator = tokens[i] as (typeof tokens)[number];
    if (!NEGATORS.has(negator.word)) continue;
    const denial: Denial = { words: [], start: negator.start, end: negator.end };
    for (let j = i + 1; j < tokens.length && denial.words.length < NEGATION_REACH; j++) {
      const prev = tokens[j - 1] as (typeof tokens)[number];
      const tok = tokens[j] as (typeof tokens)[number];
      if (CLAUSE_MARK.test(text.slice(prev.end, tok.start))) break;
      const w = tok.word;
      if (SCOPE_ENDS.has(w) || NEGATORS.has(w) || (denial.words.length === 0 && HEDGES.has(w))) break;
      if (isStopWord(w) || queryWordWeight(w) <= FILLER_WEIGHT) continue;
      denial.words.push({ word: w, isCircumstance: negator.word === "without" });
      denial.end = tok.end;
    }
    if (denial.words.length > 0) out.push(denial);
  }
  return out;
}

/** The content words that `text` says are not there, in order. */
export function negatedWords(text: string): NegatedWord[] {
  return denials(text).flatMap((d) => d.words);
}

/** Each denial as written, from its negator to its last word ("didn't shoot a clean plate"), for people to read. */
export function denialPhrases(text: string): string[] {
  return denials(text).map((d) => text.slice(d.start, d.end));
}

/** How much a page's score changes when the query denies something: see `negationFactor`. */
export const NEGATION_WEIGHTS = { sharedDenial: 1.5, namedInTitle: 0.5 } as const;

/**
 * The factor on a page's score for a query that denies `queryDenies` (stems): × sharedDenial when the
 * page's title, summary or aliases deny one of them too ("Rebuilding the background when no clean
 * plate was shot"), else × namedInTitle when its title names one plainly ("Rig removal with a clean
 * plate"), else 1.
 */
export function negationFactor(queryDenies: ReadonlyMap<string, boolean>, pageDenies: ReadonlySet<string>, titleNames: ReadonlySet<string>): number {
  for (const stem of queryDenies.keys()) if (pageDenies.has(stem)) return NEGATION_WEIGHTS.sharedDenial;
  for (const [stem, isCircumstance] of queryDenies) if (!isCircumstance && titleNames.has(stem) && !pageDenies.has(stem)) return NEGATION_WEIGHTS.namedInTitle;
  return 1;
}
