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
 * - negation.ts — what a query or a page says is missing ("no clean plate"), which moves pages;
 * - ranking.ts — the ordering rules (status, the department's method, retired last);
 * - snippets.ts — highlight ranges, the body excerpt, thesaurus notes per result.
 *
 * Why this shape (measured, see /work/shared/SEARCH-NOTES.md and bench/search.ts): fuse.js scans
 * every field of every document per query (seconds at 10,000 techniques), so retrieval uses posting
 * lists per stem; typos are corrected against the vocabulary (small, so well under a millisecond).
 */
import type { Language } from "./language";
import { DocumentAnalyser, FIELD_COUNT, SHORT_FIELDS_MASK, F_ALIASES, F_TAGS, F_TITLE, PostingStore } from "./postings";
import { parseQuery, type Alternative, type ParseOptions, type QueryPlan, type QueryUnit } from "./query";
import { negatedWords, negationFactor, readDenials, type NegatedWord } from "./negation";
import { gradedScore, problemTagsHit, promoteHouseMethods, rankKey, staysInList, type RankItem } from "./ranking";
import { isThesaurusKind, isWordNetKind, Scorer } from "./scoring";
import { SYMPTOM_LEXICON } from "./lexicon";
import { excerpt, matchesFor, SNIPPET_CHARS, thesaurusMatches, type MatchedWords } from "./snippets";
import { compileThesaurus, EMPTY_THESAURUS, isWordOrPlural, phraseStems, type CompiledThesaurus, type ThesaurusEntry } from "./thesaurus";
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
/** Department's method for some problem tag. */
const FL_HOUSE = 16;
const STATUS_ORDER: readonly SearchStatus[] = ["approved", "in_review", "draft", "retired"];
const DEFAULT_LIMIT = 20;
const MAX_LIMIT = 200;
const ALL_FIELDS = (1 << FIELD_COUNT) - 1;
const NAME_FIELDS = (1 << F_TITLE) | (1 << F_ALIASES) | (1 << F_TAGS);
/** Ordering rules look a little past the page asked for, so a promotion from just below is not missed. */
const RANK_LOOKAHEAD = 32;

/** `denies`: stems the page's title, summary or aliases say are not there (negation.ts). */
type Entry = { doc: SearchDocument; tagIds: Int32Array; houseFor: readonly string[]; denies: ReadonlySet<string> };
const NO_STEMS: ReadonlySet<string> = new Set();
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
  let statusOf = new Uint8Array(1024);
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
      const st = new Uint8Array(statusOf.length * 2);
      st.set(statusOf);
      statusOf = st;
    }
    const stored: SearchDocument = { ...doc, tags: internTags(doc.tags) };
    const analysed = analyser.analyse(stored);
    store.add(id, analysed);
    analysed.surfaces.forEach((s, i) => vocab.addRef(s, 1, analysed.surfaceCounts[i]));
    const parsed = Date.parse(doc.updatedAt);
    flags[id] = mask | (doc.status === "retired" ? FL_RETIRED : 0) | (isRankApproved ? FL_APPROVED : 0) | (doc.houseMethodFor.length > 0 ? FL_HOUSE : 0);
    updatedAt[id] = Number.isNaN(parsed) ? 0 : parsed;
    statusOf[id] = STATUS_ORDER.indexOf(doc.status);
    const tagIds = Int32Array.from(stored.tags, (t) => {
      let ti = tagIndex.get(t.slug);
      if (ti === undefined) {
        ti = tagSlugs.length;
        tagIndex.set(t.slug, ti);
        tagSlugs.push(t.slug);
      }
      return ti;
    });
    // The analysis is not kept (≈5 KB a page): removal analyses the stored text again.
    entries[id] = { doc: stored, tagIds, houseFor: doc.houseMethodFor, denies: deniedStems([doc.title, doc.summary, ...doc.aliases]) };
    return id;
  }

  function removeEntry(id: number): void {
    const entry = entries[id];
    if (!entry) return;
    const analysed = analyser.analyse(entry.doc);
    store.remove(id, analysed);
    analysed.surfaces.forEach((s, i) => vocab.addRef(s, -1, -(analysed.surfaceCounts[i] as number)));
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
    for (const sf of pinnedWords) vocab.pin(sf, -1);
    thesaurus = compileThesaurus(list, stemOf, SYMPTOM_LEXICON);
    // Thesaurus words join the spelling vocabulary, so "peple" can reach "people" before any page says it.
    pinnedWords = [...thesaurus.words].map((w) => vocab.internSurface(w));
    for (const sf of pinnedWords) vocab.pin(sf, 1);
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
    return parseQuery(query, { vocab, thesaurus, docFreq: (s) => store.docFreq(s), shareADocument: (a, b) => store.shareADocument(a, b) }, options);
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

  function matchedWords(p: QueryPlan): MatchedWords {
    const ids = new Set<number>();
    // A quoted thesaurus term highlights only its own words: "backing", not every "back" on the page.
    const exactOnly = new Map<number, string[]>();
    const add = (a: Alternative): void => {
      a.stems.forEach((s, k) => {
        if (a.exactWords) {
          if (!ids.has(s)) exactOnly.set(s, [...(exactOnly.get(s) ?? []), a.exactWords[k] as string]);
        } else {
          ids.add(s);
          exactOnly.delete(s);
        }
      });
    };
    for (const u of p.units) u.alternatives.forEach(add);
    for (const sp of p.spans) sp.alternatives.forEach(add);
    const words = new Set<string>();
    let hasPairs = false;
    for (const id of ids) {
      const surfaces = vocab.surfacesOf(id);
      if (surfaces.length === 0) hasPairs = true;
      for (const w of surfaces) words.add(w);
    }
    for (const [id, exact] of exactOnly) for (const w of vocab.surfacesOf(id)) if (exact.some((e) => isWordOrPlural(w, e))) words.add(w);
    const stems = new Set([...ids, ...exactOnly.keys()].map((id) => vocab.stemWords[id] as string));
    return { stems, words, hasPairs, stemOf };
  }

  function matchedStems(p: QueryPlan): Set<string> {
    const stems = new Set<string>();
    for (const u of p.units) for (const a of u.alternatives) if (!isWordNetKind(a.kind)) for (const s of a.stems) stems.add(vocab.stemWords[s] as string);
    for (const sp of p.spans) for (const a of sp.alternatives) for (const s of a.stems) stems.add(vocab.stemWords[s] as string);
    return stems;
  }

  /**
   * Visible candidates above the floor (ranking.ts, rule 2), as parallel arrays: a common word can
   * match most of 10,000 pages, so no object is made per candidate until the page of results.
   */
  type Candidates = { ids: number[]; score: Float64Array; naming: Float64Array; coverage: Float64Array; house: Uint8Array };
  const NO_CANDIDATES: Candidates = { ids: [], score: new Float64Array(0), naming: new Float64Array(0), coverage: new Float64Array(0), house: new Uint8Array(0) };

  /** Stems the texts say are not there (each text on its own, so a denial never reaches into the next). */
  function deniedStems(texts: readonly string[]): ReadonlySet<string> {
    const out = new Set<string>();
    for (const t of texts) for (const n of negatedWords(t)) out.add(stemOf(n.word));
    return out.size ? out : NO_STEMS;
  }

  /** What the query's denials deny, by stem; true when every denial of it is only a circumstance ("without"). */
  function deniedByQuery(found: readonly { words: readonly NegatedWord[] }[]): Map<string, boolean> {
    const out = new Map<string, boolean>();
    for (const n of found.flatMap((d) => d.words)) {
      const stem = stemOf(n.word);
      out.set(stem, (out.get(stem) ?? true) && n.isCircumstance);
    }
    return out;
  }

  /** Whether page `id`'s title has the stem: its title count in the postings (4 bits a field). */
  function titleHas(id: number, stem: string): boolean {
    const sid = vocab.stemIdOf(stem);
    return sid !== undefined && (((store.lists[sid]?.countsOf(id) ?? 0) >>> (F_TITLE * 4)) & 0xf) !== 0;
  }

  function rank(p: QueryPlan, fieldMask: number, f: Filters, denied: ReadonlyMap<string, boolean> = new Map()): Candidates {
    const wanted = f.tags.map((slug) => tagIndex.get(slug) ?? -1);
    if (wanted.includes(-1)) return NO_CANDIDATES;
    const scored = scorer.score(p, fieldMask, nextId);
    const houseHits = problemTagsHit(problemPhrases, matchedStems(p), f.tags.filter((t) => problemPhrases.has(t)));
    const n = scored.ids.length;
    const graded = new Float64Array(n);
    const keep = new Uint8Array(n);
    let top = 0;
    let topAny = 0;
    for (let i = 0; i < n; i++) {
      const id = scored.ids[i] as number;
      if (!visible(id, f, wanted)) continue;
      keep[i] = 1;
      let g = gradedScore(scored.scores[i] as number, scored.coverage[i] as number);
      if (denied.size > 0) {
        g *= negationFactor(denied, (entries[id] as Entry).denies, (stem) => titleHas(id, stem));
      }
      graded[i] = g;
      if (g > topAny) topAny = g;
      if (g > top && ((flags[id] as number) & FL_RETIRED) === 0) top = g;
    }
    const best = top > 0 ? top : topAny;
    const out: Candidates = { ids: [], score: new Float64Array(n), naming: new Float64Array(n), coverage: new Float64Array(n), house: new Uint8Array(n) };
    let k = 0;
    for (let i = 0; i < n; i++) {
      // The list's floor asks whether the page meets every word at all; the grade above, how well.
      const cov = scored.answered[i] as number;
      if (!keep[i] || !staysInList(graded[i] as number, cov, best)) continue;
      const id = scored.ids[i] as number;
      out.ids.push(id);
      out.score[k] = graded[i] as number;
      out.naming[k] = scored.naming[i] as number;
      out.coverage[k] = cov;
      const fl = flags[id] as number;
      out.house[k] = (fl & FL_APPROVED) !== 0 && (fl & FL_HOUSE) !== 0 && (entries[id] as Entry).houseFor.some((slug) => houseHits.has(slug)) ? 1 : 0;
      k++;
    }
    return out;
  }

  function itemAt(c: Candidates, i: number): RankItem {
    const id = c.ids[i] as number;
    const fl = flags[id] as number;
    return {
      id,
      score: c.score[i] as number,
      naming: c.naming[i] as number,
      coverage: c.coverage[i] as number,
      isApproved: (fl & FL_APPROVED) !== 0,
      isRetired: (fl & FL_RETIRED) !== 0,
      isHouseHit: c.house[i] === 1,
    };
  }

  /** The first `k` in final order among the selected candidates (rules 3 and 4). */
  function order(c: Candidates, selected: readonly number[], k: number): RankItem[] {
    let top = 0;
    let topAny = 0;
    for (const i of selected) {
      const sc = c.score[i] as number;
      if (sc > topAny) topAny = sc;
      if (sc > top && ((flags[c.ids[i] as number] as number) & FL_RETIRED) === 0) top = sc;
    }
    if (top === 0) top = topAny;
    const keys = new Float64Array(c.ids.length);
    for (const i of selected) {
      const fl = flags[c.ids[i] as number] as number;
      keys[i] = rankKey(c.score[i] as number, (fl & FL_APPROVED) !== 0, (fl & FL_RETIRED) !== 0, top);
    }
    const byKey = (a: number, b: number): number => (keys[b] as number) - (keys[a] as number) || (c.ids[a] as number) - (c.ids[b] as number);
    const head = selectTop(selected, k + RANK_LOOKAHEAD, byKey).map((i) => itemAt(c, i));
    return promoteHouseMethods(head, top).slice(0, k);
  }

  function toResult(item: RankItem, p: QueryPlan | null, matched: MatchedWords | null, query: string): SearchResult {
    const e = entries[item.id] as Entry;
    const doc = e.doc;
    const shown = p && matched && matched.stems.size > 0 ? matchesFor(doc, matched) : { matches: [], snippet: excerpt(doc.summary, 0, SNIPPET_CHARS).text };
    let via: SearchResult["via"] = [];
    if (p && (p.units.some((u) => u.alternatives.some((a) => isThesaurusKind(a.kind))) || p.spans.length > 0)) {
      via = thesaurusMatches(p, (sid, inShortFields) => ((store.lists[sid]?.countsOf(item.id) ?? 0) & (inShortFields ? SHORT_FIELDS_MASK : 0xffffffff)) !== 0, query);
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
      aliases: doc.aliases,
      updatedAt: doc.updatedAt,
      isHouseMethod: item.isHouseHit,
      houseMethodFor: doc.houseMethodFor,
      via,
    };
  }

  function facetsOf(ids: readonly number[], statusCounts: Map<SearchStatus, number>): SearchResponse["facets"] {
    const counts = new Int32Array(tagSlugs.length);
    for (const id of ids) for (const t of (entries[id] as Entry).tagIds) counts[t] = (counts[t] as number) + 1;
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

  function search(query: string, options: SearchOptions, onPlanned?: (readAs: string | undefined) => void): SearchResponse {
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
    const corrected = correctedText(query, p);
    if (onPlanned) {
      // Only the meaning layer reads this, so a search without it skips the spelling lookups.
      const readAs = correctedText(query, p, (u) => vocab.pageSpelling(u.text));
      onPlanned(readAs !== query ? readAs : undefined);
    }
    const isEmptyQuery = p.units.length === 0;

    // Read from the corrected text, so "no claen plate" denies the plate pages call clean.
    const queryDenials = isEmptyQuery ? [] : readDenials(corrected);
    const denied = deniedByQuery(queryDenials);
    let c: Candidates;
    if (isEmptyQuery) {
      const wanted = filters.tags.map((slug) => tagIndex.get(slug) ?? -1);
      const ids: number[] = [];
      if (!wanted.includes(-1)) for (let id = 0; id < nextId; id++) if (entries[id] && visible(id, filters, wanted)) ids.push(id);
      c = { ids, score: new Float64Array(ids.length), naming: new Float64Array(ids.length), coverage: new Float64Array(ids.length).fill(1), house: new Uint8Array(ids.length) };
    } else {
      c = rank(p, ALL_FIELDS, filters, denied);
    }
    // Status facet counts ignore the status filter itself, so the UI can show what switching it would give.
    const perStatus = new Int32Array(STATUS_ORDER.length);
    const wantedStatus = new Uint8Array(STATUS_ORDER.length).fill(filters.status && filters.status.length > 0 ? 0 : 1);
    for (const st of filters.status ?? []) wantedStatus[STATUS_ORDER.indexOf(st)] = 1;
    const selected: number[] = [];
    const selectedIds: number[] = [];
    for (let i = 0; i < c.ids.length; i++) {
      const id = c.ids[i] as number;
      const st = statusOf[id] as number;
      perStatus[st] = (perStatus[st] as number) + 1;
      if (wantedStatus[st]) {
        selected.push(i);
        selectedIds.push(id);
      }
    }
    const statusCounts = new Map<SearchStatus, number>();
    STATUS_ORDER.forEach((st, k) => {
      if ((perStatus[k] as number) > 0) statusCounts.set(st, perStatus[k] as number);
    });
    let page: RankItem[];
    if (isEmptyQuery || options.sort === "recent") {
      const recency = (i: number): number => ((((flags[c.ids[i] as number] as number) & FL_RETIRED) === 0 ? 1e14 : 0) + (updatedAt[c.ids[i] as number] as number));
      page = selectTop(selected, offset + limit, (a, b) => recency(b) - recency(a) || (c.ids[a] as number) - (c.ids[b] as number))
        .slice(offset)
        .map((i) => itemAt(c, i));
    } else {
      page = order(c, selected, offset + limit).slice(offset);
    }
    const matched = isEmptyQuery ? null : matchedWords(p);
    const results = page.map((it) => toResult(it, isEmptyQuery ? null : p, matched, query));

    return {
      results,
      total: selected.length,
      facets: facetsOf(selectedIds, statusCounts),
      ...(corrected !== query ? { corrected } : {}),
      ...(denied.size > 0 && options.sort !== "recent" ? { denials: queryDenials.map((d) => d.phrase) } : {}),
      tookMs: Math.round((performance.now() - t0) * 100) / 100,
    };
  }

  function suggestTitles(query: string, audience: SearchAudience, limit = 8): TitleSuggestion[] {
    const p = plan(query, { prefix: "all", exact: false });
    if (p.units.length === 0) return [];
    const filters: Filters = { audience, tags: [], status: undefined, includeRetired: false };
    const c = rank(p, NAME_FIELDS, filters);
    const ranked = order(c, c.ids.map((_, i) => i), Math.max(0, Math.min(50, limit)));
    const matched = matchedWords(p);
    return ranked.map((it) => {
      const doc = (entries[it.id] as Entry).doc;
      return {
        slug: doc.slug,
        title: doc.title,
        status: doc.status,
        score: Math.round(it.score * 1000) / 1000,
        ranges: matchesFor({ ...doc, aliases: [], tags: [], summary: "", parameterNames: [], shotCodes: [], bodyText: "" }, matched).matches[0]?.ranges ?? [],
        isHouseMethod: it.isHouseHit,
      };
    });
  }

  // The built-in symptom lexicon applies even before any lead has written a thesaurus entry.
  setThesaurus(options.thesaurus ?? []);

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

/** The query with each corrected word replaced by its correction (or, where `otherwise` gives one, by that). */
function correctedText(query: string, p: QueryPlan, otherwise?: (u: QueryUnit) => string | undefined): string {
  let corrected = query;
  for (const u of [...p.units].reverse()) {
    const replacement = u.correction ?? otherwise?.(u);
    if (replacement) corrected = corrected.slice(0, u.start) + replacement + corrected.slice(u.end);
  }
  return corrected;
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
