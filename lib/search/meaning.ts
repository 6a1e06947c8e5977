/**
 * Ranking by meaning: the engine's first results re-ordered by how close each page's title, summary,
 * aliases and tag names are in meaning to the whole query, as a sentence encoder reads them. Words
 * alone miss "shiny guy in the window" → a page about reflections; a sentence encoder, trained on
 * how people phrase things, places the two near each other.
 *
 * Only the order of the first RERANK_WINDOW results changes: which pages match is still decided by
 * the words (so precision and the "matched through" notes stay as the engine made them), and a page
 * the words did not find is never added. The encoder is injected (`MeaningEncoder`), so this file is
 * pure and tested with fixed vectors; meaning-model.ts is the real one.
 *
 * Measured on the quality set (DEVELOPERS.md, "Search quality"): the weights below were chosen on the
 * tuned queries only, then checked once on the held-out ones.
 */
import type { SearchDocument, SearchIndex, SearchOptions, SearchResponse, SearchResult } from "./types";

/** A search's query goes before pages waiting to be encoded in the background. */
export type EncodePriority = "query" | "pages";
/** Turns texts into unit-length vectors (cosine similarity = dot product). */
export type MeaningEncoder = (texts: readonly string[], priority?: EncodePriority) => Promise<Float32Array[]>;

/** How many of the engine's first results may change places. */
export const RERANK_WINDOW = 10;
/**
 * Share of meaning in the new order. Query–page cosines of this encoder run from about 0.1
 * (unrelated) to 0.6 (same problem), half the span of the engine's score divided by the best score
 * (0–1), so cosine counts double to weigh the same. The share is the maximum-likelihood fit of a
 * softmax over each tuned query's ten candidates (cosine weighs 2.64× the score ratio, bootstrap
 * 90 % interval 2.07–3.29): a grid of 0.3 / 0.5 / 0.7 had chosen 0.5 before.
 */
export const MEANING_SHARE = 0.57;
const COSINE_SCALE = 2;

/** What the encoder reads of a page: what it is called and what it is for, not its whole body. */
export function meaningText(doc: Pick<SearchDocument, "title" | "summary" | "aliases" | "tags">): string {
  const aliases = doc.aliases.length ? ` ${doc.aliases.join(", ")}.` : "";
  const tags = doc.tags.length ? ` ${doc.tags.map((t) => t.name).join(", ")}.` : "";
  return `${doc.title}. ${doc.summary}${aliases}${tags}`;
}

export function dot(a: Float32Array, b: Float32Array): number {
  let s = 0;
  for (let i = 0; i < a.length; i++) s += (a[i] as number) * (b[i] as number);
  return s;
}

/**
 * The results with the first RERANK_WINDOW re-ordered by
 * (1 − MEANING_SHARE) · score / best score + MEANING_SHARE · 2 · cosine(query, page).
 * `pageVector` returns undefined for a page it has no vector for; such a page keeps its engine score.
 */
export function rerankByMeaning<R extends Pick<SearchResult, "score">>(results: readonly R[], query: Float32Array, pageVector: (r: R) => Float32Array | undefined): R[] {
  const head = results.slice(0, RERANK_WINDOW);
  if (head.length < 2) return [...results];
  const best = Math.max(...head.map((r) => r.score));
  if (!(best > 0)) return [...results];
  const blended = head.map((r, i) => {
    const v = pageVector(r);
    const lexical = r.score / best;
    const meaning = v ? COSINE_SCALE * dot(query, v) : lexical;
    return { r, i, value: (1 - MEANING_SHARE) * lexical + MEANING_SHARE * meaning };
  });
  // Ties keep the engine's order.
  blended.sort((a, b) => b.value - a.value || a.i - b.i);
  return [...blended.map((b) => b.r), ...results.slice(RERANK_WINDOW)];
}

/**
 * Where page vectors outlive the process (lib/search/meaning-store.ts keeps them in the database), so
 * a restart reads them instead of encoding every page again. A cache: a store that fails costs time,
 * never results.
 */
export type MeaningVectorStore = {
  load(texts: readonly string[]): Promise<Map<string, Float32Array>>;
  save(entries: ReadonlyArray<readonly [text: string, vector: Float32Array]>): Promise<void>;
  /** Drop the vectors of every text but these (after a rebuild: texts no page uses any more). */
  keepOnly(texts: readonly string[]): Promise<void>;
};

/**
 * Page vectors, remembered by the text they were made from: a page is encoded again only when its
 * title, summary, aliases or tags change. Holds about two texts a page (approved and working) plus
 * the earlier texts of pages edited since the last rebuild, which `keepOnly` then drops.
 */
export class MeaningVectors {
  private readonly byText = new Map<string, Float32Array>();
  /** Set by the search holder when the process has a database (lib/search/index.ts). */
  store: MeaningVectorStore | undefined;
  constructor(private readonly encode: MeaningEncoder) {}

  get(text: string): Float32Array | undefined {
    return this.byText.get(text);
  }

  get size(): number {
    return this.byText.size;
  }

  /**
   * Encode the texts not seen yet. Each text is its own call, so in the background ("pages") a
   * search's query waits for one page at most (meaning-model.ts); `chunk` calls are in flight at a
   * time, and each chunk is stored as it completes, so a stopped server keeps what it encoded.
   */
  async ensure(texts: Iterable<string>, priority: EncodePriority = "pages", chunk = 16): Promise<void> {
    let missing = [...new Set(texts)].filter((t) => !this.byText.has(t));
    if (missing.length && this.store) {
      const stored = await this.store.load(missing).catch((err: unknown) => storeFailed("reading", err));
      if (stored?.size) {
        for (const [t, v] of stored) this.byText.set(t, v);
        missing = missing.filter((t) => !this.byText.has(t));
      }
    }
    for (let i = 0; i < missing.length; i += chunk) {
      const slice = missing.slice(i, i + chunk);
      const vectors = await Promise.all(slice.map(async (t) => (await this.encode([t], priority))[0] as Float32Array));
      slice.forEach((t, j) => this.byText.set(t, vectors[j] as Float32Array));
      await this.store?.save(slice.map((t, j) => [t, vectors[j] as Float32Array] as const)).catch((err: unknown) => storeFailed("saving", err));
    }
  }

  /** Forget texts no page uses any more (after a rebuild), so edits do not grow the map or the store forever. */
  async keepOnly(texts: Iterable<string>): Promise<void> {
    const keep = new Set(texts);
    for (const t of this.byText.keys()) if (!keep.has(t)) this.byText.delete(t);
    await this.store?.keepOnly([...keep]).catch((err: unknown) => storeFailed("pruning", err));
  }
}

function storeFailed(doing: string, err: unknown): undefined {
  console.error(`search: ${doing} stored page vectors failed (a cache: pages are encoded when needed)`, err);
  return undefined;
}

/** What ranking by meaning needs: the encoder and the page vectors made with it. */
export type Meaning = { encode: MeaningEncoder; vectors: MeaningVectors };

/** An encoder with an empty store of page vectors. */
export function createMeaning(encode: MeaningEncoder): Meaning {
  return { encode, vectors: new MeaningVectors(encode) };
}

const reportedFailures = new WeakSet<Error>();

/**
 * `index.search`, with the first RERANK_WINDOW results re-ordered by meaning when the search is by
 * relevance for some words. The query is encoded as the engine understands it: spelling corrected,
 * since the encoder does not know "markrs", and British or American words in the pages' spelling,
 * since it tells "gray" from "grey" and the pages' word is the one it compares with. Its encoding
 * starts as soon as the engine has read the query (`onPlanned`), before it scores pages, so with the
 * worker encoder the two run side by side.
 * Without `meaning`, or when the encoder fails, it is the engine's answer unchanged.
 */
export async function searchWithMeaning(index: Pick<SearchIndex, "search">, query: string, options: SearchOptions, meaning: Meaning | null): Promise<SearchResponse> {
  const t0 = performance.now();
  const offset = Math.max(0, Math.floor(options.offset ?? 0));
  const limit = Math.max(0, Math.floor(options.limit ?? 20));
  if (!meaning || options.sort === "recent" || !query.trim() || offset >= RERANK_WINDOW) return index.search(query, options);
  const encoding: { queryVector?: Promise<Float32Array[]> } = {};
  const res = index.search(query, { ...options, offset: 0, limit: Math.max(RERANK_WINDOW, offset + limit) }, (readAs) => {
    encoding.queryVector = meaning.encode([readAs ?? query], "query");
    // Settled here too, so a search that ends before reading it leaves no unhandled rejection.
    encoding.queryVector.catch(() => undefined);
  });
  const byWords = (): SearchResponse => ({ ...res, results: res.results.slice(offset, offset + limit) });
  if (res.results.length < 2) return byWords();
  const textOf = new Map(res.results.slice(0, RERANK_WINDOW).map((r) => [r, meaningText(r)]));
  let vector: Float32Array;
  try {
    // Pages of the top not encoded yet (new since start-up) are encoded now, at the query's priority.
    const queryVector = encoding.queryVector ?? meaning.encode([res.corrected ?? query], "query");
    const [vectors] = await Promise.all([queryVector, meaning.vectors.ensure(textOf.values(), "query")]);
    vector = vectors[0] as Float32Array;
  } catch (err) {
    // A stopped encoder fails every call with one error: say so once, not on every search.
    if (!(err instanceof Error && reportedFailures.has(err))) console.error("search: ranking by meaning failed; searches keep the engine's order while it fails", err);
    if (err instanceof Error) reportedFailures.add(err);
    return byWords();
  }
  const reranked = rerankByMeaning(res.results, vector, (r) => meaning.vectors.get(textOf.get(r) as string));
  return { ...res, results: reranked.slice(offset, offset + limit), tookMs: Math.round((performance.now() - t0) * 100) / 100 };
}
