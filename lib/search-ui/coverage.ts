import { FILLER_WEIGHT, isStopWord, queryWordWeight, tokenize } from "@/lib/search/text";
import type { SearchMatch, SearchVia } from "@/lib/search/types";

/**
 * The content words of a query, lowercased, in order, without repeats: the search's own stop words
 * and filler words ("how do i get rid of") left out, so a query is judged on what it describes.
 */
export function queryWords(query: string): string[] {
  const words = tokenize(query).map((t) => t.word);
  return [...new Set(words.filter((w) => !isStopWord(w) && queryWordWeight(w) > FILLER_WEIGHT))];
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
 * Which of the query's content words a result's highlighted text accounts for, or its thesaurus
 * matches ("tracker" answered by "marker"). Pass the corrected query when the engine corrected one,
 * so misspelt words count as found.
 */
export function coveredWords(query: string, matches: readonly SearchMatch[], via: readonly SearchVia[] = []): { words: string[]; covered: string[] } {
  const words = queryWords(query);
  const pieces = matchedPieces(matches).flatMap((p) => p.match(/[\p{L}\p{N}_]+/gu) ?? []);
  const viaWords = via.flatMap((v) => tokenize(v.word).map((t) => t.word));
  return { words, covered: words.filter((w) => viaWords.includes(w) || pieces.some((p) => sameWord(w, p))) };
}

/**
 * True when even the best of the results leaves most of what the person asked for unmatched
 * (e.g. only "flicker" of "zebra crossing flicker"): the page then offers a write-up request
 * as plainly as when nothing was found.
 */
export function isWeakMatch(query: string, results: ReadonlyArray<{ matches: readonly SearchMatch[]; via?: readonly SearchVia[] }>): boolean {
  const total = queryWords(query).length;
  if (total < 2 || results.length === 0) return false;
  const best = Math.max(...results.slice(0, 5).map((r) => coveredWords(query, r.matches, r.via).covered.length));
  return best * 2 < total;
}
