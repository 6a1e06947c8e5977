/**
 * Scoring: BM25 per field (Robertson & Zaragoza 2009, "The Probabilistic Relevance Framework: BM25
 * and Beyond") — length-normalised term frequency saturated by k1 in each field, fields summed with
 * weights, times IDF — summed over the query's units with graded matching: every page that matches
 * any unit is a candidate, a unit counts by its weight (filler words little), and an alternative by
 * its kind (a synonym less than the word typed). Nothing is dropped here for matching too few words:
 * how much of the query a page covers scales its score (ranking.ts decides the order).
 */
import { FIELD_COUNT, F_ALIASES, F_SUMMARY, type PostingStore } from "./postings";
import type { Alternative, QueryPlan } from "./query";

/** Query words past this are ignored (a 200-character query has far fewer content words). */
export const MAX_UNITS = 10;

/**
 * title > aliases ≈ tags ≈ summary > parameters ≈ shots > body. The summary is the page's one-sentence
 * statement of the problem, the field that "describe what you see" queries meet most often, so it
 * weighs as much as the list-like naming fields.
 */
export const FIELD_WEIGHTS: readonly number[] = [6, 4, 4, 4, 1.5, 1.5, 1];
/** BM25 length normalisation per field: short list-like fields barely normalise. */
const FIELD_B: readonly number[] = [0.5, 0.3, 0.3, 0.75, 0.3, 0.2, 0.75];
const K1 = 1.2;
// Title and aliases (fields 0 and 1) name a page's problem: ranking.ts compares pages by them.

/** How much an alternative counts against the word as typed (1). */
export const ALTERNATIVE_WEIGHTS = {
  exact: 1,
  /** Met only through the stemmer ("trakers" → "traker"). */
  stem: 0.9,
  /** Same word family ("dark" ↔ "darken", "blurry" ↔ "blur"). */
  family: 0.8,
  /** The pieces of a hyphenated compound ("c-stand" → stand): mostly its head noun. */
  parts: 0.85,
  /** One edit away. */
  typo: 0.75,
  /** Two edits away. */
  typo2: 0.55,
  /** One edit away from a real word that no page uses (never shown as a correction). */
  nearWord: 0.4,
  /** A run-together word split in two ("infront" → in front). */
  split: 0.9,
  /** Two typed words written as one on the page ("foot prints" → footprints). */
  joined: 0.9,
  /**
   * A thesaurus term, well under the word typed: a page that says the query's own word is the
   * likelier answer than one that only says a synonym of it.
   */
  synonym: 0.5,
  /** A narrower thesaurus term reaching its broader one ("tracker" → marker): looser still. */
  broader: 0.4,
} as const;

/** A partial word completed: the more of it typed, the likelier; a complete word less likely a start. */
export function completionWeight(typed: string, word: string, typedIsWord: boolean): number {
  const share = typed.length / word.length;
  return typedIsWord ? 0.4 + 0.2 * share : 0.55 + 0.35 * share;
}

/** BM25 inverse document frequency, the non-negative variant (as in Lucene's BM25Similarity). */
export function bm25Idf(docCount: number, docFreq: number): number {
  return Math.log(1 + (docCount - docFreq + 0.5) / (docFreq + 0.5));
}

/** Candidates of one query: internal ids with their scores, title/alias ("naming") scores and coverage. */
export type ScoredCandidates = { ids: number[]; scores: Float64Array; naming: Float64Array; coverage: Float64Array };

const MAX_COLUMNS = MAX_UNITS + Math.ceil(MAX_UNITS / 2);
const ROW = 2 * MAX_COLUMNS;

/** Reuses its scratch arrays across queries (single-threaded, so no sharing hazard). */
export class Scorer {
  private rows = new Float64Array(1024 * ROW);
  private stamp = new Int32Array(1024);
  private altSum = new Float64Array(1024);
  private altNaming = new Float64Array(1024);
  private altCount = new Uint8Array(1024);
  private altStamp = new Int32Array(1024);
  private counter = 0;

  constructor(private readonly store: PostingStore) {}

  private ensure(capacity: number): void {
    if (capacity <= this.stamp.length) return;
    let size = this.stamp.length;
    while (size < capacity) size *= 2;
    this.rows = new Float64Array(size * ROW);
    this.stamp = new Int32Array(size);
    this.altSum = new Float64Array(size);
    this.altNaming = new Float64Array(size);
    this.altCount = new Uint8Array(size);
    this.altStamp = new Int32Array(size);
  }

  /**
   * Scores every document that answers some unit of the plan. `fieldMask` limits the fields read
   * (the quick finder reads title, aliases and tags only); `capacity` is one past the largest id.
   */
  score(plan: QueryPlan, fieldMask: number, capacity: number): ScoredCandidates {
    this.ensure(capacity);
    const queryStamp = ++this.counter;
    const touched: number[] = [];
    const { units, spans } = plan;
    const store = this.store;
    const N = store.liveDocs;
    const avg = store.averageLengths();
    const weights = FIELD_WEIGHTS.map((w, f) => ((fieldMask >> f) & 1 ? w : 0));
    const rows = this.rows;

    /**
     * BM25 of each posting of a stem, fields summed with weights (and the naming fields' part apart),
     * computed once per stem per query: several alternatives often share a stem ("lens distortion",
     * "barrel distortion", "pincushion distortion").
     */
    type StemScores = { ids: Uint32Array; n: number; sum: Float64Array; naming: Float64Array; short: Float64Array };
    const byStem = new Map<number, StemScores | null>();
    const lengths = store.lengths;
    const stemScores = (sid: number): StemScores | null => {
      let cached = byStem.get(sid);
      if (cached !== undefined) return cached;
      const list = store.lists[sid];
      if (!list || list.n === 0) {
        byStem.set(sid, null);
        return null;
      }
      const n = list.n;
      const data = list.data;
      const ids = new Uint32Array(n);
      const sum = new Float64Array(n);
      const naming = new Float64Array(n);
      const short = new Float64Array(n);
      for (let k = 0; k < n; k++) {
        const id = data[k * 2] as number;
        let packed = data[k * 2 + 1] as number;
        ids[k] = id;
        let total = 0;
        let named = 0;
        let inShort = 0;
        for (let f = 0; packed !== 0; f++, packed >>>= 4) {
          const tf = packed & 15;
          if (tf === 0) continue;
          const b = FIELD_B[f] as number;
          const norm = 1 - b + (b * (lengths[id * FIELD_COUNT + f] as number)) / (avg[f] as number);
          const v = ((weights[f] as number) * tf * (K1 + 1)) / (tf + K1 * norm);
          total += v;
          if (f <= F_ALIASES) named += v;
          if (f <= F_SUMMARY) inShort += v;
        }
        sum[k] = total;
        naming[k] = named;
        short[k] = inShort;
      }
      cached = { ids, n, sum, naming, short };
      byStem.set(sid, cached);
      return cached;
    };
    const touch = (id: number): number => {
      if (this.stamp[id] !== queryStamp) {
        this.stamp[id] = queryStamp;
        rows.fill(0, id * ROW, (id + 1) * ROW);
        touched.push(id);
      }
      return id * ROW;
    };
    const keep = (id: number, column: number, s: number, naming: number): void => {
      const at = touch(id);
      if (s > (rows[at + column] as number)) rows[at + column] = s;
      if (naming > (rows[at + MAX_COLUMNS + column] as number)) rows[at + MAX_COLUMNS + column] = naming;
    };

    const runAlternatives = (alternatives: Alternative[], column: number): void => {
      // Corrections and completions share the IDF of their most common candidate, so a rare look-alike
      // word (likely noise) does not outscore the common word meant: Lucene's fuzzy queries do the same
      // by default (TopTermsBlendedFreqScoringRewrite).
      let maxDf = 0;
      for (const a of alternatives) if (a.kind === "typo" || a.kind === "prefix") maxDf = Math.max(maxDf, store.docFreq(a.stems[0] as number));
      const blendedIdf = bm25Idf(N, maxDf);
      for (const alt of alternatives) {
        const idfOf = (sid: number): number => {
          const own = bm25Idf(N, store.docFreq(sid));
          return alt.kind === "typo" || alt.kind === "prefix" ? Math.min(own, blendedIdf) : own;
        };
        // Naming (ranking rule 4) counts the query's own words only: a page names the problem better
        // by saying it, not by a thesaurus term for it.
        const namingShare = alt.kind === "synonym" || alt.kind === "broader" ? 0 : 1;
        if (alt.stems.length === 1) {
          const sid = alt.stems[0] as number;
          const sc = stemScores(sid);
          if (!sc) continue;
          const scale = idfOf(sid) * alt.weight;
          const nameScale = scale * namingShare;
          const { ids, sum, naming } = sc;
          for (let k = 0; k < sc.n; k++) {
            const v = sum[k] as number;
            if (v === 0) continue;
            const id = ids[k] as number;
            if (this.stamp[id] !== queryStamp) {
              this.stamp[id] = queryStamp;
              rows.fill(0, id * ROW, (id + 1) * ROW);
              touched.push(id);
            }
            const at = id * ROW + column;
            if (v * scale > (rows[at] as number)) rows[at] = v * scale;
            const nm = (naming[k] as number) * nameScale;
            if (nm > (rows[at + MAX_COLUMNS] as number)) rows[at + MAX_COLUMNS] = nm;
          }
          continue;
        }
        // Several stems (a phrase from the thesaurus, the parts of a compound): all must be on the
        // page; the alternative scores the mean of its stems.
        // A thesaurus phrase counts where its words are likely to stand together, in the short fields:
        // "blue" and "backing" far apart in a body are not "blue backing".
        const isPhrase = alt.kind === "synonym" || alt.kind === "broader";
        const altStamp = ++this.counter;
        const hits: number[] = [];
        for (const sid of alt.stems) {
          const sc = stemScores(sid);
          if (!sc) continue;
          const idf = idfOf(sid);
          const scores = isPhrase ? sc.short : sc.sum;
          for (let k = 0; k < sc.n; k++) {
            const id = sc.ids[k] as number;
            const s = scores[k] as number;
            const naming = sc.naming[k] as number;
            if (s === 0) continue;
            if (this.altStamp[id] !== altStamp) {
              this.altStamp[id] = altStamp;
              this.altSum[id] = 0;
              this.altNaming[id] = 0;
              this.altCount[id] = 0;
              hits.push(id);
            }
            this.altSum[id] = (this.altSum[id] as number) + s * idf;
            this.altNaming[id] = (this.altNaming[id] as number) + naming * idf;
            this.altCount[id] = (this.altCount[id] as number) + 1;
          }
        }
        const n = alt.stems.length;
        for (const id of hits) {
          if (this.altCount[id] !== n) continue;
          keep(id, column, ((this.altSum[id] as number) / n) * alt.weight, ((this.altNaming[id] as number) / n) * alt.weight * namingShare);
        }
      }
    };

    units.forEach((u, i) => runAlternatives(u.alternatives, i));
    spans.forEach((s, i) => runAlternatives(s.alternatives, units.length + i));

    // Combine: a unit adds weight × its best alternative; a span adds the better of its units' sum
    // and its own alternatives scaled by the weight of the words it replaces.
    const inSpan = new Int8Array(units.length).fill(-1);
    spans.forEach((s, si) => {
      for (let k = s.first; k < s.first + s.count; k++) inSpan[k] = si;
    });
    // Filler words are not looked up (query.ts) and do not count toward coverage either.
    const totalWeight = units.reduce((sum, u) => sum + (u.isFiller ? 0 : u.weight), 0) || 1;
    const scores = new Float64Array(touched.length);
    const naming = new Float64Array(touched.length);
    const coverage = new Float64Array(touched.length);
    touched.forEach((id, t) => {
      const at = id * ROW;
      let total = 0;
      let named = 0;
      let covered = 0;
      units.forEach((u, i) => {
        if (inSpan[i] !== -1) return;
        total += u.weight * (rows[at + i] as number);
        named += u.weight * (rows[at + MAX_COLUMNS + i] as number);
        if ((rows[at + i] as number) > 0) covered += u.weight;
      });
      spans.forEach((s, si) => {
        let sum = 0;
        let sumNamed = 0;
        let sumCovered = 0;
        let spanWeight = 0;
        for (let k = s.first; k < s.first + s.count; k++) {
          const w = (units[k] as { weight: number }).weight;
          spanWeight += w;
          sum += w * (rows[at + k] as number);
          sumNamed += w * (rows[at + MAX_COLUMNS + k] as number);
          if ((rows[at + k] as number) > 0) sumCovered += w;
        }
        const own = spanWeight * (rows[at + units.length + si] as number);
        const ownNamed = spanWeight * (rows[at + MAX_COLUMNS + units.length + si] as number);
        total += Math.max(sum, own);
        named += Math.max(sumNamed, ownNamed);
        covered += own > 0 ? spanWeight : sumCovered;
      });
      scores[t] = total;
      naming[t] = named;
      coverage[t] = covered / totalWeight;
    });
    return { ids: touched, scores, naming, coverage };
  }
}
