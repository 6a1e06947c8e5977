/** Recent searches, remembered per person in the browser (localStorage keyed by the person's id). */
export const RECENT_LIMIT = 8;

type KeyValueStore = Pick<Storage, "getItem" | "setItem" | "removeItem">;

export function recentKey(userId: string): string {
  return `plateroom:recent-searches:${userId}`;
}

function storage(): KeyValueStore | null {
  try {
    return typeof window === "undefined" ? null : window.localStorage;
  } catch {
    // Private modes may refuse access to storage; the finder simply remembers nothing.
    return null;
  }
}

export function readRecent(userId: string, store: KeyValueStore | null = storage()): string[] {
  if (!store) return [];
  try {
    const raw: unknown = JSON.parse(store.getItem(recentKey(userId)) ?? "[]");
    return Array.isArray(raw) ? raw.filter((x): x is string => typeof x === "string" && x.trim().length > 0).slice(0, RECENT_LIMIT) : [];
  } catch {
    return [];
  }
}

/** Puts `query` first, dropping an earlier copy (compared without case) and the oldest past the limit. */
export function pushRecent(userId: string, query: string, store: KeyValueStore | null = storage()): string[] {
  const q = query.trim().replace(/\s+/g, " ");
  if (!store || !q) return readRecent(userId, store);
  const next = [q, ...readRecent(userId, store).filter((x) => x.toLowerCase() !== q.toLowerCase())].slice(0, RECENT_LIMIT);
  try {
    store.setItem(recentKey(userId), JSON.stringify(next));
  } catch {
    // Storage full or refused: keep going without remembering.
  }
  return next;
}

export function clearRecent(userId: string, store: KeyValueStore | null = storage()): void {
  try {
    store?.removeItem(recentKey(userId));
  } catch {
    // nothing to do
  }
}
