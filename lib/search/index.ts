import "server-only";

import { createSearchIndex } from "./engine";
import type { SearchDocument, SearchIndex } from "./types";

export { createSearchIndex, FIELD_WEIGHTS } from "./engine";
export { highlight, type HighlightSegment } from "./highlight";
export type * from "./types";

export type SearchIndexEntry = { techniqueId: string; published: SearchDocument | null; working: SearchDocument | null };
export type ProcessSearchIndex = ReturnType<typeof createSearchIndex>;

// One index per process; on globalThis so Next's dev reloads do not build a second one.
const globalForSearch = globalThis as unknown as { plateroomSearchIndex?: ProcessSearchIndex };

/**
 * The process-wide index. Empty until `rebuildSearchIndex` has run; the DAL calls `upsert`/`remove`
 * on it in every write that changes a technique (after the transaction commits).
 */
export function getSearchIndex(): SearchIndex {
  globalForSearch.plateroomSearchIndex ??= createSearchIndex();
  return globalForSearch.plateroomSearchIndex;
}

/**
 * Build a fresh index from `loadAll()` and swap it in, so searches keep using the old one while
 * loading. Returns the number of techniques indexed.
 *
 * Writes that land during the load may be missed by the fresh index; call this at start-up, before
 * serving writes, or re-apply such writes afterwards.
 */
export async function rebuildSearchIndex(loadAll: () => Promise<SearchIndexEntry[]>): Promise<number> {
  const rows = await loadAll();
  const next = createSearchIndex();
  // Index in slices and yield between them: 50,000 techniques take seconds of CPU, and the server
  // should keep answering meanwhile (from the previous index).
  for (let i = 0; i < rows.length; i += REBUILD_SLICE) {
    for (const row of rows.slice(i, i + REBUILD_SLICE)) next.upsert(row.techniqueId, { published: row.published, working: row.working });
    await new Promise<void>((resolve) => setImmediate(resolve));
  }
  next.compact();
  globalForSearch.plateroomSearchIndex = next;
  return next.size();
}

const REBUILD_SLICE = 500;
