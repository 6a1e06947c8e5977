import "server-only";
import { LRUCache } from "lru-cache";
import { can } from "@/lib/auth/permissions";
import type { SessionUser } from "@/lib/auth/roles";
import { getSearchIndex, searchTechniques, type SearchAudience, type SearchIndex, type SearchResult } from "@/lib/search";
import type { SearchApiResponse, SearchQuery, SearchResultDto, SuggestApiResponse, SuggestItem } from "@/lib/search-ui/params";

/**
 * Which view of each technique a person searches: readers only ever the approved text; people who
 * may read working copies (seniors, leads) the newest revision, drafts and pending edits included.
 */
export function searchAudienceFor(user: SessionUser): SearchAudience {
  return can(user, "technique:read-working") ? "working" : "published";
}

function toDto(r: SearchResult): SearchResultDto {
  return {
    slug: r.slug,
    title: r.title,
    summary: r.summary,
    status: r.status,
    score: r.score,
    matches: r.matches,
    snippet: r.snippet,
    // Tag aliases stay on the server: they are search vocabulary, not something results show.
    tags: r.tags.map(({ slug, name, kind }) => ({ slug, name, kind })),
    isHouseMethod: r.isHouseMethod,
    houseMethodFor: r.houseMethodFor,
    via: r.via,
    updatedAt: r.updatedAt,
  };
}

type RememberedSearch = { index: SearchIndex; version: number; response: SearchApiResponse };

// The same problem words come from many people; an answer holds until the index changes.
const rememberedSearches = new LRUCache<string, RememberedSearch>({ max: 2_000 });

/** The search behind `GET /api/search` and the search page. Retired techniques only when asked for. */
export async function runSearch(user: SessionUser, query: Omit<SearchQuery, "limit"> & { limit?: number }): Promise<SearchApiResponse> {
  const t0 = performance.now();
  const index = getSearchIndex();
  const audience = searchAudienceFor(user);
  const key = JSON.stringify([audience, query.q, query.tag, query.status, query.retired, query.exact, query.sort, query.limit, query.offset]);
  const seen = rememberedSearches.get(key);
  if (seen && seen.index === index && seen.version === index.version()) {
    return { ...seen.response, tookMs: Math.round((performance.now() - t0) * 100) / 100 };
  }
  // Taken before the search: ranking by meaning awaits the encoder, and a write landing meanwhile
  // must not be stamped onto this older answer.
  const version = index.version();
  const res = await searchTechniques(query.q, {
    audience,
    tags: query.tag,
    status: query.status.length ? query.status : undefined,
    includeRetired: query.retired,
    sort: query.sort,
    limit: query.limit,
    offset: query.offset,
    exact: query.exact,
  });
  const response: SearchApiResponse = {
    results: res.results.map(toDto),
    total: res.total,
    facets: res.facets,
    ...(res.corrected ? { corrected: res.corrected } : {}),
    ...(res.denials?.length ? { denials: res.denials } : {}),
    tookMs: res.tookMs,
  };
  rememberedSearches.set(key, { index, version, response });
  return response;
}

/**
 * Quick-finder rows: title matches first (titles, aliases, tag names), then — when those leave
 * room — the best full-search hits, so a problem described in other words still finds something.
 */
export function runSuggest(user: SessionUser, q: string, limit: number): SuggestApiResponse {
  const t0 = performance.now();
  if (!q.trim()) return { items: [], tookMs: 0 };
  const audience = searchAudienceFor(user);
  const index = getSearchIndex();
  const items: SuggestItem[] = index
    .suggestTitles(q, audience, limit)
    .filter((s) => s.status !== "retired")
    .map((s) => ({ slug: s.slug, title: s.title, status: s.status, ranges: s.ranges, isHouseMethod: s.isHouseMethod, via: "title" as const }));
  if (items.length < limit) {
    const seen = new Set(items.map((i) => i.slug));
    for (const r of index.search(q, { audience, limit }).results) {
      if (items.length >= limit) break;
      if (seen.has(r.slug)) continue;
      const title = r.matches.find((m) => m.field === "title");
      items.push({ slug: r.slug, title: r.title, status: r.status, ranges: title?.ranges ?? [], isHouseMethod: r.isHouseMethod, via: "text" });
    }
  }
  return { items, tookMs: Math.round((performance.now() - t0) * 100) / 100 };
}
