/**
 * Scores the search quality set (tests/unit/search/quality): top-1, top-3 and mean reciprocal rank
 * per query kind, the held-out quarter apart from the rest, and how many correctly spelt words the
 * engine "corrected". Used by bench/search.ts and the quality test.
 *
 * "Correctly spelt" is judged by Hunspell (nspell) with the en-US and en-GB dictionaries, an
 * independent list from the one the engine protects words with (word-list), plus the words of the
 * corpus itself (trade words such as "despill" are spelt right when the pages spell them so).
 */
import { type Meaning, searchWithMeaning } from "@/lib/search/meaning";
import type { SearchDocument, SearchIndex, SearchResponse } from "@/lib/search/types";
import { tokenize } from "@/lib/search/text";
import { heldOutBatch, isDevBatch, isHeldOut, QUERY_KINDS, type QualityQuery, type QueryKind } from "@/tests/unit/search/quality/queries";

export type KindScore = { kind: QueryKind | "all"; queries: number; top1: number; top3: number; mrr: number };
export type QualityReport = {
  tuned: KindScore[];
  heldOut: KindScore[];
  /** The held-out queries per batch (first quarter, second and third batch), to show generalisation apart. */
  heldOutBatches: Record<"first-quarter" | "second" | "third", KindScore[]>;
  /** The tuned part split: the first set's tuned three quarters, and the development batch. */
  tunedBatches: Record<"first-set" | "dev", KindScore[]>;
  all: KindScore[];
  /** Misses (not first) among the tuned queries only: the held-out ones are not listed on purpose. */
  tunedMisses: string[];
  heldOutMissCount: number;
  realWordsCorrected: { count: number; examples: string[]; wordsChecked: number };
};

export type SpellJudge = (word: string) => boolean;

function score(kind: KindScore["kind"], ranks: number[]): KindScore {
  const n = ranks.length;
  const pct = (v: number) => Math.round((1000 * v) / Math.max(1, n)) / 10;
  return {
    kind,
    queries: n,
    top1: pct(ranks.filter((r) => r === 1).length),
    top3: pct(ranks.filter((r) => r >= 1 && r <= 3).length),
    mrr: Math.round((1000 * ranks.reduce((s, r) => s + (r > 0 ? 1 / r : 0), 0)) / Math.max(1, n)) / 1000,
  };
}

function table(rows: { q: QualityQuery; rank: number }[]): KindScore[] {
  const out = QUERY_KINDS.map((k) => score(k, rows.filter((r) => r.q.kind === k).map((r) => r.rank)));
  out.push(score("all", rows.map((r) => r.rank)));
  return out;
}

/** How a query is run: the engine alone (`index.search`) or with ranking by meaning (`searchWithMeaning`). */
export type QualitySearch = (query: string) => SearchResponse | Promise<SearchResponse>;

const QUALITY_OPTIONS = { audience: "published", limit: 20 } as const;

/** The engine alone, as the quality set's search. */
export const byWords =
  (index: SearchIndex): QualitySearch =>
  (query) =>
    index.search(query, QUALITY_OPTIONS);

/** What people get: the engine, then ranking by meaning. */
export const byWordsThenMeaning =
  (index: SearchIndex, meaning: Meaning): QualitySearch =>
  (query) =>
    searchWithMeaning(index, query, QUALITY_OPTIONS, meaning);

/** Rank (1-based, 0 = not in the first 20) of each query's expected page, published audience. */
export async function evaluateQuality(
  search: QualitySearch,
  queries: readonly QualityQuery[],
  isCorrectWord: SpellJudge,
  /** Which queries are held out of tuning (their misses are never listed); the unseen set passes `() => true`. */
  isHeldOutQuery: (q: QualityQuery) => boolean = isHeldOut,
): Promise<QualityReport> {
  const rows: { q: QualityQuery; rank: number }[] = [];
  const tunedMisses: string[] = [];
  let heldOutMissCount = 0;
  const corrected: string[] = [];
  let wordsChecked = 0;
  for (const q of queries) {
    const res = await search(q.query);
    const slugs = res.results.map((r) => r.slug);
    const rank = slugs.indexOf(q.expected) + 1;
    rows.push({ q, rank });
    if (rank !== 1) {
      if (isHeldOutQuery(q)) heldOutMissCount++;
      else tunedMisses.push(`[${q.kind}] "${q.query}" → ${q.expected} at ${rank || "-"}; got ${slugs.slice(0, 3).join(", ")}`);
    }
    // The engine replaces misspelt words in place, so words line up token by token.
    const before = tokenize(q.query).map((t) => t.word);
    const after = res.corrected ? tokenize(res.corrected).map((t) => t.word) : before;
    before.forEach((w, i) => {
      if (!isCorrectWord(w)) return;
      wordsChecked++;
      if (after[i] !== undefined && after[i] !== w) corrected.push(`${w} → ${after[i]} in "${q.query}"`);
    });
  }
  return {
    tuned: table(rows.filter((r) => !isHeldOutQuery(r.q))),
    heldOut: table(rows.filter((r) => isHeldOutQuery(r.q))),
    tunedBatches: {
      "first-set": table(rows.filter((r) => !isHeldOutQuery(r.q) && !isDevBatch(r.q))),
      dev: table(rows.filter((r) => isDevBatch(r.q))),
    },
    heldOutBatches: {
      "first-quarter": table(rows.filter((r) => heldOutBatch(r.q) === "first-quarter")),
      second: table(rows.filter((r) => heldOutBatch(r.q) === "second")),
      third: table(rows.filter((r) => heldOutBatch(r.q) === "third")),
    },
    all: table(rows),
    tunedMisses,
    heldOutMissCount,
    realWordsCorrected: { count: corrected.length, examples: corrected.slice(0, 20), wordsChecked },
  };
}

/** Hunspell en-US + en-GB, and the words of the given pages (title, summary, body, aliases), as the judge of correct spelling. */
export async function hunspellJudge(pages: readonly Pick<SearchDocument, "title" | "summary" | "bodyText" | "aliases">[]): Promise<SpellJudge> {
  const [{ default: nspell }, { default: en }, { default: gb }] = await Promise.all([import("nspell"), import("dictionary-en"), import("dictionary-en-gb")]);
  const us = nspell({ aff: Buffer.from(en.aff), dic: Buffer.from(en.dic) });
  const uk = nspell({ aff: Buffer.from(gb.aff), dic: Buffer.from(gb.dic) });
  const corpusWords = new Set<string>();
  for (const p of pages) for (const t of tokenize([p.title, p.summary, p.bodyText, ...p.aliases].join(" "))) corpusWords.add(t.word);
  return (word) => corpusWords.has(word) || /^[0-9]/.test(word) || us.correct(word) || uk.correct(word);
}
