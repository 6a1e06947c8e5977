/**
 * The in-memory search engine: puts the parts together. Pure (no server-only or database imports),
 * so unit tests and the benchmark run it directly; the app reaches it through `@/lib/search`.
 *
 * Reading order for a newcomer:
 * - text.ts — tokens, the stop-word list, how much a query word weighs;
 * - stemming.ts, language.ts — Snowball stems, word families, British/American spelling, real words;
 * - vocabulary.ts — words seen, their stems, spelling corrections and completions;
 * - postings.ts — per-stem document lists with per-field counts;
 * - thesaurus.ts — leads' synonyms and narrower terms, compiled for query time;
 * - query.ts — a typed query becomes weighted units with alternatives;
 * - scoring.ts — BM25 per field over those alternatives, graded by coverage;
 * - ranking.ts — the ordering rules (status, the department's method, retired last);
 * - snippets.ts — highlight ranges, the body excerpt, thesaurus notes per result.
 *
 * Why this shape (measured, see /work/shared/SEARCH-NOTES.md and bench/search.ts): fuse.js scans
 * every field of every document per query (seconds at 10,000 techniques), so retrieval uses posting
 * lists per stem; typos are corrected against the vocabulary (small, so well under a millisecond).
 */
import type { Language } from "./language";
import { DocumentAnalyser, FIELD_COUNT, fieldTexts, F_ALIASES, F_TAGS, F_TITLE, PostingStore, type AnalysedDocument } from "./postings";
import { parseQuery, type ParseOptions, type QueryPlan } from "./query";
import { aboveFloor, bestScore, gradedScore, problemTagsHit, promoteHouseMethods, rankKey, type RankItem } from "./ranking";
import { Scorer } from "./scoring";
import { documentStems, excerpt, matchesFor, SNIPPET_CHARS, thesaurusMatches } from "./snippets";
import { compileThesaurus, EMPTY_THESAURUS, phraseStems, type CompiledThesaurus, type ThesaurusEntry } from "./thesaurus";
import type {
  SearchAudience,
  SearchDocument,
  SearchFacetTag,
  SearchIndex,
  SearchOptions,
  SearchResponse,
  SearchResult,
  SearchStatus,
  SearchTag,
  SearchViews,
  TitleSuggestion,
} from "./types";
import { Vocabulary } from "./vocabulary";

export { FIELD_WEIGHTS, bm25Idf } from "./scoring";

const FL_PUBLISHED = 1;
const FL_WORKING = 2;
const FL_RETIRED = 4;
const FL_APPROVED = 8;
const STATUS_ORDER: readonly SearchStatus[] = ["approved", "in_review", "draft", "retired"];
const DEFAULT_LIMIT = 20;
const MAX_LIMIT = 200;
const ALL_FIELDS = (1 << FIELD_COUNT) - 1;
const NAME_FIELDS = (1 << F_TITLE) | (1 << F_ALIASES) | (1 << F_TAGS);
/** Ordering rules look a little past the page asked for, so a promotion from just below is not missed. */
const RANK_LOOKAHEAD = 32;

type Entry = { doc: SearchDocument; analysed: AnalysedDocument; tagIds: Int32Array; houseFor: readonly string[] };
type Technique = { published?: number; working?: number };
type Filters = { audience: SearchAudience; tags: readonly string[]; status: readonly SearchStatus[] | undefined; includeRetired: boolean };

export type SearchEngineOptions = { language: Language; thesaurus?: readonly ThesaurusEntry[] };

export type SearchEngine = SearchIndex & {
  /** Replace the whole content in one go (start-up); trims memory afterwards. */
  load(entries: Iterable<{ techniqueId: string } & SearchViews>): void;
  /** Release spare posting-list capacity (after many upserts). */
  compact(): void;
};

function sameView(a: SearchDocument, b: SearchDocument): boolean {
  return (
    a.slug === b.slug &&
    a.title === b.title &&
    a.summary === b.summary &&
    a.status === b.status &&
    a.updatedAt === b.updatedAt &&
    a.bodyText === b.bodyText &&
    JSON.stringify([a.aliases, a.tags, a.parameterNames, a.shotCodes, a.houseMethodFor]) === JSON.stringify([b.aliases, b.tags, b.parameterNames, b.shotCodes, b.houseMethodFor])
  );
}

/**
 * Create an empty index. Everything is synchronous and in memory; one call to `upsert` is visible to
 * the next `search`. Not safe to share across worker threads (there are none in Next's Node runtime).
 */
export function createSearchIndex(options: SearchEngineOptions): SearchEngine {
  const vocab = new Vocabulary(options.language);
  const store = new PostingStore();
  vocab.onNewStem = () => store.addStem();
  const analyser = new DocumentAnalyser(vocab);
  const scorer = new Scorer(store);
  const stemOf = (w: string): string => vocab.stemOf(w);

  const entries: (Entry | undefined)[] = [];
  let flags = new Uint8Array(1024);
  let updatedAt = new Float64Array(1024);
  let nextId = 0;
  const techniques = new Map<string, Technique>();
  /** Newest definition of each tag, and the stem phrases that make a query "about" a problem tag. */
  const tags = new Map<string, SearchTag>();
  const problemPhrases = new Map<string, string[][]>();
  const tagIndex = new Map<string, number>();
  const tagSlugs: string[] = [];
  const internedTags = new Map<string, SearchTag>();
  let thesaurus: CompiledThesaurus = EMPTY_THESAURUS;
  let pinnedWords: number[] = [];
  let contentVersion = 0;

  function internTags(list: SearchTag[]): SearchTag[] {
    return list.map((t) => {
      const key = JSON.stringify([t.slug, t.name, t.aliases, t.kind]);
      let shared = internedTags.get(key);
      if (!shared) {
        shared = { slug: t.slug, name: t.name, aliases: [...t.aliases], kind: t.kind };
        internedTags.set(key, shared);
      }
      // The newest definition of a tag wins (leads rename tags and edit their aliases).
      if (tags.get(t.slug) !== shared) {
        tags.set(t.slug, shared);
        if (t.kind === "problem") {
          // "Dust and scratches" is about dust and about scratches: each side counts on its own.
          const sides = t.name.split(/\s+(?:and|or|&)\s+/i);
          const phrases = [t.name, ...(sides.length > 1 ? sides : []), ...t.aliases].map((p) => phraseStems(p, stemOf)).filter((p) => p.length > 0);
          problemPhrases.set(t.slug, phrases);
        } else problemPhrases.delete(t.slug);
      }
      return shared;
    });
  }

  // ---- apply a change ------------------------------------------------------------------------

  function addEntry(doc: SearchDocument, mask: number, isRankApproved: boolean): number {
    const id = nextId++;
    if (id >= flags.length) {
      const f = new Uint8Array(flags.length * 2);
      f.set(flags);
      flags = f;
      const u = new Float64Array(updatedAt.length * 2);
      u.set(updatedAt);
      updatedAt = u;
    }
    const stored: SearchDocument = { ...doc, tags: internTags(doc.tags) };
    const analysed = analyser.analyse(stored);
    store.add(id, analysed);
    for (const s of analysed.surfaces) vocab.addRef(s, 1);
    const parsed = Date.parse(doc.updatedAt);
    flags[id] = mask | (doc.status === "retired" ? FL_RETIRED : 0) | (isRankApproved ? FL_APPROVED : 0);
    updatedAt[id] = Number.isNaN(parsed) ? 0 : parsed;
    const tagIds = Int32Array.from(stored.tags, (t) => {
      let ti = tagIndex.get(t.slug);
      if (ti === undefined) {
        ti = tagSlugs.length;
        tagIndex.set(t.slug, ti);
        tagSlugs.push(t.slug);
      }
      return ti;
    });
    entries[id] = { doc: stored, analysed, tagIds, houseFor: doc.houseMethodFor };
    return id;
  }

  function removeEntry(id: number): void {
    const entry = entries[id];
    if (!entry) return;
    store.remove(id, entry.analysed);
    for (const s of entry.analysed.surfaces) vocab.addRef(s, -1);
    entries[id] = undefined;
    flags[id] = 0;
  }

  function remove(techniqueId: string): void {
    const t = techniques.get(techniqueId);
    if (!t) return;
    contentVersion++;
    if (t.published !== undefined) removeEntry(t.published);
    if (t.working !== undefined && t.working !== t.published) removeEntry(t.working);
    techniques.delete(techniqueId);
  }

  function upsert(techniqueId: string, views: SearchViews): void {
    const { published, working } = views;
    if (published && (published.status === "draft" || published.status === "in_review")) {
      // A published view is an approved revision by definition; anything else would leak unreviewed text to artists.
      throw new TypeError(`search: published view of ${techniqueId} has status "${published.status}"`);
    }
    contentVersion++;
    remove(techniqueId);
    if (!published && !working) return;
    const hasApproved = published?.status === "approved";
    const t: Technique = {};
    if (published && (!working || sameView(published, working))) {
      t.published = t.working = addEntry(published, FL_PUBLISHED | FL_WORKING, hasApproved);
    } else {
      if (published) t.published = addEntry(published, FL_PUBLISHED, hasApproved);
      if (working) t.working = addEntry(working, FL_WORKING, hasApproved || working.status === "approved");
    }
    techniques.set(techniqueId, t);
  }

  function setThesaurus(list: readonly ThesaurusEntry[]): void {
    contentVersion++;
    for (const sf of pinnedWords) vocab.addRef(sf, -1);
    thesaurus = compileThesaurus(list, stemOf);
    // Thesaurus words join the spelling vocabulary, so "peple" can reach "people" before any page says it.
    pinnedWords = [...thesaurus.words].map((w) => vocab.internSurface(w));
    for (const sf of pinnedWords) vocab.addRef(sf, 1);
  }

  function load(list: Iterable<{ techniqueId: string } & SearchViews>): void {
    for (const id of [...techniques.keys()]) remove(id);
    for (const e of list) upsert(e.techniqueId, { published: e.published, working: e.working });
    compact();
  }

  function compact(): void {
    store.compact();
  }

  // ---- query side ----------------------------------------------------------------------------

  function plan(query: string, options: ParseOptions): QueryPlan {
    return parseQuery(query, { vocab, thesaurus, docFreq: (s) => store.docFreq(s) }, options);
  }

  /** Ids visible to the audience, carrying every filter tag, retired ones only when asked. */
  function visible(id: number, f: Filters, wanted: readonly number[]): boolean {
    const fl = flags[id] as number;
    const bit = f.audience === "published" ? FL_PUBLISHED : FL_WORKING;
    if ((fl & bit) === 0 || ((fl & FL_RETIRED) !== 0 && !f.includeRetired)) return false;
    if (wanted.length === 0) return true;
    const own = (entries[id] as Entry).tagIds;
    return wanted.every((t) => own.includes(t));
  }

  function matchedStems(p: QueryPlan): Set<string> {
    const stems = new Set<string>();
    for (const u of p.units) for (const a of u.alternatives) for (const s of a.stems) stems.add(vocab.stemWords[s] as string);
    for (const sp of p.spans) for (const a of sp.alternatives) for (const s of a.stems) stems.add(vocab.stemWords[s] as string);
    return stems;
  }

  /** Candidates in final order (visible ones above the floor), plus what facets need. */
  function rank(p: QueryPlan, fieldMask: number, f: Filters): RankItem[] {
    const wanted = f.tags.map((slug) => tagIndex.get(slug) ?? -1);
    if (wanted.includes(-1)) return [];
    const scored = scorer.score(p, fieldMask, nextId);
    const houseHits = problemTagsHit(problemPhrases, matchedStems(p), f.tags.filter((t) => problemPhrases.has(t)));
    const items: RankItem[] = [];
    scored.ids.forEach((id, i) => {
      if (!visible(id, f, wanted)) return;
      const fl = flags[id] as number;
      const isApproved = (fl & FL_APPROVED) !== 0;
      const entry = entries[id] as Entry;
      items.push({
        id,
        score: gradedScore(scored.scores[i] as number, scored.coverage[i] as number),
        naming: scored.naming[i] as number,
        coverage: scored.coverage[i] as number,
        isApproved,
        isRetired: (fl & FL_RETIRED) !== 0,
        isHouseHit: isApproved && entry.houseFor.some((slug) => houseHits.has(slug)),
      });
    });
    return aboveFloor(items);
  }

  function order(items: RankItem[], k: number): RankItem[] {
    const top = bestScore(items);
    const keyed = items.map((it) => ({ it, key: rankKey(it, top) }));
    const byKey = (a: { it: RankItem; key: number }, b: { it: RankItem; key: number }): number => b.key - a.key || a.it.id - b.it.id;
    const head = (k >= keyed.length ? [...keyed].sort(byKey) : selectTop(keyed, k + RANK_LOOKAHEAD, byKey)).map((x) => x.it);
    return promoteHouseMethods(head, top).slice(0, k);
  }

  function toResult(item: RankItem, p: QueryPlan | null, stems: Set<string>, query: string): SearchResult {
    const e = entries[item.id] as Entry;
    const doc = e.doc;
    const shown = p && stems.size > 0 ? matchesFor(doc, stems, stemOf) : { matches: [], snippet: excerpt(doc.summary, 0, SNIPPET_CHARS).text };
    let via: SearchResult["via"] = [];
    if (p && (p.units.some((u) => u.alternatives.some((a) => a.kind === "synonym" || a.kind === "broader")) || p.spans.length > 0)) {
      const own = documentStems(fieldTexts(doc), stemOf);
      via = thesaurusMatches(p, (sid) => own.has(vocab.stemWords[sid] as string), query);
    }
    return {
      slug: doc.slug,
      title: doc.title,
      summary: doc.summary,
      status: doc.status,
      score: Math.round(item.score * 1000) / 1000,
      matches: shown.matches,
      snippet: shown.snippet,
      tags: doc.tags,
      updatedAt: doc.updatedAt,
      isHouseMethod: item.isHouseHit,
      houseMethodFor: doc.houseMethodFor,
      via,
    };
  }

  function facetsOf(items: readonly RankItem[], statusCounts: Map<SearchStatus, number>): SearchResponse["facets"] {
    const counts = new Int32Array(tagSlugs.length);
    for (const it of items) for (const t of (entries[it.id] as Entry).tagIds) counts[t] = (counts[t] as number) + 1;
    const problem: SearchFacetTag[] = [];
    const plate: SearchFacetTag[] = [];
    counts.forEach((count, ti) => {
      if (count === 0) return;
      const slug = tagSlugs[ti] as string;
      const tag = tags.get(slug);
      if (tag) (tag.kind === "problem" ? problem : plate).push({ slug, name: tag.name, count });
    });
    const bySize = (a: SearchFacetTag, b: SearchFacetTag): number => b.count - a.count || a.name.localeCompare(b.name);
    return {
      problem: problem.sort(bySize),
      plate: plate.sort(bySize),
      status: STATUS_ORDER.filter((st) => statusCounts.has(st)).map((st) => ({ status: st, count: statusCounts.get(st) as number })),
    };
  }

  function search(query: string, options: SearchOptions): SearchResponse {
    const t0 = performance.now();
    const filters: Filters = {
      audience: options.audience,
      tags: options.tags ?? [],
      status: options.status,
      includeRetired: options.includeRetired === true || (options.status?.includes("retired") ?? false),
    };
    const limit = Math.max(0, Math.min(MAX_LIMIT, Math.floor(options.limit ?? DEFAULT_LIMIT)));
    const offset = Math.max(0, Math.floor(options.offset ?? 0));
    const p = plan(query, { prefix: "last", exact: options.exact === true });
    const isEmptyQuery = p.units.length === 0;

    let items: RankItem[];
    if (isEmptyQuery) {
      const wanted = filters.tags.map((slug) => tagIndex.get(slug) ?? -1);
      items = [];
      if (!wanted.includes(-1)) {
        for (let id = 0; id < nextId; id++) {
          if (!entries[id] || !visible(id, filters, wanted)) continue;
          const fl = flags[id] as number;
          items.push({ id, score: 0, naming: 0, coverage: 1, isApproved: (fl & FL_APPROVED) !== 0, isRetired: (fl & FL_RETIRED) !== 0, isHouseHit: false });
        }
      }
    } else {
      items = rank(p, ALL_FIELDS, filters);
    }
    // Status facet counts ignore the status filter itself, so the UI can show what switching it would give.
    const statusCounts = new Map<SearchStatus, number>();
    for (const it of items) {
      const st = (entries[it.id] as Entry).doc.status;
      statusCounts.set(st, (statusCounts.get(st) ?? 0) + 1);
    }
    const selected = filters.status && filters.status.length > 0 ? items.filter((it) => filters.status?.includes((entries[it.id] as Entry).doc.status)) : items;
    let page: RankItem[];
    if (isEmptyQuery || options.sort === "recent") {
      const recency = (it: RankItem): number => (it.isRetired ? 0 : 1e14) + (updatedAt[it.id] as number);
      page = selectTop(selected, offset + limit, (a, b) => recency(b) - recency(a) || a.id - b.id).slice(offset);
    } else {
      page = order(selected, offset + limit).slice(offset);
    }
    const stems = isEmptyQuery ? new Set<string>() : matchedStems(p);
    const results = page.map((it) => toResult(it, isEmptyQuery ? null : p, stems, query));

    let corrected = query;
    for (const u of [...p.units].reverse()) if (u.correction) corrected = corrected.slice(0, u.start) + u.correction + corrected.slice(u.end);
    return {
      results,
      total: selected.length,
      facets: facetsOf(selected, statusCounts),
      ...(corrected !== query ? { corrected } : {}),
      tookMs: Math.round((performance.now() - t0) * 100) / 100,
    };
  }

  function suggestTitles(query: string, audience: SearchAudience, limit = 8): TitleSuggestion[] {
    const p = plan(query, { prefix: "all", exact: false });
    if (p.units.length === 0) return [];
    const filters: Filters = { audience, tags: [], status: undefined, includeRetired: false };
    const ranked = order(rank(p, NAME_FIELDS, filters), Math.max(0, Math.min(50, limit)));
    const stems = matchedStems(p);
    return ranked.map((it) => {
      const doc = (entries[it.id] as Entry).doc;
      return {
        slug: doc.slug,
        title: doc.title,
        status: doc.status,
        score: Math.round(it.score * 1000) / 1000,
        ranges: (matchesFor({ ...doc, aliases: [], tags: [], summary: "", parameterNames: [], shotCodes: [], bodyText: "" }, stems, stemOf).matches[0]?.ranges ?? []),
        isHouseMethod: it.isHouseHit,
      };
    });
  }

  if (options.thesaurus) setThesaurus(options.thesaurus);

  return {
    upsert,
    remove,
    setThesaurus,
    search,
    suggestTitles,
    size: () => techniques.size,
    version: () => contentVersion,
    load,
    compact,
  };
}

/** The `k` best items by `compare` without sorting them all. */
function selectTop<T>(items: readonly T[], k: number, compare: (a: T, b: T) => number): T[] {
  if (k <= 0) return [];
  if (items.length <= k * 2 + 64) return [...items].sort(compare).slice(0, k);
  // Keep a sorted buffer of the best k; most items are rejected against its last element.
  const best: T[] = [];
  for (const it of items) {
    if (best.length === k && compare(it, best[k - 1] as T) >= 0) continue;
    let lo = 0;
    let hi = best.length;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if (compare(best[mid] as T, it) <= 0) lo = mid + 1;
      else hi = mid;
    }
    best.splice(lo, 0, it);
    if (best.length > k) best.pop();
  }
  return best;
}
