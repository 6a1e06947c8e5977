import { z } from "zod";
import type { SearchFacetTag, SearchMatch, SearchStatus, SearchVia, TitleSuggestion } from "@/lib/search/types";

/**
 * The search query as it travels in URLs (`/search?q=…&tag=…&status=…&sort=…`) and to
 * `GET /api/search`. Client-safe: the page, the API route and the quick finder share it.
 */
export const SEARCH_STATUSES = ["draft", "in_review", "approved", "retired"] as const satisfies readonly SearchStatus[];
export const SEARCH_SORTS = ["relevance", "recent"] as const;
export type SearchSort = (typeof SEARCH_SORTS)[number];
export const PAGE_SIZE = 20;

/** A query-string value that may repeat (`?tag=a&tag=b`) becomes an array either way. */
const repeated = <T extends z.ZodType>(item: T) =>
  z.preprocess((v) => (v === undefined ? [] : Array.isArray(v) ? v : [v]), z.array(item).max(20, "Too many values."));

const tagSlug = z
  .string()
  .trim()
  .regex(/^[a-z0-9]+(?:-[a-z0-9]+)*$/, "Not a valid tag.");

const flag = z.enum(["1", "0", "true", "false"]).transform((v) => v === "1" || v === "true");

/** Everything that may be sent as one value only takes the first when a caller repeats it. */
const single = <T extends z.ZodType>(inner: T) => z.preprocess((v) => (Array.isArray(v) ? v[0] : v), inner);

export const searchQuerySchema = z.object({
  q: single(z.string().trim().max(200, "Keep the search under 200 characters.").default("")),
  tag: repeated(tagSlug),
  status: repeated(z.enum(SEARCH_STATUSES, { error: "Status is one of draft, in_review, approved, retired." })),
  sort: single(z.enum(SEARCH_SORTS, { error: "Sort is relevance or recent." }).default("relevance")),
  limit: single(z.coerce.number().int().min(1).max(100).default(PAGE_SIZE)),
  offset: single(z.coerce.number().int().min(0).max(10_000).default(0)),
  retired: single(flag.default(false)),
  /** Search for exactly what was typed: no spelling corrections. */
  exact: single(flag.default(false)),
});
export type SearchQuery = z.infer<typeof searchQuerySchema>;

export const suggestQuerySchema = z.object({
  q: single(z.string().trim().max(200, "Keep the search under 200 characters.").default("")),
  limit: single(z.coerce.number().int().min(1).max(15).default(8)),
});

export type SearchResultTag = { slug: string; name: string; kind: "problem" | "plate" };

/** One result as `GET /api/search` sends it (shared/API.md fields first, then our additions). */
export type SearchResultDto = {
  slug: string;
  title: string;
  summary: string;
  status: SearchStatus;
  score: number;
  matches: SearchMatch[];
  snippet: string;
  tags: SearchResultTag[];
  isHouseMethod: boolean;
  /** Problem tag slugs this technique is the department's approved method for. */
  houseMethodFor: string[];
  /** Query words this result answers only through the thesaurus, and the term they matched. */
  via: SearchVia[];
  updatedAt: string;
};

export type SearchApiResponse = {
  results: SearchResultDto[];
  total: number;
  facets: { problem: SearchFacetTag[]; plate: SearchFacetTag[]; status: { status: SearchStatus; count: number }[] };
  corrected?: string;
  /** What the query says the plate lacks, as read (spelling corrected): pages denying it too rank higher, pages whose title names it lower. */
  denials?: string[];
  tookMs: number;
};

/** A quick-finder row. `via` says whether it came from title matching or from the full search. */
export type SuggestItem = Pick<TitleSuggestion, "slug" | "title" | "status" | "ranges" | "isHouseMethod"> & { via: "title" | "text" };
export type SuggestApiResponse = { items: SuggestItem[]; tookMs: number };

/** The parts of a search that the page keeps in its address. */
export type SearchState = { q: string; tag: string[]; status: SearchStatus[]; sort: SearchSort; retired: boolean; exact: boolean; offset: number };

export const EMPTY_SEARCH: SearchState = { q: "", tag: [], status: [], sort: "relevance", retired: false, exact: false, offset: 0 };

/** `/search?…` for a state; defaults are left out so shared links stay short. */
export function searchHref(state: Partial<SearchState>): string {
  const s = { ...EMPTY_SEARCH, ...state };
  const p = new URLSearchParams();
  if (s.q) p.set("q", s.q);
  for (const t of s.tag) p.append("tag", t);
  for (const st of s.status) p.append("status", st);
  if (s.sort !== "relevance") p.set("sort", s.sort);
  if (s.retired) p.set("retired", "1");
  if (s.exact) p.set("exact", "1");
  if (s.offset > 0) p.set("offset", String(s.offset));
  const qs = p.toString();
  return qs ? `/search?${qs}` : "/search";
}

/** Adds or removes one value, keeping the rest in order. */
export function toggled<T>(list: readonly T[], value: T): T[] {
  return list.includes(value) ? list.filter((v) => v !== value) : [...list, value];
}

/** Reads page search params leniently: invalid values are dropped (and reported) instead of failing the page. */
export function parseSearchState(raw: Record<string, string | string[] | undefined>): { state: SearchState; invalid: string[] } {
  const clean: Record<string, string | string[]> = {};
  for (const [k, v] of Object.entries(raw)) if (v !== undefined) clean[k] = v;
  const parsed = searchQuerySchema.safeParse(clean);
  if (parsed.success) return { state: pick(parsed.data), invalid: [] };
  const invalid = [...new Set(parsed.error.issues.map((i) => String(i.path[0] ?? "")))].filter(Boolean);
  for (const key of invalid) delete clean[key];
  const retry = searchQuerySchema.safeParse(clean);
  return { state: retry.success ? pick(retry.data) : EMPTY_SEARCH, invalid };
}

function pick(d: SearchQuery): SearchState {
  return { q: d.q, tag: d.tag, status: d.status, sort: d.sort, retired: d.retired, exact: d.exact, offset: d.offset };
}
