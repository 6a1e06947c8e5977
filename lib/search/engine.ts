/**
 * The in-memory search engine (issue 6). Pure: no server-only or database imports, so unit tests and
 * the benchmark run it directly; the app reaches it through `@/lib/search` (server-only singleton).
 *
 * Why this shape (measured, see /work/shared/SEARCH-NOTES.md and bench/search.ts):
 * - fuse.js scans every field of every document per query (seconds at 10,000 techniques), so
 *   retrieval uses posting lists per stemmed word, with per-field term counts packed into one word.
 * - Typo tolerance comes from correcting each query word against the corpus vocabulary (trigram
 *   candidates, then edit distance) and from prefix completion of partial words; the vocabulary is
 *   small, so this costs well under a millisecond.
 * - Scoring is BM25 per field (Robertson & Zaragoza 2009, "The Probabilistic Relevance Framework: BM25
 *   and Beyond"): length-normalised term frequency saturated by k1 in each field, fields summed with
 *   weights, times IDF. (Saturating the weighted sum, as BM25F does, flattened title matches to
 *   nearly the weight of one body match in the benchmark corpus.)
 * - Highlight ranges come from the same tokenizer, so they mark exactly the words that matched.
 */
import type {
  SearchAudience,
  SearchDocument,
  SearchFacetTag,
  SearchField,
  SearchIndex,
  SearchMatch,
  SearchOptions,
  SearchResponse,
  SearchResult,
  SearchStatus,
  SearchTag,
  SearchViews,
  TitleSuggestion,
} from "./types";
import { editDistance, isStopWord, stem, tokenize, trigrams, type Token } from "./text";

const FIELDS: readonly SearchField[] = ["title", "aliases", "tags", "summary", "parameters", "shots", "body"];
const NF = FIELDS.length;
const F_TITLE = 0;
const F_ALIASES = 1;
const F_TAGS = 2;
/** title > aliases ≈ tags > summary > parameters ≈ shots > body (issue 6). */
export const FIELD_WEIGHTS: readonly number[] = [6, 4, 4, 2.5, 1.5, 1.5, 1];
/** BM25 length normalisation per field: short list-like fields barely normalise. */
const FIELD_B: readonly number[] = [0.5, 0.3, 0.3, 0.75, 0.3, 0.2, 0.75];
const K1 = 1.2;
const TF_MAX = 15; // 4 bits per field in the packed posting word

const MASK_PUBLISHED = 1;
const MASK_WORKING = 2;

const DEFAULT_LIMIT = 20;
const MAX_LIMIT = 200;
const SNIPPET_CHARS = 180;
/** Share of the best score that still counts as a good match, where status and house method decide order. */
const GOOD_MATCH = 0.6;

/** BM25 inverse document frequency, the non-negative variant (as in Lucene's BM25Similarity). */
export function bm25Idf(docCount: number, docFreq: number): number {
  return Math.log(1 + (docCount - docFreq + 0.5) / (docFreq + 0.5));
}

class Postings {
  /** Interleaved [internalId, packedTf]; ids ascend because internal ids are never reused. */
  data: Uint32Array;
  n = 0;
  constructor() {
    this.data = new Uint32Array(4);
  }
  push(id: number, packed: number): void {
    if ((this.n + 1) * 2 > this.data.length) {
      const next = new Uint32Array(this.data.length * 2);
      next.set(this.data);
      this.data = next;
    }
    this.data[this.n * 2] = id;
    this.data[this.n * 2 + 1] = packed;
    this.n++;
  }
  remove(id: number): void {
    let lo = 0;
    let hi = this.n - 1;
    while (lo <= hi) {
      const mid = (lo + hi) >> 1;
      const v = this.data[mid * 2] as number;
      if (v === id) {
        this.data.copyWithin(mid * 2, mid * 2 + 2, this.n * 2);
        this.n--;
        return;
      }
      if (v < id) lo = mid + 1;
      else hi = mid - 1;
    }
  }
  trim(): void {
    if (this.data.length > this.n * 2 + 2) this.data = this.data.slice(0, Math.max(4, this.n * 2));
  }
}

type Entry = {
  doc: SearchDocument;
  mask: number;
  /** The technique has a live approved version (ranks as approved even while an edit is pending). */
  isRankApproved: boolean;
  isRetired: boolean;
  updatedMs: number;
};

type Expansion = { stemId: number; weight: number; surface: string; kind: "exact" | "prefix" | "typo" };
type QueryWord = { text: string; expansions: Expansion[]; start: number; end: number };

type TagInfo = { tag: SearchTag; phrases: string[][] };

type Candidate = { id: number; score: number; group: number; isHouseHit: boolean };

type Technique = { published?: number; working?: number };

function sameView(a: SearchDocument, b: SearchDocument): boolean {
  return (
    a.slug === b.slug &&
    a.title === b.title &&
    a.summary === b.summary &&
    a.status === b.status &&
    a.updatedAt === b.updatedAt &&
    a.bodyText === b.bodyText &&
    JSON.stringify([a.aliases, a.tags, a.parameterNames, a.shotCodes, a.houseMethodFor]) ===
      JSON.stringify([b.aliases, b.tags, b.parameterNames, b.shotCodes, b.houseMethodFor])
  );
}

function fieldTexts(doc: SearchDocument): string[] {
  return [
    doc.title,
    doc.aliases.join("\n"),
    doc.tags.map((t) => [t.name, ...t.aliases].join("\n")).join("\n"),
    doc.summary,
    doc.parameterNames.join("\n"),
    doc.shotCodes.join("\n"),
    doc.bodyText,
  ];
}

function contentWords(text: string): string[] {
  return tokenize(text)
    .map((t) => t.word)
    .filter((w) => !isStopWord(w));
}

/** Cut `text` at word boundaries around `[from, to)`, marking cuts with "…". */
function excerpt(text: string, from: number, to: number): { text: string; shift: number } {
  let s = Math.max(0, from);
  let e = Math.min(text.length, to);
  if (s > 0) {
    const sp = text.indexOf(" ", s);
    if (sp >= 0 && sp < s + 20) s = sp + 1;
  }
  if (e < text.length) {
    const sp = text.lastIndexOf(" ", e);
    if (sp > s + 40) e = sp;
  }
  const pre = s > 0 ? "…" : "";
  const post = e < text.length ? "…" : "";
  return { text: pre + text.slice(s, e).replace(/\s+$/, "") + post, shift: pre.length - s };
}

/**
 * Create an empty index. Everything is synchronous and in memory; one call to `upsert` is visible to
 * the next `search`. Not safe to share across worker threads (there are none in Next's Node runtime).
 */
export function createSearchIndex(): SearchIndex & {
  /** Replace the whole content in one go (start-up); faster than repeated upserts and trims memory. */
  load(entries: Iterable<{ techniqueId: string } & SearchViews>): void;
} {
  // Vocabulary of surface words (for typo correction and prefix completion) mapping to stems (for retrieval).
  const surfaceIds = new Map<string, number>();
  const surfaceWords: string[] = [];
  const surfaceStem: number[] = [];
  const surfaceRefs: number[] = [];
  const trigramIndex = new Map<string, number[]>();
  let sortedSurfaces: string[] = [];
  let unsortedSurfaces: string[] = [];

  const stemIds = new Map<string, number>();
  const stemWords: string[] = [];
  const postings: Postings[] = [];

  const entries: (Entry | undefined)[] = [];
  let lens = new Uint16Array(1024 * NF);
  const totalLen = new Float64Array(NF);
  let liveDocs = 0;
  let nextId = 0;
  const techniques = new Map<string, Technique>();
  const tags = new Map<string, TagInfo>();
  const internedTags = new Map<string, SearchTag>();

  // Scratch accumulators reused by every query (single-threaded, so no sharing hazard).
  let acc = new Float64Array(1024);
  let best = new Float64Array(1024);
  let wordStamp = new Int32Array(1024);
  let queryStamp = new Int32Array(1024);
  let cover = new Uint8Array(1024);
  let stampCounter = 0;

  function ensureCapacity(id: number): void {
    if (id < acc.length) return;
    let cap = acc.length;
    while (cap <= id) cap *= 2;
    const grow = <T extends Float64Array | Int32Array | Uint8Array | Uint16Array>(a: T, size: number): T => {
      const next = new (a.constructor as new (n: number) => T)(size);
      next.set(a);
      return next;
    };
    acc = grow(acc, cap);
    best = grow(best, cap);
    wordStamp = grow(wordStamp, cap);
    queryStamp = grow(queryStamp, cap);
    cover = grow(cover, cap);
    lens = grow(lens, cap * NF);
  }

  function surfaceId(word: string, stemId: number): number {
    let id = surfaceIds.get(word);
    if (id === undefined) {
      id = surfaceWords.length;
      surfaceIds.set(word, id);
      surfaceWords.push(word);
      surfaceStem.push(stemId);
      surfaceRefs.push(0);
      unsortedSurfaces.push(word);
      for (const g of trigrams(word)) {
        const list = trigramIndex.get(g);
        if (list) list.push(id);
        else trigramIndex.set(g, [id]);
      }
    }
    return id;
  }

  function stemId(word: string): number {
    const s = stem(word);
    let id = stemIds.get(s);
    if (id === undefined) {
      id = stemWords.length;
      stemIds.set(s, id);
      stemWords.push(s);
      postings.push(new Postings());
    }
    return id;
  }

  function internTags(list: SearchTag[]): SearchTag[] {
    return list.map((t) => {
      const key = JSON.stringify([t.slug, t.name, t.aliases, t.kind]);
      let shared = internedTags.get(key);
      if (!shared) {
        shared = { slug: t.slug, name: t.name, aliases: [...t.aliases], kind: t.kind };
        internedTags.set(key, shared);
      }
      // The newest definition of a tag wins (leads rename tags and edit their aliases).
      tags.set(t.slug, {
        tag: shared,
        phrases: [t.name, ...t.aliases].map((p) => contentWords(p).map(stem)).filter((p) => p.length > 0),
      });
      return shared;
    });
  }

  /** Per-doc term table: stemId → packed field counts, plus the surface words seen. */
  function analyse(doc: SearchDocument): { terms: Map<number, number>; surfaces: Set<number>; fieldLens: number[] } {
    const terms = new Map<number, number>();
    const surfaces = new Set<number>();
    const texts = fieldTexts(doc);
    const fieldLens: number[] = [];
    for (let f = 0; f < NF; f++) {
      const toks = tokenize(texts[f] as string, f === 4);
      let len = 0;
      for (const t of toks) {
        if (isStopWord(t.word)) continue;
        len++;
        const sid = stemId(t.word);
        surfaces.add(surfaceId(t.word, sid));
        const packed = terms.get(sid) ?? 0;
        const tf = (packed >>> (f * 4)) & 15;
        if (tf < TF_MAX) terms.set(sid, packed + (1 << (f * 4)));
      }
      fieldLens.push(Math.min(len, 65535));
    }
    return { terms, surfaces, fieldLens };
  }

  function addEntry(doc: SearchDocument, mask: number, isRankApproved: boolean): number {
    const id = nextId++;
    ensureCapacity(id);
    const stored: SearchDocument = { ...doc, tags: internTags(doc.tags) };
    const { terms, surfaces, fieldLens } = analyse(stored);
    for (const [sid, packed] of terms) (postings[sid] as Postings).push(id, packed >>> 0);
    for (const s of surfaces) surfaceRefs[s] = (surfaceRefs[s] as number) + 1;
    for (let f = 0; f < NF; f++) {
      lens[id * NF + f] = fieldLens[f] as number;
      totalLen[f] = (totalLen[f] as number) + (fieldLens[f] as number);
    }
    const parsed = Date.parse(doc.updatedAt);
    entries[id] = {
      doc: stored,
      mask,
      isRankApproved,
      isRetired: doc.status === "retired",
      updatedMs: Number.isNaN(parsed) ? 0 : parsed,
    };
    liveDocs++;
    return id;
  }

  function removeEntry(id: number): void {
    const entry = entries[id];
    if (!entry) return;
    const { terms, surfaces } = analyse(entry.doc);
    for (const sid of terms.keys()) (postings[sid] as Postings).remove(id);
    for (const s of surfaces) surfaceRefs[s] = (surfaceRefs[s] as number) - 1;
    for (let f = 0; f < NF; f++) totalLen[f] = (totalLen[f] as number) - (lens[id * NF + f] as number);
    entries[id] = undefined;
    liveDocs--;
  }

  function removeTechnique(techniqueId: string): void {
    const t = techniques.get(techniqueId);
    if (!t) return;
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
    removeTechnique(techniqueId);
    if (!published && !working) return;
    const hasApproved = published?.status === "approved";
    const t: Technique = {};
    if (published && (!working || sameView(published, working))) {
      t.published = t.working = addEntry(published, MASK_PUBLISHED | MASK_WORKING, hasApproved);
    } else {
      if (published) t.published = addEntry(published, MASK_PUBLISHED, hasApproved);
      if (working) t.working = addEntry(working, MASK_WORKING, hasApproved || working.status === "approved");
    }
    techniques.set(techniqueId, t);
  }

  function load(list: Iterable<{ techniqueId: string } & SearchViews>): void {
    for (const id of [...techniques.keys()]) removeTechnique(id);
    for (const e of list) upsert(e.techniqueId, { published: e.published, working: e.working });
    for (const p of postings) p.trim();
  }

  // ---- query side -------------------------------------------------------------------------------

  function sortedVocabulary(): string[] {
    if (unsortedSurfaces.length > 64) {
      sortedSurfaces = sortedSurfaces.concat(unsortedSurfaces).sort();
    } else {
      for (const w of unsortedSurfaces) {
        let lo = 0;
        let hi = sortedSurfaces.length;
        while (lo < hi) {
          const mid = (lo + hi) >> 1;
          if ((sortedSurfaces[mid] as string) < w) lo = mid + 1;
          else hi = mid;
        }
        sortedSurfaces.splice(lo, 0, w);
      }
    }
    unsortedSurfaces = [];
    return sortedSurfaces;
  }

  const df = (sid: number): number => (postings[sid] as Postings).n;

  function prefixExpansions(word: string, hasExact: boolean): Expansion[] {
    const vocab = sortedVocabulary();
    let lo = 0;
    let hi = vocab.length;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if ((vocab[mid] as string) < word) lo = mid + 1;
      else hi = mid;
    }
    const out: Expansion[] = [];
    for (let i = lo; i < vocab.length && i < lo + 200; i++) {
      const w = vocab[i] as string;
      if (!w.startsWith(word)) break;
      const sfid = surfaceIds.get(w) as number;
      if ((surfaceRefs[sfid] as number) <= 0 || w === word) continue;
      out.push({
        stemId: surfaceStem[sfid] as number,
        // A complete word is less likely to be the start of a longer one.
        weight: hasExact ? 0.4 + 0.2 * (word.length / w.length) : 0.55 + 0.35 * (word.length / w.length),
        surface: w,
        kind: "prefix",
      });
    }
    return out;
  }

  function typoExpansions(word: string): Expansion[] {
    const maxD = word.length <= 3 ? 0 : word.length <= 5 ? 1 : 2;
    if (maxD === 0) return [];
    const grams = trigrams(word);
    const counts = new Map<number, number>();
    for (const g of grams) {
      const list = trigramIndex.get(g);
      if (!list) continue;
      for (const id of list) counts.set(id, (counts.get(id) ?? 0) + 1);
    }
    // An edit destroys at most 3 padded trigrams (4 for a transposition), so fewer shared ones rule a word out.
    const need = Math.max(1, grams.length - 4 * maxD);
    const found: { id: number; d: number }[] = [];
    for (const [id, c] of counts) {
      if (c < need || (surfaceRefs[id] as number) <= 0) continue;
      const w = surfaceWords[id] as string;
      if (Math.abs(w.length - word.length) > maxD) continue;
      const d = editDistance(word, w, maxD);
      if (d <= maxD) found.push({ id, d });
    }
    const bestD = Math.min(...found.map((f) => f.d));
    return found
      .filter((f) => f.d === bestD)
      .map((f) => ({
        stemId: surfaceStem[f.id] as number,
        weight: f.d === 1 ? 0.75 : 0.55,
        surface: surfaceWords[f.id] as string,
        kind: "typo" as const,
      }));
  }

  function expandWord(word: string, allowPrefix: boolean): Expansion[] {
    const out: Expansion[] = [];
    const exactStem = stemIds.get(stem(word));
    const hasExact = exactStem !== undefined && df(exactStem) > 0;
    const surface = surfaceIds.get(word);
    const isKnownWord = surface !== undefined && (surfaceRefs[surface] as number) > 0;
    // Meeting a corpus word only through the stemmer ("trakers" → "trak", like "trake") is weaker
    // evidence than the word itself, so typo corrections compete with it.
    if (hasExact) out.push({ stemId: exactStem, weight: isKnownWord ? 1 : 0.9, surface: word, kind: "exact" });
    if (/^[0-9]+$/.test(word)) return out;
    if (word.length >= 3 && (allowPrefix || !hasExact)) out.push(...prefixExpansions(word, hasExact));
    if (!isKnownWord) out.push(...typoExpansions(word));
    // One entry per stem (best weight), then the strongest few: more only adds noise and time.
    const byStem = new Map<number, Expansion>();
    for (const e of out) {
      const prev = byStem.get(e.stemId);
      if (!prev || e.weight > prev.weight) byStem.set(e.stemId, e);
    }
    return [...byStem.values()]
      .sort((a, b) => b.weight - a.weight || df(b.stemId) - df(a.stemId))
      .slice(0, 6);
  }

  function parseQuery(query: string, prefixAll: boolean): QueryWord[] {
    const raw = tokenize(query);
    const content = raw.filter((t) => !isStopWord(t.word));
    const words = content.length > 0 ? content : raw;
    const out: QueryWord[] = [];
    words.forEach((tok, i) => {
      let w = tok.word;
      let start = tok.start;
      const isLast = i === words.length - 1;
      let expansions = expandWord(w, prefixAll || isLast);
      if (expansions.length === 0 && w.length >= 5) {
        // Run-together words ("bluescreen"): split where both halves are corpus words.
        for (let k = 2; k <= w.length - 2; k++) {
          const a = stemIds.get(stem(w.slice(0, k)));
          const b = stemIds.get(stem(w.slice(k)));
          if (a !== undefined && b !== undefined && df(a) > 0 && df(b) > 0) {
            out.push({ text: w.slice(0, k), expansions: expandWord(w.slice(0, k), false), start, end: start + k });
            expansions = expandWord(w.slice(k), prefixAll || isLast);
            w = w.slice(k);
            start += k;
            break;
          }
        }
      }
      out.push({ text: w, expansions, start, end: tok.end });
    });
    return out;
  }

  function isVisible(e: Entry, audience: SearchAudience): boolean {
    return (e.mask & (audience === "published" ? MASK_PUBLISHED : MASK_WORKING)) !== 0;
  }

  /** Problem tags the query is about: every content word of the tag's name or of one alias was matched. */
  function hitProblemTags(words: QueryWord[], filterTags: readonly string[]): Set<string> {
    const matched = new Set<string>();
    for (const w of words) for (const e of w.expansions) matched.add(stemWords[e.stemId] as string);
    const hits = new Set<string>();
    for (const [slug, info] of tags) {
      if (info.tag.kind !== "problem") continue;
      if (filterTags.includes(slug) || info.phrases.some((p) => p.every((s) => matched.has(s)))) hits.add(slug);
    }
    return hits;
  }

  /** Score every document that shares a word with the query. Returns touched internal ids. */
  function score(words: QueryWord[], fieldMask: number): number[] {
    const stampBase = ++stampCounter;
    const touched: number[] = [];
    const avg = new Float64Array(NF);
    for (let f = 0; f < NF; f++) avg[f] = liveDocs > 0 ? Math.max(1, (totalLen[f] as number) / liveDocs) : 1;
    const weights = FIELD_WEIGHTS.map((w, f) => ((fieldMask >> f) & 1 ? w : 0));
    for (const word of words) {
      const wStamp = ++stampCounter;
      // Corrections and completions of one query word share the IDF of its most common candidate, so
      // a rare look-alike word (likely noise) does not outscore the common word the user meant. This is
      // what Lucene's fuzzy queries do by default (TopTermsBlendedFreqScoringRewrite).
      let maxDf = 0;
      for (const ex of word.expansions) if (ex.kind !== "exact" || ex.weight < 1) maxDf = Math.max(maxDf, df(ex.stemId));
      const blendedIdf = bm25Idf(liveDocs, maxDf);
      for (const ex of word.expansions) {
        const list = postings[ex.stemId] as Postings;
        const ownIdf = bm25Idf(liveDocs, list.n);
        const idf = (ex.kind === "exact" && ex.weight === 1 ? ownIdf : Math.min(ownIdf, blendedIdf)) * ex.weight;
        const data = list.data;
        for (let k = 0; k < list.n; k++) {
          const id = data[k * 2] as number;
          let packed = data[k * 2 + 1] as number;
          // Saturate per field, then add the weighted fields: a word in the title and the aliases and
          // the tags says "this is the topic" far more than the same word once in the body.
          let sum = 0;
          for (let f = 0; packed !== 0; f++, packed >>>= 4) {
            const tf = packed & 15;
            if (tf === 0) continue;
            const b = FIELD_B[f] as number;
            const norm = 1 - b + (b * (lens[id * NF + f] as number)) / (avg[f] as number);
            sum += ((weights[f] as number) * tf * (K1 + 1)) / (tf + K1 * norm);
          }
          if (sum === 0) continue;
          const s = idf * sum;
          if (queryStamp[id] !== stampBase) {
            queryStamp[id] = stampBase;
            acc[id] = 0;
            cover[id] = 0;
            touched.push(id);
          }
          if (wordStamp[id] !== wStamp) {
            wordStamp[id] = wStamp;
            best[id] = s;
            acc[id] = (acc[id] as number) + s;
            cover[id] = (cover[id] as number) + 1;
          } else if (s > (best[id] as number)) {
            acc[id] = (acc[id] as number) + s - (best[id] as number);
            best[id] = s;
          }
        }
      }
    }
    return touched;
  }

  type Filters = {
    audience: SearchAudience;
    tags: readonly string[];
    status: readonly SearchStatus[] | undefined;
    includeRetired: boolean;
  };

  function passesTags(e: Entry, f: Filters): boolean {
    return f.tags.every((slug) => e.doc.tags.some((t) => t.slug === slug));
  }
  function passesStatus(e: Entry, f: Filters): boolean {
    if (f.status && f.status.length > 0) return f.status.includes(e.doc.status);
    return !e.isRetired || f.includeRetired;
  }

  /**
   * Order: among good matches (≥ GOOD_MATCH of the best score) the department's method for a problem the
   * search is about first, then approved, then drafts and reviews; then weaker matches; retired last.
   */
  function rankCandidates(ids: number[], words: QueryWord[], filters: Filters): Candidate[] {
    const n = words.filter((w) => w.expansions.length > 0).length;
    const houseHits = hitProblemTags(words, filters.tags);
    // Most query words must match; relax one word at a time when nothing would be left. Retired
    // techniques do not count when choosing the bar, since they are listed last anyway.
    const live = ids.filter((id) => !(entries[id] as Entry).isRetired);
    const basis = live.length > 0 ? live : ids;
    let required = n - Math.floor(n / 3);
    while (required > 1 && !basis.some((id) => (cover[id] as number) >= required)) required--;
    const chosen = ids.filter((id) => (cover[id] as number) >= required);
    const cands: Candidate[] = chosen.map((id) => {
      const e = entries[id] as Entry;
      // Square root: matching every word helps, but not enough to beat strong title/alias matches of most words.
      const coverage = Math.sqrt((cover[id] as number) / Math.max(1, n));
      const isHouseHit = e.isRankApproved && e.doc.houseMethodFor.some((slug) => houseHits.has(slug));
      return { id, score: (acc[id] as number) * coverage, group: 0, isHouseHit };
    });
    let top = 0;
    for (const c of cands) if (!(entries[c.id] as Entry).isRetired && c.score > top) top = c.score;
    if (top === 0) for (const c of cands) top = Math.max(top, c.score);
    for (const c of cands) {
      const e = entries[c.id] as Entry;
      if (e.isRetired) c.group = 4;
      else if (c.score >= GOOD_MATCH * top) c.group = c.isHouseHit ? 0 : e.isRankApproved ? 1 : 2;
      else {
        c.group = 3;
        if (!e.isRankApproved) c.score *= 0.5;
      }
    }
    return cands;
  }

  function matchesFor(e: Entry, stems: Set<string>): { matches: SearchMatch[]; snippet: string } {
    const doc = e.doc;
    const matches: SearchMatch[] = [];
    const rangesOf = (text: string, camel = false): [number, number][] =>
      tokenize(text, camel)
        .filter((t) => stems.has(stem(t.word)))
        .map((t) => [t.start, t.end]);
    const single = (field: SearchField, value: string, camel = false): void => {
      const ranges = rangesOf(value, camel);
      if (ranges.length > 0) matches.push({ field, value, ranges });
    };
    single("title", doc.title);
    for (const a of doc.aliases) single("aliases", a);
    for (const t of doc.tags) for (const v of [t.name, ...t.aliases]) single("tags", v);
    single("summary", doc.summary);
    for (const p of doc.parameterNames) single("parameters", p, true);
    for (const s of doc.shotCodes) single("shots", s);

    const bodyTokens = tokenize(doc.bodyText).filter((t) => stems.has(stem(t.word)));
    let snippet: string;
    if (bodyTokens.length > 0) {
      // The window holding the most distinct matched words reads best.
      let bestStart = (bodyTokens[0] as Token).start;
      let bestCount = 0;
      for (let i = 0; i < bodyTokens.length && i < 200; i++) {
        const from = (bodyTokens[i] as Token).start;
        const seen = new Set<string>();
        for (let j = i; j < bodyTokens.length && (bodyTokens[j] as Token).end <= from + SNIPPET_CHARS - 40; j++) {
          seen.add(stem((bodyTokens[j] as Token).word));
        }
        if (seen.size > bestCount) {
          bestCount = seen.size;
          bestStart = from;
        }
      }
      const cut = excerpt(doc.bodyText, bestStart - 40, bestStart - 40 + SNIPPET_CHARS);
      snippet = cut.text;
      const ranges = bodyTokens
        .map((t) => [t.start + cut.shift, t.end + cut.shift] as [number, number])
        .filter(([s, en]) => s >= 0 && en <= snippet.length && snippet.slice(s, en).length === en - s)
        .filter(([s]) => s >= (snippet.startsWith("…") ? 1 : 0));
      const inside = ranges.filter(([, en]) => en <= snippet.length - (snippet.endsWith("…") ? 1 : 0));
      if (inside.length > 0) matches.push({ field: "body", value: snippet, ranges: inside });
    } else {
      snippet = excerpt(doc.summary, 0, SNIPPET_CHARS).text;
    }
    return { matches, snippet };
  }

  function toResult(c: Candidate, stems: Set<string>): SearchResult {
    const e = entries[c.id] as Entry;
    const { matches, snippet } = stems.size > 0 ? matchesFor(e, stems) : { matches: [], snippet: excerpt(e.doc.summary, 0, SNIPPET_CHARS).text };
    return {
      slug: e.doc.slug,
      title: e.doc.title,
      summary: e.doc.summary,
      status: e.doc.status,
      score: Math.round(c.score * 1000) / 1000,
      matches,
      snippet,
      tags: e.doc.tags,
      updatedAt: e.doc.updatedAt,
      isHouseMethod: c.isHouseHit,
      houseMethodFor: e.doc.houseMethodFor,
    };
  }

  function facetsOf(cands: Candidate[], statusPool: Entry[]): SearchResponse["facets"] {
    const tagCounts = new Map<string, number>();
    for (const c of cands) for (const t of (entries[c.id] as Entry).doc.tags) tagCounts.set(t.slug, (tagCounts.get(t.slug) ?? 0) + 1);
    const problem: SearchFacetTag[] = [];
    const plate: SearchFacetTag[] = [];
    for (const [slug, count] of tagCounts) {
      const info = tags.get(slug);
      if (!info) continue;
      (info.tag.kind === "problem" ? problem : plate).push({ slug, name: info.tag.name, count });
    }
    const bySize = (a: SearchFacetTag, b: SearchFacetTag): number => b.count - a.count || a.name.localeCompare(b.name);
    const statusCounts = new Map<SearchStatus, number>();
    for (const e of statusPool) statusCounts.set(e.doc.status, (statusCounts.get(e.doc.status) ?? 0) + 1);
    const order: SearchStatus[] = ["approved", "in_review", "draft", "retired"];
    return {
      problem: problem.sort(bySize),
      plate: plate.sort(bySize),
      status: order.filter((s) => statusCounts.has(s)).map((s) => ({ status: s, count: statusCounts.get(s) as number })),
    };
  }

  function compareCandidates(a: Candidate, b: Candidate): number {
    return a.group - b.group || b.score - a.score || a.id - b.id;
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
    const words = parseQuery(query, false);
    const isEmptyQuery = words.length === 0;

    let pool: number[];
    if (isEmptyQuery) {
      pool = [];
      for (let id = 0; id < nextId; id++) if (entries[id]) pool.push(id);
    } else {
      pool = score(words, (1 << NF) - 1);
    }
    // Status facet counts ignore the status filter itself, so the UI can show what switching it would give.
    const gated = pool.filter((id) => {
      const e = entries[id] as Entry;
      return isVisible(e, filters.audience) && passesTags(e, filters) && (!e.isRetired || filters.includeRetired);
    });
    const ranked: Candidate[] = isEmptyQuery
      ? gated.map((id) => ({ id, score: 0, group: (entries[id] as Entry).isRetired ? 4 : 0, isHouseHit: false }))
      : rankCandidates(gated, words, filters);
    const cands = ranked.filter((c) => passesStatus(entries[c.id] as Entry, filters));
    if (isEmptyQuery || options.sort === "recent") {
      cands.sort(
        (a, b) =>
          Number(a.group === 4) - Number(b.group === 4) ||
          (entries[b.id] as Entry).updatedMs - (entries[a.id] as Entry).updatedMs ||
          a.id - b.id,
      );
    } else {
      cands.sort(compareCandidates);
    }
    const stems = new Set<string>();
    for (const w of words) for (const e of w.expansions) stems.add(stemWords[e.stemId] as string);
    const results = cands.slice(offset, offset + limit).map((c) => toResult(c, stems));

    let corrected = query;
    for (const w of [...words].reverse()) {
      const first = w.expansions[0];
      if (first?.kind === "typo") corrected = corrected.slice(0, w.start) + first.surface + corrected.slice(w.end);
    }
    return {
      results,
      total: cands.length,
      facets: facetsOf(cands, ranked.map((c) => entries[c.id] as Entry)),
      ...(corrected !== query ? { corrected } : {}),
      tookMs: Math.round((performance.now() - t0) * 100) / 100,
    };
  }

  function suggestTitles(query: string, audience: SearchAudience, limit = 8): TitleSuggestion[] {
    const words = parseQuery(query, true);
    if (words.length === 0) return [];
    const mask = (1 << F_TITLE) | (1 << F_ALIASES) | (1 << F_TAGS);
    const filters: Filters = { audience, tags: [], status: undefined, includeRetired: false };
    const ids = score(words, mask).filter((id) => {
      const e = entries[id] as Entry;
      return isVisible(e, audience) && passesStatus(e, filters);
    });
    const cands = rankCandidates(ids, words, filters).sort(compareCandidates).slice(0, Math.max(0, Math.min(50, limit)));
    const stems = new Set<string>();
    for (const w of words) for (const e of w.expansions) stems.add(stemWords[e.stemId] as string);
    return cands.map((c) => {
      const e = entries[c.id] as Entry;
      return {
        slug: e.doc.slug,
        title: e.doc.title,
        status: e.doc.status,
        score: Math.round(c.score * 1000) / 1000,
        ranges: tokenize(e.doc.title)
          .filter((t) => stems.has(stem(t.word)))
          .map((t) => [t.start, t.end] as [number, number]),
        isHouseMethod: c.isHouseHit,
      };
    });
  }

  return {
    upsert,
    remove: removeTechnique,
    search,
    suggestTitles,
    size: () => techniques.size,
    load,
  };
}
