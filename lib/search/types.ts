/**
 * Search types shared by the server index and the UI. Client-safe: no runtime imports.
 *
 * A technique has up to two views in the index:
 * - PUBLISHED: its approved revision (absent until first approval; a retired technique keeps its last
 *   approved text with status "retired"). Artists only ever search these.
 * - WORKING: its latest revision (possibly a draft or a pending edit). Seniors, leads and admins search
 *   these, falling back to the published view when there is no working one.
 */

import type { ThesaurusEntry } from "./thesaurus";

export type SearchStatus = "draft" | "in_review" | "approved" | "retired";

export type SearchAudience = "published" | "working";

export type SearchTag = { slug: string; name: string; aliases: string[]; kind: "problem" | "plate" };

/** One view of a technique, as the DAL hands it to the index. */
export type SearchDocument = {
  techniqueId: string;
  slug: string;
  title: string;
  summary: string;
  aliases: string[];
  tags: SearchTag[];
  parameterNames: string[];
  shotCodes: string[];
  /** Plain text derived from the editor JSON. */
  bodyText: string;
  status: SearchStatus;
  /** Problem tag slugs this technique is the department's approved method for. */
  houseMethodFor: string[];
  /** ISO 8601. */
  updatedAt: string;
};

export type SearchField = "title" | "aliases" | "tags" | "summary" | "parameters" | "shots" | "body";

/**
 * Where a query matched. `ranges` are half-open `[start, end)` character offsets into `value`
 * (the same convention as `String.prototype.slice`).
 * - title / summary: `value` is the whole field;
 * - aliases / tags / parameters / shots: one match per matched item (`value` is the alias, the tag's
 *   name or matched tag alias, the parameter name, the shot code);
 * - body: `value` is the result's `snippet`, ranges relative to it.
 */
export type SearchMatch = { field: SearchField; value: string; ranges: [number, number][] };

/**
 * A query word that matched this result only through a word of related meaning, the term it matched,
 * and where the link came from: the leads' thesaurus, the built-in symptom words (lexicon.ts) or
 * WordNet's everyday English (wordnet.ts).
 */
export type SearchVia = { word: string; term: string; kind: "synonym" | "broader"; source: SearchViaSource };
export type SearchViaSource = "thesaurus" | "lexicon" | "wordnet";

export type SearchResult = {
  slug: string;
  title: string;
  summary: string;
  status: SearchStatus;
  /** Relevance after field weighting and typo penalties; comparable within one response only. */
  score: number;
  matches: SearchMatch[];
  /** Short body excerpt around the best body match, or the start of the summary. */
  snippet: string;
  tags: SearchTag[];
  /** The page's own aliases: search vocabulary (ranking by meaning reads them), not shown in results. */
  aliases: string[];
  updatedAt: string;
  /** The department's approved method for a problem this search is about (query words or a tag filter). */
  isHouseMethod: boolean;
  /** Problem tag slugs it is the approved method for, whatever the query (for a badge). */
  houseMethodFor: string[];
  /** Query words this result answers only through the thesaurus ("tracker" → "marker"). */
  via: SearchVia[];
};

export type SearchFacetTag = { slug: string; name: string; count: number };

export type SearchResponse = {
  results: SearchResult[];
  /** Number of matching techniques before offset/limit. */
  total: number;
  facets: {
    problem: SearchFacetTag[];
    plate: SearchFacetTag[];
    status: { status: SearchStatus; count: number }[];
  };
  /**
   * The query with misspelt words replaced by the words they were matched to (when any were). Words
   * of the English word list or of the pages and thesaurus are never replaced.
   */
  corrected?: string;
  /**
   * What the query says the plate lacks, as read after spelling correction ("didn't shoot a clean
   * plate"): pages that deny it too rank higher, pages whose title names it lower (negation.ts).
   * Absent when it denies nothing.
   */
  denials?: string[];
  tookMs: number;
};

export type SearchOptions = {
  audience: SearchAudience;
  /** Tag slugs; a technique must carry every one. */
  tags?: string[];
  /** Restrict to these statuses. Asking for "retired" includes retired techniques. */
  status?: SearchStatus[];
  includeRetired?: boolean;
  /** "relevance" (default) or "recent" (updatedAt, newest first). An empty query always lists by recency. */
  sort?: "relevance" | "recent";
  /** Default 20, at most 200. */
  limit?: number;
  offset?: number;
  /** Search for exactly the words typed: no spelling corrections (the "did you mean" banner's way out). */
  exact?: boolean;
};

/** A quick-finder row: title matching only (title, aliases, tag names). */
export type TitleSuggestion = {
  slug: string;
  title: string;
  status: SearchStatus;
  score: number;
  /** Half-open ranges into `title`. */
  ranges: [number, number][];
  isHouseMethod: boolean;
};

export type SearchViews = { published: SearchDocument | null; working: SearchDocument | null };

export type SearchIndex = {
  /** Replace both views of a technique. Visible to the next search call. */
  upsert(techniqueId: string, views: SearchViews): void;
  remove(techniqueId: string): void;
  /** Replace the thesaurus (applied at query time, so no page is re-indexed). */
  setThesaurus(entries: readonly ThesaurusEntry[]): void;
  /**
   * `onPlanned` hears the query as the engine reads it (undefined when that is the text typed) as soon
   * as the query is read, before any page is scored: ranking by meaning starts encoding it then
   * (meaning.ts). That is the `corrected` text with, besides, a word the pages spell the other way,
   * British or American, in the pages' spelling — the same word to the engine, not a correction to show.
   */
  search(query: string, options: SearchOptions, onPlanned?: (readAs: string | undefined) => void): SearchResponse;
  suggestTitles(query: string, audience: SearchAudience, limit?: number): TitleSuggestion[];
  /** Number of techniques with at least one view. */
  size(): number;
  /** Goes up with every change to the content, so a caller may keep answers until it moves. */
  version(): number;
};
