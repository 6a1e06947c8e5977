import "server-only";
import { LRUCache } from "lru-cache";
import { changeGeneration } from "@/db/change-watch";
import type { SessionUser } from "@/lib/auth/roles";
import { MEMORY_BUDGET } from "@/lib/memory/budget";

/*
 * Reads remembered until the database changes. Where this process holds the database (PGlite),
 * migration 0001's triggers tell it about every committed write to a table pages show before the
 * writer gets its answer (db/change-watch.ts), so a remembered result is dropped exactly when it
 * could go stale. On a PostgreSQL server (other writers, late notices) nothing is remembered.
 * Results are shared between callers: treat them as read-only.
 */

type Remembered = { generation: number; at: number; value: unknown };
const reads = new LRUCache<string, Remembered>({
  max: 10_000,
  // Bounded by size too: a technique with its body is tens of kB. The JSON length is a rough
  // measure, taken once per read that is kept.
  maxSize: MEMORY_BUDGET.rememberedReads,
  sizeCalculation: (entry, key) => key.length + (JSON.stringify(entry.value)?.length ?? 8),
});
let generationKept: number | null = null;

/** What `read` gives for `key`, remembered until the next committed change or maxAgeMs. */
export async function rememberedUntilChange<T>(key: string, maxAgeMs: number, read: () => Promise<T>): Promise<T> {
  // Taken before reading: a change committed during the read makes the result stale at once.
  const generation = changeGeneration();
  if (generation === null) return read();
  // Nothing from before a change can be used again: let it go at once rather than when evicted.
  if (generation !== generationKept) {
    reads.clear();
    generationKept = generation;
  }
  const seen = reads.get(key);
  if (seen && seen.generation === generation && Date.now() - seen.at < maxAgeMs) return seen.value as T;
  const value = await read();
  // A change committed while reading: this result may already be stale, so it is not kept.
  if (changeGeneration() === generation) reads.set(key, { generation, at: Date.now(), value });
  return value;
}

/**
 * A viewer's read remembered until the next change. The key holds the viewer's id and role, so
 * each person gets what their own permissions allow; failures (404, 403) are never remembered.
 */
export function rememberedPerViewer<A extends (string | number | boolean | undefined)[], T>(
  name: string,
  read: (viewer: SessionUser, ...args: A) => Promise<T>,
  maxAgeMs = 10 * 60_000,
): (viewer: SessionUser, ...args: A) => Promise<T> {
  return (viewer, ...args) => rememberedUntilChange(JSON.stringify([name, viewer.id, viewer.role, ...args]), maxAgeMs, () => read(viewer, ...args));
}
