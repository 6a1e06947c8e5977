import type { SearchMatch } from "@/lib/search/types";

// Short function words carry no problem description; a query is judged on its content words.
const STOP = new Set(["a", "an", "and", "the", "of", "on", "in", "to", "for", "with", "from", "at", "by", "is", "it", "my", "how", "what", "why", "or", "no", "not", "off", "out", "up"]);

/** The content words of a query, lowercased, in order, without repeats. */
export function queryWords(query: string): string[] {
  const words = query.toLowerCase().match(/[\p{L}\p{N}_]+/gu) ?? [];
  return [...new Set(words.filter((w) => w.length > 1 && !STOP.has(w)))];
}

/** The highlighted pieces of text of a result's matches, lowercased. */
export function matchedPieces(matches: readonly SearchMatch[]): string[] {
  const out: string[] = [];
  for (const m of matches) for (const [s, e] of m.ranges) out.push(m.value.slice(s, e).toLowerCase());
  return out;
}

// Two words are taken as the same when one begins with the other's first few letters
// (marker/markers, crossing/crosses): the engine already corrected typos and stemmed.
function sameWord(a: string, b: string): boolean {
  const n = Math.min(5, a.length, b.length);
  return n >= 2 && a.slice(0, n) === b.slice(0, n);
}

/**
 * Which of the query's content words a result's highlighted text accounts for. Pass the corrected
 * query when the engine corrected one, so misspelt words count as found.
 */
export function coveredWords(query: string, matches: readonly SearchMatch[]): { words: string[]; covered: string[] } {
  const words = queryWords(query);
  const pieces = matchedPieces(matches).flatMap((p) => p.match(/[\p{L}\p{N}_]+/gu) ?? []);
  return { words, covered: words.filter((w) => pieces.some((p) => sameWord(w, p))) };
}

/**
 * True when even the best of the results leaves most of what the person asked for unmatched
 * (e.g. only "flicker" of "zebra crossing flicker"): the page then offers a write-up request
 * as plainly as when nothing was found.
 */
export function isWeakMatch(query: string, results: ReadonlyArray<{ matches: readonly SearchMatch[] }>): boolean {
  const total = queryWords(query).length;
  if (total < 2 || results.length === 0) return false;
  const best = Math.max(...results.slice(0, 5).map((r) => coveredWords(query, r.matches).covered.length));
  return best * 2 < total;
}
