/**
 * What the engine knows about English beyond the pages: which words are real words (so spelling
 * correction never "corrects" them) and which British and American spellings are the same word.
 *
 * - Real words: the word-list package (~274,000 English words, maintained, MIT); for spelling
 *   correction also whatever the Hunspell dictionaries below pass by their affix rules (nspell, as a
 *   browser's spell-checker reads them: "dept"), so it never changes a word a spell-checker passes.
 * - Spelling variants: the words that only the British Hunspell dictionary has (dictionary-en-gb)
 *   paired with words that only the American one has (dictionary-en), where a known spelling rule
 *   turns one into the other (colour/color, grey/gray, centre/center, stabilise/stabilize…).
 *
 * - Everyday words related to a word: WordNet 3.1 (wordnet.ts), for query words the pages do not use.
 *
 * Loading reads ~3.8 MB of package files (and WordNet's ~27 MB) once per process (`loadLanguage`);
 * tests may build a small `Language` with `createLanguage`.
 */
import { snowballStem } from "./stemming";
import { WordTable } from "./word-table";
import { EMPTY_WORDNET, loadWordNet, type WordNet } from "./wordnet";

export type Language = {
  /** True for a word of the English word list (lower case). */
  isEnglishWord(word: string): boolean;
  /**
   * True for a word of the list or one that Hunspell's British or American dictionary passes (lower
   * case): what spelling correction must leave alone. Not for the halves of a run-together word, where
   * the affix rules' short abbreviations ("rs", "vs") would split "markrs" into "mark rs".
   */
  passesSpellCheck(word: string): boolean;
  /** The American stem for a British one ("colour" → "color"), else the stem itself. */
  normaliseStem(stem: string): string;
  /** British → American word pairs in use (for documentation and tests). */
  variantPairs: readonly (readonly [string, string])[];
  /** WordNet's synonyms and broader words of an everyday word (empty in small test languages). */
  wordNet: WordNet;
};

// British → American spelling rules, as endings or inner letters (common knowledge of the two
// spellings). A rule only pairs words when the British form is in the British dictionary alone and
// the American form in the American one alone, so "tour"/"tor" or "ise"/"ize" in "wise" never pair.
const VARIANT_RULES: readonly (readonly [RegExp, string])[] = [
  [/our/, "or"], // colour, harbour, behaviour
  [/is(e|ed|es|ing|ation|ations|er|ers)$/, "iz$1"], // stabilise, normalisation
  [/ys(e|ed|es|ing)$/, "yz$1"], // analyse
  [/tre(s?)$/, "ter$1"], // centre, metre, fibre
  [/ogue(s?)$/, "og$1"], // catalogue, analogue
  [/ence(s?)$/, "ense$1"], // defence, licence
  [/ll(ed|ing|er|ers)$/, "l$1"], // travelled, levelling
  [/ae/, "e"], // anaemia
  [/oe/, "e"], // manoeuvre
  [/ey$/, "ay"], // grey
  [/yre(s?)$/, "ire$1"], // tyre
  [/ould/, "old"], // mould, smoulder
  [/amme(s?)$/, "am$1"], // programme
  [/que(s?)$/, "ck$1"], // cheque
  [/ough$/, "ow"], // plough
];

/** British-only words paired with American-only words by the rules above. */
export function deriveVariantPairs(americanOnly: ReadonlySet<string>, britishOnly: Iterable<string>): [string, string][] {
  const pairs: [string, string][] = [];
  for (const gb of britishOnly) {
    for (const [rule, replacement] of VARIANT_RULES) {
      const us = gb.replace(rule, replacement);
      if (us !== gb && americanOnly.has(us)) {
        pairs.push([gb, us]);
        break;
      }
    }
  }
  return pairs.sort((a, b) => a[0].localeCompare(b[0]));
}

/** A spell-checker's verdict on one lower-case word. */
export type SpellChecker = (word: string) => boolean;

export function createLanguage(
  words: Iterable<string>,
  variantPairs: readonly (readonly [string, string])[],
  wordNet: WordNet = EMPTY_WORDNET,
  spellCheckers: readonly SpellChecker[] = [],
): Language {
  const list = new WordTable([...new Set([...words].map((w) => w.trim().toLowerCase()).filter(Boolean))].sort());
  const stemMap = new Map<string, string>();
  for (const [gb, us] of variantPairs) {
    const from = snowballStem(gb);
    const to = snowballStem(us);
    if (from !== to && !stemMap.has(from)) stemMap.set(from, to);
  }
  return {
    isEnglishWord: (word) => list.has(word),
    passesSpellCheck: (word) => list.has(word) || spellCheckers.some((accepts) => accepts(word)),
    normaliseStem: (stem) => stemMap.get(stem) ?? stem,
    variantPairs,
    wordNet,
  };
}

/** Hunspell .dic entries without their affix flags: lower-case letter-only stems. */
function dictionaryStems(dic: Uint8Array): Set<string> {
  const out = new Set<string>();
  const lines = new TextDecoder().decode(dic).split("\n");
  for (let i = 1; i < lines.length; i++) {
    const w = (lines[i] as string).split("/")[0] as string;
    if (/^[a-z]+$/.test(w)) out.add(w);
  }
  return out;
}

let loading: Promise<Language> | undefined;

/** The process-wide language data, read from the packages on first use. */
export function loadLanguage(): Promise<Language> {
  loading ??= (async () => {
    const [{ default: wordListPath }, { default: american }, { default: british }, { default: nspell }, fs, wordNet] = await Promise.all([
      import("word-list"),
      import("dictionary-en"),
      import("dictionary-en-gb"),
      import("nspell"),
      import("node:fs/promises"),
      loadWordNet(),
    ]);
    const words = (await fs.readFile(wordListPath, "utf8")).split("\n");
    const us = dictionaryStems(american.dic);
    const gb = dictionaryStems(british.dic);
    const americanOnly = new Set([...us].filter((w) => !gb.has(w)));
    const britishOnly = [...gb].filter((w) => !us.has(w));
    // ~0.3 s and ~20 MB for both: the affix rules make "dept" or "colours" words the stem list lacks.
    const spellers = [american, british].map((d) => nspell({ aff: Buffer.from(d.aff), dic: Buffer.from(d.dic) }));
    const checkers = spellers.map((sp): SpellChecker => (word) => sp.correct(word));
    return createLanguage([...words, ...us, ...gb], deriveVariantPairs(americanOnly, britishOnly), wordNet, checkers);
  })();
  return loading;
}
