/**
 * Ranking rules: from scores to the order people see.
 * 1. A page's score is scaled by how much of the query it covers (a soft grade, not a gate); a word
 *    met only in a long body covers its query word in part (scoring.ts, the coverage credit).
 * 2. Pages that answer only part of the query and score far below the best (under FLOOR of it)
 *    are left out, so the list stays short; a page that meets every word, wherever, always stays.
 * 3. Among good matches (at least GOOD_MATCH of the best) approved techniques come before drafts
 *    and reviews; weaker unapproved ones count half; retired ones come last.
 * 4. The department's method for a problem the query is about moves up when its score is close to
 *    the best (at least HOUSE_CLOSE of it) — but never past a page whose title and aliases name the
 *    query's words better than its own do.
 */
export const RANKING = {
  /**
   * score × coverage^coveragePower: a page answering half the query's content words keeps half its
   * score. Long "describe what you see" queries are answered by the page that meets most of them,
   * not by one that meets a single word in its title.
   */
  coveragePower: 1,
  floor: 0.12,
  goodMatch: 0.6,
  houseClose: 0.8,
} as const;

export type RankItem = { id: number; score: number; naming: number; coverage: number; isApproved: boolean; isRetired: boolean; isHouseHit: boolean };

/** Rule 2: whether a candidate stays in the list, given the best score among them. */
export function staysInList(score: number, coverage: number, best: number): boolean {
  return coverage >= 1 || score >= best * RANKING.floor;
}

export function aboveFloor(items: readonly RankItem[]): RankItem[] {
  const best = bestScore(items);
  return items.filter((it) => staysInList(it.score, it.coverage, best));
}

/** Score after the coverage grade. */
export function gradedScore(score: number, coverage: number): number {
  return score * Math.pow(Math.max(0, Math.min(1, coverage)), RANKING.coveragePower);
}

/** The best score among live (not retired) items, or among all when every item is retired. */
export function bestScore(items: readonly RankItem[]): number {
  let live = 0;
  let any = 0;
  for (const it of items) {
    if (it.score > any) any = it.score;
    if (!it.isRetired && it.score > live) live = it.score;
  }
  return live > 0 ? live : any;
}

/** Sort key: status band × 1e9 + score (rule 3). */
export function rankKey(score: number, isApproved: boolean, isRetired: boolean, top: number): number {
  if (isRetired) return score;
  if (score >= RANKING.goodMatch * top) return (isApproved ? 3e9 : 2e9) + score;
  return 1e9 + (isApproved ? score : score * 0.5);
}

/**
 * Rule 4 on a list already in key order: each close house-method hit climbs past the pages above it
 * while those name the query no better than it does (title and alias scores).
 */
export function promoteHouseMethods(ordered: RankItem[], top: number): RankItem[] {
  const out = [...ordered];
  for (let i = 1; i < out.length; i++) {
    const h = out[i] as RankItem;
    if (!h.isHouseHit || h.isRetired || h.score < RANKING.houseClose * top) continue;
    let j = i;
    while (j > 0) {
      const above = out[j - 1] as RankItem;
      if (above.isHouseHit || above.naming > h.naming) break;
      out[j] = above;
      j--;
    }
    out[j] = h;
  }
  return out;
}

/** Problem tags a query is about: every stem of the tag's name, of one side of "x and y", or of one alias was matched. */
export function problemTagsHit(tagPhrases: ReadonlyMap<string, readonly (readonly string[])[]>, matchedStems: ReadonlySet<string>, filterTags: readonly string[]): Set<string> {
  const hits = new Set<string>(filterTags);
  for (const [slug, phrases] of tagPhrases) {
    if (phrases.some((p) => p.length > 0 && p.every((s) => matchedStems.has(s)))) hits.add(slug);
  }
  return hits;
}
