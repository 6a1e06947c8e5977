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
const JOINERS = " -";
/** title > aliases ≈ tags > summary > parameters ≈ shots > body (issue 6). */
export const FIELD_WEIGHTS: readonly number[] = [6, 4, 4, 2.5, 1.5, 1.5, 1];
/** BM25 length normalisation per field: short list-like fields barely normalise. */
const FIELD_B: readonly number[] = [0.5, 0.3, 0.3, 0.75, 0.3, 0.2, 0.75];
const K1 = 1.2;
const TF_MAX = 15; // 4 bits per field in the packed posting word

const MASK_PUBLISHED = 1;
const MASK_WORKING = 2;
const FL_PUBLISHED = 1;
const FL_WORKING = 2;
const FL_RETIRED = 4;
const FL_APPROVED = 8;
const FL_HOUSE = 16;
const STATUS_ORDER: readonly SearchStatus[] = ["approved", "in_review", "draft", "retired"];

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
  /** Replace the whole content in one go (start-up); trims memory afterwards. */
  load(entries: Iterable<{ techniqueId: string } & SearchViews>): void;
  /** Release spare posting-list capacity (after many upserts). */
  compact(): void;
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
  // Dense per-id data read in the hot loops (typed arrays avoid chasing entry objects).
  let flags = new Uint8Array(1024);
  let updatedAt = new Float64Array(1024);
  const tagIndex = new Map<string, number>();
  const tagSlugs: string[] = [];
  const tagIdsOf: (Int32Array | undefined)[] = [];
  const internedTags = new Map<string, SearchTag>();

  // Scratch accumulators reused by every query (single-threaded, so no sharing hazard).
  let acc = new Float64Array(1024);
  let best = new Float64Array(1024);
  let wordStamp = new Int32Array(1024);
  let queryStamp = new Int32Array(1024);
  let cover = new Uint8Array(1024);
  let stampCounter = 0;
  let contentVersion = 0;

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
    flags = grow(flags, cap);
    updatedAt = grow(updatedAt, cap);
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
      if (tags.get(t.slug)?.tag !== shared) {
        tags.set(t.slug, {
          tag: shared,
          phrases: [t.name, ...t.aliases].map((p) => contentWords(p).map(stem)).filter((p) => p.length > 0),
        });
      }
      return shared;
    });
  }

  /** Per-doc term table: stemId → packed field counts, plus the surface words seen. */
  // Per-document scratch (by stem id / surface id), reset after each use: no Map per document, far less GC.
  let tfScratch = new Uint32Array(4096);
  let surfaceSeen = new Uint8Array(4096);

  /** Per-doc term table: stem ids with packed field counts, plus the surface words seen. */
  function analyse(doc: SearchDocument): { terms: number[]; packed: number[]; surfaces: number[]; fieldLens: number[] } {
    const terms: number[] = [];
    const surfaces: number[] = [];
    const texts = fieldTexts(doc);
    const fieldLens: number[] = [];
    for (let f = 0; f < NF; f++) {
      const text = texts[f] as string;
      const toks = tokenize(text, f === 4);
      let len = 0;
      const one = 1 << (f * 4);
      let prev: Token | undefined;
      for (const t of toks) {
        if (isStopWord(t.word)) {
          prev = undefined;
          continue;
        }
        len++;
        // Run-together pairs ("blue screen" → "bluescreen", "clean plate" → "cleanplate") in title,
        // aliases and tags (summaries would add ~100 MB of one-off pairs at 50,000 techniques), so a junior's compound word finds the two-word title. Postings only: kept out of the
        // typo vocabulary, where they would add noise.
        if (f <= F_TAGS && prev && t.start - prev.end === 1 && JOINERS.includes(text.charAt(prev.end))) {
          const joined = prev.word + t.word;
          if (joined.length <= 18) {
            const jid = stemId(joined);
            if (jid >= tfScratch.length) {
              const next = new Uint32Array(tfScratch.length * 2);
              next.set(tfScratch);
              tfScratch = next;
            }
            const jp = tfScratch[jid] as number;
            if (jp === 0) terms.push(jid);
            if (((jp >>> (f * 4)) & 15) < TF_MAX) tfScratch[jid] = jp + one;
          }
        }
        prev = t;
        // Known words skip the stemmer: most tokens of a large corpus are repeats.
        let sf = surfaceIds.get(t.word);
        let sid: number;
        if (sf === undefined) {
          sid = stemId(t.word);
          sf = surfaceId(t.word, sid);
        } else sid = surfaceStem[sf] as number;
        if (sf >= surfaceSeen.length) {
          const next = new Uint8Array(surfaceSeen.length * 2);
          next.set(surfaceSeen);
          surfaceSeen = next;
        }
        if (sid >= tfScratch.length) {
          const next = new Uint32Array(tfScratch.length * 2);
          next.set(tfScratch);
          tfScratch = next;
        }
        if (surfaceSeen[sf] === 0) {
          surfaceSeen[sf] = 1;
          surfaces.push(sf);
        }
        const p = tfScratch[sid] as number;
        if (p === 0) terms.push(sid);
        if (((p >>> (f * 4)) & 15) < TF_MAX) tfScratch[sid] = p + one;
      }
      fieldLens.push(Math.min(len, 65535));
    }
    const packed = terms.map((sid) => tfScratch[sid] as number);
    for (const sid of terms) tfScratch[sid] = 0;
    for (const sf of surfaces) surfaceSeen[sf] = 0;
    return { terms, packed, surfaces, fieldLens };
  }

  function addEntry(doc: SearchDocument, mask: number, isRankApproved: boolean): number {
    const id = nextId++;
    ensureCapacity(id);
    const stored: SearchDocument = { ...doc, tags: internTags(doc.tags) };
    const { terms, packed, surfaces, fieldLens } = analyse(stored);
    for (let i = 0; i < terms.length; i++) (postings[terms[i] as number] as Postings).push(id, packed[i] as number);
    for (const s of surfaces) surfaceRefs[s] = (surfaceRefs[s] as number) + 1;
    for (let f = 0; f < NF; f++) {
      lens[id * NF + f] = fieldLens[f] as number;
      totalLen[f] = (totalLen[f] as number) + (fieldLens[f] as number);
    }
    const parsed = Date.parse(doc.updatedAt);
    flags[id] =
      (mask & MASK_PUBLISHED ? FL_PUBLISHED : 0) |
      (mask & MASK_WORKING ? FL_WORKING : 0) |
      (doc.status === "retired" ? FL_RETIRED : 0) |
      (isRankApproved ? FL_APPROVED : 0) |
      (doc.houseMethodFor.length > 0 ? FL_HOUSE : 0);
    updatedAt[id] = Number.isNaN(parsed) ? 0 : parsed;
    tagIdsOf[id] = Int32Array.from(stored.tags, (t) => {
      let ti = tagIndex.get(t.slug);
      if (ti === undefined) {
        ti = tagSlugs.length;
        tagIndex.set(t.slug, ti);
        tagSlugs.push(t.slug);
      }
      return ti;
    });
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
    for (const sid of terms) (postings[sid] as Postings).remove(id);
    for (const s of surfaces) surfaceRefs[s] = (surfaceRefs[s] as number) - 1;
    for (let f = 0; f < NF; f++) totalLen[f] = (totalLen[f] as number) - (lens[id * NF + f] as number);
    entries[id] = undefined;
    flags[id] = 0;
    tagIdsOf[id] = undefined;
    liveDocs--;
  }

  function removeTechnique(techniqueId: string): void {
    const t = techniques.get(techniqueId);
    if (!t) return;
    contentVersion++;
    if (t.published !== undefined) removeEntry(t.published);
    if (t.working !== undefined && t.working !== t.published) removeEntry(t.working);
    techniques.delete(techniqueId);
  }

  function upsert(techniqueId: string, views: SearchViews): void {
    contentVersion++;
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

  function compact(): void {
    for (const p of postings) p.trim();
  }

  function load(list: Iterable<{ techniqueId: string } & SearchViews>): void {
    for (const id of [...techniques.keys()]) removeTechnique(id);
    for (const e of list) upsert(e.techniqueId, { published: e.published, working: e.working });
    compact();
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
    const queryStem = stem(word);
    const within = (a: string, b: string): number => (Math.abs(a.length - b.length) > maxD ? maxD + 1 : editDistance(a, b, maxD));
    for (const [id, c] of counts) {
      if (c < need || (surfaceRefs[id] as number) <= 0) continue;
      // Compare stems too: "flaten" is one edit from "flatten" although the corpus only has "flattening".
      const d = Math.min(within(word, surfaceWords[id] as string), within(queryStem, stemWords[surfaceStem[id] as number] as string));
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

  /** Ids visible to the audience, carrying every filter tag, retired ones only when asked. */
  function gate(pool: number[], f: Filters): number[] {
    const bit = f.audience === "published" ? FL_PUBLISHED : FL_WORKING;
    const wanted = f.tags.map((slug) => tagIndex.get(slug) ?? -1);
    if (wanted.includes(-1)) return [];
    const out: number[] = [];
    for (const id of pool) {
      const fl = flags[id] as number;
      if ((fl & bit) === 0 || ((fl & FL_RETIRED) !== 0 && !f.includeRetired)) continue;
      if (wanted.length > 0) {
        const own = tagIdsOf[id] as Int32Array;
        if (!wanted.every((t) => own.includes(t))) continue;
      }
      out.push(id);
    }
    return out;
  }

  type Ranked = { ids: number[]; scores: Float64Array; keys: Float64Array; house: Uint8Array };

  /**
   * Order: among good matches (≥ GOOD_MATCH of the best score) the department's method for a problem
   * the search is about first, then approved, then drafts and reviews; then weaker matches; retired
   * last. Encoded in one sort key per candidate: group × 1e9 + score.
   */
  function rankCandidates(ids: number[], words: QueryWord[], filters: Filters): Ranked {
    const n = words.filter((w) => w.expansions.length > 0).length;
    const houseHits = hitProblemTags(words, filters.tags);
    // Most query words must match; relax to the best coverage any live technique reaches. Retired
    // techniques do not set the bar, since they are listed last anyway.
    let bestLive = 0;
    let bestAny = 0;
    for (const id of ids) {
      const c = cover[id] as number;
      if (c > bestAny) bestAny = c;
      if (c > bestLive && ((flags[id] as number) & FL_RETIRED) === 0) bestLive = c;
    }
    const required = Math.max(1, Math.min(n - Math.floor(n / 3), bestLive > 0 ? bestLive : bestAny));
    const chosen: number[] = [];
    for (const id of ids) if ((cover[id] as number) >= required) chosen.push(id);
    const scores = new Float64Array(chosen.length);
    let top = 0;
    let topAny = 0;
    for (let i = 0; i < chosen.length; i++) {
      const id = chosen[i] as number;
      // Square root: matching every word helps, but not enough to beat strong title/alias matches of most words.
      const sc = (acc[id] as number) * Math.sqrt((cover[id] as number) / Math.max(1, n));
      scores[i] = sc;
      if (sc > topAny) topAny = sc;
      if (sc > top && ((flags[id] as number) & FL_RETIRED) === 0) top = sc;
    }
    if (top === 0) top = topAny;
    const keys = new Float64Array(chosen.length);
    const house = new Uint8Array(chosen.length);
    for (let i = 0; i < chosen.length; i++) {
      const id = chosen[i] as number;
      const fl = flags[id] as number;
      let sc = scores[i] as number;
      const isHouseHit =
        (fl & FL_HOUSE) !== 0 &&
        (fl & FL_APPROVED) !== 0 &&
        (entries[id] as Entry).doc.houseMethodFor.some((slug) => houseHits.has(slug));
      house[i] = isHouseHit ? 1 : 0;
      let group: number;
      if (fl & FL_RETIRED) group = 4;
      else if (sc >= GOOD_MATCH * top) group = isHouseHit ? 0 : fl & FL_APPROVED ? 1 : 2;
      else {
        group = 3;
        if ((fl & FL_APPROVED) === 0) sc *= 0.5;
      }
      scores[i] = sc;
      keys[i] = (4 - group) * 1e9 + sc;
    }
    return { ids: chosen, scores, keys, house };
  }

  /** Positions of the `k` largest keys, best first (ties by lower id); avoids sorting every match. */
  function topK(ids: number[], keys: Float64Array, select: Uint8Array | null, k: number): number[] {
    if (k <= 0) return [];
    const idx: number[] = [];
    let threshold = Number.NEGATIVE_INFINITY;
    let count = 0;
    for (let i = 0; i < ids.length; i++) if (!select || select[i]) count++;
    if (count > k * 2 + 64 && k > 0) {
      const pool = new Float64Array(count);
      let j = 0;
      for (let i = 0; i < ids.length; i++) if (!select || select[i]) pool[j++] = keys[i] as number;
      pool.sort();
      threshold = pool[count - k] as number;
    }
    for (let i = 0; i < ids.length; i++) if ((!select || select[i]) && (keys[i] as number) >= threshold) idx.push(i);
    idx.sort((a, b) => (keys[b] as number) - (keys[a] as number) || (ids[a] as number) - (ids[b] as number));
    return idx.slice(0, k);
  }

  function matchesFor(e: Entry, stems: Set<string>): { matches: SearchMatch[]; snippet: string } {
    const doc = e.doc;
    const matches: SearchMatch[] = [];
    const rangesOf = (text: string, camel = false): [number, number][] => {
      const toks = tokenize(text, camel);
      const out: [number, number][] = [];
      toks.forEach((t, i) => {
        if (stems.has(stem(t.word))) out.push([t.start, t.end]);
        const next = toks[i + 1];
        if (next && next.start - t.end === 1 && stems.has(stem(t.word + next.word))) out.push([t.start, next.end]);
      });
      return out;
    };
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
      const lo = snippet.startsWith("…") ? 1 : 0;
      const hi = snippet.length - (snippet.endsWith("…") ? 1 : 0);
      const inside = bodyTokens
        .map((t) => [t.start + cut.shift, t.end + cut.shift] as [number, number])
        .filter(([s0, e0]) => s0 >= lo && e0 <= hi);
      if (inside.length > 0) matches.push({ field: "body", value: snippet, ranges: inside });
    } else {
      snippet = excerpt(doc.summary, 0, SNIPPET_CHARS).text;
    }
    return { matches, snippet };
  }

  function toResult(id: number, score: number, isHouseHit: boolean, stems: Set<string>): SearchResult {
    const e = entries[id] as Entry;
    const { matches, snippet } =
      stems.size > 0 ? matchesFor(e, stems) : { matches: [], snippet: excerpt(e.doc.summary, 0, SNIPPET_CHARS).text };
    return {
      slug: e.doc.slug,
      title: e.doc.title,
      summary: e.doc.summary,
      status: e.doc.status,
      score: Math.round(score * 1000) / 1000,
      matches,
      snippet,
      tags: e.doc.tags,
      updatedAt: e.doc.updatedAt,
      isHouseMethod: isHouseHit,
      houseMethodFor: e.doc.houseMethodFor,
    };
  }

  function facetsOf(ids: number[], select: Uint8Array, statusCounts: Map<SearchStatus, number>): SearchResponse["facets"] {
    const counts = new Int32Array(tagSlugs.length);
    for (let i = 0; i < ids.length; i++) {
      if (!select[i]) continue;
      const own = tagIdsOf[ids[i] as number] as Int32Array;
      for (let t = 0; t < own.length; t++) counts[own[t] as number] = (counts[own[t] as number] as number) + 1;
    }
    const problem: SearchFacetTag[] = [];
    const plate: SearchFacetTag[] = [];
    counts.forEach((count, ti) => {
      if (count === 0) return;
      const slug = tagSlugs[ti] as string;
      const info = tags.get(slug);
      if (info) (info.tag.kind === "problem" ? problem : plate).push({ slug, name: info.tag.name, count });
    });
    const bySize = (a: SearchFacetTag, b: SearchFacetTag): number => b.count - a.count || a.name.localeCompare(b.name);
    return {
      problem: problem.sort(bySize),
      plate: plate.sort(bySize),
      status: STATUS_ORDER.filter((st) => statusCounts.has(st)).map((st) => ({ status: st, count: statusCounts.get(st) as number })),
    };
  }

  function expandedStems(words: QueryWord[]): Set<string> {
    const stems = new Set<string>();
    for (const w of words) for (const e of w.expansions) stems.add(stemWords[e.stemId] as string);
    return stems;
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
    const gated = gate(pool, filters);
    let ranked: Ranked;
    if (isEmptyQuery) {
      ranked = { ids: gated, scores: new Float64Array(gated.length), keys: new Float64Array(gated.length), house: new Uint8Array(gated.length) };
    } else {
      ranked = rankCandidates(gated, words, filters);
    }
    if (isEmptyQuery || options.sort === "recent") {
      ranked.ids.forEach((id, i) => {
        ranked.keys[i] = (((flags[id] as number) & FL_RETIRED) === 0 ? 1e14 : 0) + (updatedAt[id] as number);
      });
    }
    // Status facet counts ignore the status filter itself, so the UI can show what switching it would give.
    const select = new Uint8Array(ranked.ids.length);
    const statusCounts = new Map<SearchStatus, number>();
    let total = 0;
    ranked.ids.forEach((id, i) => {
      const st = (entries[id] as Entry).doc.status;
      statusCounts.set(st, (statusCounts.get(st) ?? 0) + 1);
      if (!filters.status || filters.status.length === 0 || filters.status.includes(st)) {
        select[i] = 1;
        total++;
      }
    });
    const order = topK(ranked.ids, ranked.keys, select, offset + limit).slice(offset);
    const stems = expandedStems(words);
    const results = order.map((i) => toResult(ranked.ids[i] as number, ranked.scores[i] as number, ranked.house[i] === 1, stems));

    let corrected = query;
    for (const w of [...words].reverse()) {
      const first = w.expansions[0];
      if (first?.kind === "typo") corrected = corrected.slice(0, w.start) + first.surface + corrected.slice(w.end);
    }
    return {
      results,
      total,
      facets: facetsOf(ranked.ids, select, statusCounts),
      ...(corrected !== query ? { corrected } : {}),
      tookMs: Math.round((performance.now() - t0) * 100) / 100,
    };
  }

  function suggestTitles(query: string, audience: SearchAudience, limit = 8): TitleSuggestion[] {
    const words = parseQuery(query, true);
    if (words.length === 0) return [];
    const mask = (1 << F_TITLE) | (1 << F_ALIASES) | (1 << F_TAGS);
    const filters: Filters = { audience, tags: [], status: undefined, includeRetired: false };
    const ranked = rankCandidates(gate(score(words, mask), filters), words, filters);
    const stems = expandedStems(words);
    return topK(ranked.ids, ranked.keys, null, Math.max(0, Math.min(50, limit))).map((i) => {
      const e = entries[ranked.ids[i] as number] as Entry;
      return {
        slug: e.doc.slug,
        title: e.doc.title,
        status: e.doc.status,
        score: Math.round((ranked.scores[i] as number) * 1000) / 1000,
        ranges: tokenize(e.doc.title)
          .filter((t) => stems.has(stem(t.word)))
          .map((t) => [t.start, t.end] as [number, number]),
        isHouseMethod: ranked.house[i] === 1,
      };
    });
  }

  return {
    upsert,
    remove: removeTechnique,
    search,
    suggestTitles,
    size: () => techniques.size,
    version: () => contentVersion,
    load,
    compact,
  };
}
