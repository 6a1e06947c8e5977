import "server-only";

import { createSearchIndex, type SearchEngine } from "./engine";
import { createLanguage, loadLanguage } from "./language";
import { createMeaning, type Meaning, type MeaningVectorStore, meaningText, searchWithMeaning } from "./meaning";
import { sentenceEncoder } from "./meaning-model";
import type { ThesaurusEntry } from "./thesaurus";
import type { SearchDocument, SearchIndex, SearchOptions, SearchResponse, SearchViews } from "./types";

export { createSearchIndex, FIELD_WEIGHTS } from "./engine";
export { highlight, type HighlightSegment } from "./highlight";
export type { ThesaurusEntry } from "./thesaurus";
export type * from "./types";

export type SearchIndexEntry = { techniqueId: string; published: SearchDocument | null; working: SearchDocument | null };

/**
 * A change the process's index must apply. This is the one entry point for changes, whether they
 * come from this process's own writes or from another instance (a database notification).
 * - technique: its views now (`null` when it was deleted or has no text any more);
 * - thesaurus: the whole thesaurus now (it is small, and applied at query time).
 */
export type SearchChange =
  | { kind: "technique"; techniqueId: string; views: SearchViews | null }
  | { kind: "thesaurus"; entries: readonly ThesaurusEntry[] };

type Holder = {
  index?: SearchEngine;
  hasLanguage: boolean;
  thesaurus: readonly ThesaurusEntry[];
  meaning?: Promise<Meaning | null>;
  /** Where page vectors outlive the process (the database), once a rebuild named one. */
  meaningStore?: MeaningVectorStore;
  /** The latest background encoding of pages (for tests and benchmarks to wait on). */
  warming?: Promise<void>;
};

// One index per process; on globalThis so Next's dev reloads do not build a second one.
const globalForSearch = globalThis as unknown as { plateroomSearch?: Holder };
const holder = (): Holder => (globalForSearch.plateroomSearch ??= { hasLanguage: false, thesaurus: [] });

/**
 * The process-wide index for reading. Until the first rebuild or change it is an empty stand-in
 * without the English word data (that loads asynchronously, in `rebuildSearchIndex`).
 */
export function getSearchIndex(): SearchIndex {
  const h = holder();
  h.index ??= createSearchIndex({ language: createLanguage([], []) });
  return h.index;
}

async function indexWithLanguage(): Promise<SearchEngine> {
  const language = await loadLanguage();
  const h = holder();
  if (!h.hasLanguage || !h.index) {
    h.index = createSearchIndex({ language, thesaurus: h.thesaurus });
    h.hasLanguage = true;
  }
  return h.index;
}

/** Apply one change; visible to the next search. */
export async function applySearchChange(change: SearchChange): Promise<void> {
  const index = await indexWithLanguage();
  if (change.kind === "thesaurus") {
    holder().thesaurus = change.entries;
    index.setThesaurus(change.entries);
  } else if (change.views) {
    index.upsert(change.techniqueId, change.views);
    warmInBackground([{ techniqueId: change.techniqueId, ...change.views }], false);
  } else index.remove(change.techniqueId);
}

/**
 * Build a fresh index from `loadAll()` and the thesaurus and swap it in, so searches keep using the
 * old one while loading. Returns the number of techniques indexed. With `meaningStore`, page vectors
 * for ranking by meaning are read from and kept in it, so a restart encodes only pages it lacks.
 *
 * Writes that land during the load may be missed by the fresh index; call this at start-up, before
 * serving writes, or re-apply such writes afterwards.
 */
export async function rebuildSearchIndex(
  loadAll: () => Promise<SearchIndexEntry[]>,
  loadThesaurus?: () => Promise<readonly ThesaurusEntry[]>,
  meaningStore?: MeaningVectorStore,
): Promise<number> {
  const [language, rows, thesaurus] = await Promise.all([loadLanguage(), loadAll(), loadThesaurus ? loadThesaurus() : Promise.resolve(holder().thesaurus)]);
  const next = createSearchIndex({ language, thesaurus });
  // Index in slices and yield between them: 50,000 techniques take seconds of CPU, and the server
  // should keep answering meanwhile (from the previous index).
  for (let i = 0; i < rows.length; i += REBUILD_SLICE) {
    for (const row of rows.slice(i, i + REBUILD_SLICE)) next.upsert(row.techniqueId, { published: row.published, working: row.working });
    await new Promise<void>((resolve) => setImmediate(resolve));
  }
  next.compact();
  const h = holder();
  h.index = next;
  h.hasLanguage = true;
  h.thesaurus = thesaurus;
  if (meaningStore) h.meaningStore = meaningStore;
  warmInBackground(rows, true);
  return next.size();
}

const REBUILD_SLICE = 500;

/**
 * The process's encoder and page vectors: null when the model could not be loaded, or when
 * PLATEROOM_SEARCH_MEANING=off (ranking by words alone: quality is lower, see DEVELOPERS.md).
 */
function processMeaning(): Promise<Meaning | null> {
  const h = holder();
  if (process.env.PLATEROOM_SEARCH_MEANING === "off") return Promise.resolve(null);
  h.meaning ??= sentenceEncoder().then((encode) => encode && createMeaning(encode));
  return h.meaning;
}

/**
 * Search the process's index, ranked by words and then by meaning (meaning.ts). This is what people
 * get; `getSearchIndex().search` is the engine alone (quick finder, counts).
 */
export async function searchTechniques(query: string, options: SearchOptions): Promise<SearchResponse> {
  return searchWithMeaning(getSearchIndex(), query, options, await processMeaning());
}

/**
 * Encode pages' titles, summaries, aliases and tags ahead of the searches that need them, in the
 * background (every page after a rebuild, `isEverything`; a changed one after a write): a page not
 * encoded yet is encoded when it first reaches the top results.
 */
async function warmMeaning(rows: readonly SearchIndexEntry[], isEverything: boolean): Promise<void> {
  const meaning = await processMeaning();
  if (!meaning) return;
  meaning.vectors.store = holder().meaningStore;
  const texts = rows.flatMap((r) => [r.published, r.working].flatMap((d) => (d ? [meaningText(d)] : [])));
  if (isEverything) await meaning.vectors.keepOnly(texts);
  await meaning.vectors.ensure(texts);
}

function warmInBackground(rows: readonly SearchIndexEntry[], isEverything: boolean): void {
  const h = holder();
  const previous = h.warming ?? Promise.resolve();
  const run = warmMeaning(rows, isEverything).catch((err: unknown) => console.error("search: encoding pages for ranking by meaning failed", err));
  h.warming = Promise.all([previous, run]).then(() => undefined);
}

/** Resolves when the page encoding started by the latest rebuilds and writes has finished. */
export function meaningWarmed(): Promise<void> {
  return holder().warming ?? Promise.resolve();
}
