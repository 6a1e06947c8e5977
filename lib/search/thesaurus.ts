/**
 * The trade thesaurus at query time. Leads keep two kinds of entry (table `thesaurus_entries`):
 * - synonyms: every term means the others ("regrain", "grain restore", "put grain back");
 * - narrower: each term also means the broader one, but not the other way round ("tracker",
 *   "tape cross", "dot" → "marker": a search for "marker" does not pull in every page with a dot).
 * Terms may be phrases. Compiled once per change into rules keyed by the stems of each source term;
 * the query parser finds the longest rules that its words spell and adds their targets as weaker
 * alternatives (see scoring.ts for the weights).
 *
 * A term written in double quotes ("backing", quotes included) is met only by its words as written
 * or their plurals: the stemmer makes "backing" (a screen) and "back" (of the shot) one word, and
 * only a lead knows which terms that must not happen to. Quotes decide what a query must say and
 * which page words a result highlights for the term; the pages a term finds are still found by its
 * word family.
 */
import type { LexiconEntry } from "./lexicon";
import { isStopWord, tokenize } from "./text";

export type ThesaurusEntry =
  | { id?: string; kind: "synonyms"; terms: readonly string[] }
  | { id?: string; kind: "narrower"; broader: string; terms: readonly string[] };

/**
 * "related": from the built-in symptom lexicon (lexicon.ts), weaker than any lead's entry.
 * `exact`: a quoted term's words, the only page words a result highlights for it.
 */
export type ThesaurusTarget = { stems: string[]; text: string; kind: "synonym" | "broader" | "related"; exact?: string[] };
/** `exact`: the source's words as written, each of which the query must say exactly (a quoted term). */
export type ThesaurusRule = { source: string[]; exact?: string[]; text: string; targets: ThesaurusTarget[] };

/** A term written in double quotes: the text inside them, else null. */
export function quotedTerm(term: string): string | null {
  const m = /^"([^"]+)"$/.exec(term.trim());
  return m ? (m[1] as string).trim() : null;
}

export type CompiledThesaurus = {
  /** Rules by the first stem of their source, longest source first. */
  rulesByFirstStem: Map<string, ThesaurusRule[]>;
  /** Every word the thesaurus uses, so spelling correction can reach "people" before any page says it. */
  words: Set<string>;
  entryCount: number;
};

export const EMPTY_THESAURUS: CompiledThesaurus = { rulesByFirstStem: new Map(), words: new Set(), entryCount: 0 };

/** Content stems of a phrase, as the query parser sees them (stop words dropped, compounds whole). */
export function phraseStems(phrase: string, stemOf: (word: string) => string): string[] {
  return tokenize(phrase)
    .filter((t) => !isStopWord(t.word))
    .map((t) => stemOf(t.word));
}

const STRENGTH: Record<ThesaurusTarget["kind"], number> = { synonym: 3, broader: 2, related: 1 };

/**
 * `lexicon` (the built-in symptom words, lexicon.ts) adds one-way "related" rules under the leads'
 * entries: where a lead's entry links the same terms, the lead's kind stands.
 */
export function compileThesaurus(entries: readonly ThesaurusEntry[], stemOf: (word: string) => string, lexicon: readonly LexiconEntry[] = []): CompiledThesaurus {
  const rules = new Map<string, ThesaurusRule>();
  const words = new Set<string>();
  type Term = { stems: string[]; text: string; exact?: string[] };
  const term = (written: string): Term | null => {
    const quoted = quotedTerm(written);
    const clean = (quoted ?? written).trim().toLowerCase();
    const content = tokenize(clean).filter((t) => !isStopWord(t.word));
    for (const t of content) words.add(t.word);
    const stems = content.map((t) => stemOf(t.word));
    if (stems.length === 0) return null;
    return quoted === null ? { stems, text: clean } : { stems, text: clean, exact: content.map((t) => t.word) };
  };
  const addRule = (source: Term, target: Term, kind: ThesaurusTarget["kind"]): void => {
    if (source.stems.join(" ") === target.stems.join(" ")) return;
    const key = (source.exact ? `"${source.exact.join(" ")}"` : "") + source.stems.join(" ");
    let rule = rules.get(key);
    if (!rule) {
      rule = source.exact ? { source: source.stems, exact: source.exact, text: source.text, targets: [] } : { source: source.stems, text: source.text, targets: [] };
      rules.set(key, rule);
    }
    const existing = rule.targets.find((t) => t.stems.join(" ") === target.stems.join(" "));
    // A synonym link is stronger than a narrower one, and both than a lexicon one; keep the stronger.
    if (existing) {
      if (STRENGTH[kind] > STRENGTH[existing.kind]) existing.kind = kind;
      // The same words unquoted somewhere: every form of them may be highlighted.
      if (!target.exact) delete existing.exact;
    } else rule.targets.push(target.exact ? { stems: target.stems, text: target.text, kind, exact: target.exact } : { stems: target.stems, text: target.text, kind });
  };
  for (const entry of entries) {
    const terms = entry.terms.map(term).filter((t): t is NonNullable<typeof t> => t !== null);
    if (entry.kind === "synonyms") {
      for (const a of terms) for (const b of terms) if (a !== b) addRule(a, b, "synonym");
    } else {
      const broader = term(entry.broader);
      if (broader) for (const n of terms) addRule(n, broader, "broader");
    }
  }
  for (const entry of lexicon) {
    const targets = entry.means.map(term).filter((t): t is NonNullable<typeof t> => t !== null);
    for (const seen of entry.seen) {
      const source = term(seen);
      if (source) for (const target of targets) addRule(source, target, "related");
    }
  }
  const rulesByFirstStem = new Map<string, ThesaurusRule[]>();
  for (const rule of rules.values()) {
    const first = rule.source[0] as string;
    rulesByFirstStem.set(first, [...(rulesByFirstStem.get(first) ?? []), rule]);
  }
  for (const list of rulesByFirstStem.values()) list.sort((a, b) => b.source.length - a.source.length);
  return { rulesByFirstStem, words, entryCount: entries.length };
}

/** A quoted term's word as typed, or its plural ("crosses" for "cross"): never another form of it. */
export function isWordOrPlural(typed: string, word: string): boolean {
  return typed === word || typed === `${word}s` || typed === `${word}es`;
}

export type PhraseMatch = { first: number; count: number; rule: ThesaurusRule };

/**
 * The thesaurus rules a sequence of query stems spells, longest first and without overlap, left to
 * right. `stemsAt(i)` gives the stems position i may stand for (its own and any spelling correction),
 * `wordsAt(i)` the words (as typed and corrected) that a quoted term must meet.
 */
export function findPhrases(length: number, stemsAt: (i: number) => readonly string[], thesaurus: CompiledThesaurus, wordsAt: (i: number) => readonly string[] = stemsAt): PhraseMatch[] {
  const out: PhraseMatch[] = [];
  for (let i = 0; i < length; ) {
    let found: PhraseMatch | undefined;
    for (const first of stemsAt(i)) {
      for (const rule of thesaurus.rulesByFirstStem.get(first) ?? []) {
        if (i + rule.source.length > length || (found && found.count >= rule.source.length)) continue;
        const spelt = rule.source.every((s, k) => stemsAt(i + k).includes(s) && (!rule.exact || wordsAt(i + k).some((w) => isWordOrPlural(w, rule.exact?.[k] as string))));
        if (spelt) found = { first: i, count: rule.source.length, rule };
      }
    }
    if (found) {
      out.push(found);
      i += found.count;
    } else i++;
  }
  return out;
}
