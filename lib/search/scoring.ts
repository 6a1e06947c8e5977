/**
 * Scoring: BM25 per field (Robertson & Zaragoza 2009, "The Probabilistic Relevance Framework: BM25
 * and Beyond") — length-normalised term frequency saturated by k1 in each field, fields summed with
 * weights, times IDF (but a word in several of the title, aliases and tags counts once, by the best:
 * they are names of one thing, not separate votes — what BM25F, which pools a document's fields
 * before saturating, also avoids) — summed over the query's units with graded matching: every page that matches
 * any unit is a candidate, a unit counts by its weight (filler words little), and an alternative by
 * its kind (a synonym less than the word typed). Nothing is dropped here for matching too few words:
 * how much of the query a page covers scales its score (ranking.ts decides the order).
 */
import { FIELD_COUNT, F_ALIASES, F_SUMMARY, F_TAGS, type PostingStore } from "./postings";
import type { Alternative, QueryPlan, QuerySpan } from "./query";

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
  /** A symptom word of the built-in lexicon reaching a problem name ("blotchy" → uneven): loosest. */
  related: 0.3,
  /** An everyday synonym from WordNet ("bloke" → man): under the leads' thesaurus and the lexicon. */
  wordnet: 0.25,
  /** One step broader in WordNet ("mattress" → pad; "tiny" similar to small). */
  wordnetBroader: 0.2,
  /** Two steps broader ("tourists" → person). */
  wordnetBroader2: 0.15,
} as const;

/** Alternatives that count well under the word typed: thesaurus terms and completions (and corrections past one edit). */
const WEAK_KINDS: ReadonlySet<Alternative["kind"]> = new Set(["synonym", "broader", "related", "wordnet", "wordnetBroader", "prefix"]);
/** A weak alternative of a stem on more than this share of the pages only adds to pages found otherwise. */
export const JOIN_ONLY_SHARE = 0.25;
/** …and on more pages than this: in a small department every page is cheap to score, so none is cut. */
export const JOIN_ONLY_MIN_PAGES = 200;

/** Alternatives that come from the thesaurus, the symptom lexicon or WordNet rather than from the word typed. */
export function isThesaurusKind(kind: Alternative["kind"]): boolean {
  return kind === "synonym" || kind === "broader" || kind === "related" || isWordNetKind(kind);
}

/** WordNet's everyday words: too loose to make a query "about" a problem tag (ranking.ts, rule 4). */
export function isWordNetKind(kind: Alternative["kind"]): boolean {
  return kind === "wordnet" || kind === "wordnetBroader";
}

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
export type ScoredCandidates = {
  ids: number[];
  scores: Float64Array;
  naming: Float64Array;
  /** Share of the query's content words the page covers, for the grade (a long body's words in part). */
  coverage: Float64Array;
  /** Share of them the page meets anywhere at all (WordNet relatives in part): 1 keeps it in the list. */
  answered: Float64Array;
};

const MAX_COLUMNS = MAX_UNITS + Math.ceil(MAX_UNITS / 2);
const ROW = 4 * MAX_COLUMNS;
const CREDIT = 2 * MAX_COLUMNS;
/** The coverage credit times the length credit (the pool's fourth slot): what the grade counts. */
const GRADED_CREDIT = 3 * MAX_COLUMNS;

/**
 * How much of a query word a page answers when it matches it only by this kind of alternative (the
 * coverage grade, ranking.ts rule 1): an everyday WordNet relative is weak evidence that the page is
 * about what the word says, so it covers the word only in part.
 */
export function coverageCredit(kind: Alternative["kind"]): number {
  return isWordNetKind(kind) ? 0.5 : 1;
}

/** Per stem and page in the scorer's pool: field-weighted score, naming part, short-field part, length credit. */
const SLOTS = 4;

/** Reuses its scratch arrays across queries (single-threaded, so no sharing hazard). */
export class Scorer {
  private rows = new Float64Array(1024 * ROW);
  private stamp = new Int32Array(1024);
  private altSum = new Float64Array(1024);
  private altNaming = new Float64Array(1024);
  private altCount = new Uint8Array(1024);
  private altCredit = new Float64Array(1024);
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
    this.altCredit = new Float64Array(size);
    this.altStamp = new Int32Array(size);
  }

  /**
   * BM25's per-field denominator part K1 · (1 − b + b · length / average) of every document, redone
   * only after the corpus changed (the averages move with every write): per posting the score is then
   * one load and one division per field.
   */
  private lengthNorms = new Float64Array(0);
  private lengthNormsVersion = -1;

  private refreshLengthNorms(capacity: number): void {
    const store = this.store;
    if (this.lengthNormsVersion === store.version && this.lengthNorms.length >= capacity * FIELD_COUNT) return;
    const avg = store.averageLengths();
    if (this.lengthNorms.length < capacity * FIELD_COUNT) this.lengthNorms = new Float64Array(Math.max(1024, capacity) * FIELD_COUNT * 1.25);
    const norms = this.lengthNorms;
    const lengths = store.lengths;
    const upTo = Math.min(capacity * FIELD_COUNT, lengths.length);
    for (let i = 0; i < upTo; i++) {
      const f = i % FIELD_COUNT;
      const b = FIELD_B[f] as number;
      norms[i] = K1 * (1 - b + (b * (lengths[i] as number)) / (avg[f] as number));
    }
    this.lengthNormsVersion = store.version;
  }

  /** Per-stem scores of one query, side by side in one reusable buffer (no arrays made per stem). */
  private pool = new Float64Array(SLOTS * 4096);

  /**
   * Scores every document that answers some unit of the plan. `fieldMask` limits the fields read
   * (the quick finder reads title, aliases and tags only); `capacity` is one past the largest id.
   */
  score(plan: QueryPlan, fieldMask: number, capacity: number): ScoredCandidates {
    this.ensure(capacity);
    this.refreshLengthNorms(capacity);
    const queryStamp = ++this.counter;
    const touched: number[] = [];
    const { units, spans } = plan;
    const store = this.store;
    const N = store.liveDocs;
    const weights = FIELD_WEIGHTS.map((w, f) => ((fieldMask >> f) & 1 ? w * (K1 + 1) : 0));
    const rows = this.rows;
    const norms = this.lengthNorms;

    /**
     * BM25 of each posting of a stem, fields summed with weights (and the naming fields' part apart),
     * computed once per stem per query: several alternatives often share a stem ("lens distortion",
     * "barrel distortion", "pincushion distortion"). Kept in `pool` from `at`: the field-weighted
     * sums, then the naming part, then the short-field part, then the length credit, `n` each.
     * Length credit (the coverage grade, ranking.ts rule 1): a word in the title, aliases, tags or summary covers its
     * query word fully; a word met only in the body, parameters or shots covers it by BM25's
     * term-frequency part, (K1 + 1) · tf / (tf + K1 · (1 − b + b · length / average)), at most 1 —
     * fully for one mention in a body of average length, about 0.7 for one mention in a body twice
     * as long. A long page meets more of a long query's words by chance; without this its coverage
     * grade rose with its length (the demo's 230–630-word pages over 90–150-word ones).
     */
    type StemScores = { data: Uint32Array; n: number; at: number };
    const byStem = new Map<number, StemScores | null>();
    let poolUsed = 0;
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
      if (poolUsed + SLOTS * n > this.pool.length) {
        const next = new Float64Array(Math.max(this.pool.length * 2, poolUsed + SLOTS * n));
        next.set(this.pool.subarray(0, poolUsed));
        this.pool = next;
      }
      const pool = this.pool;
      const at = poolUsed;
      poolUsed += SLOTS * n;
      for (let k = 0; k < n; k++) {
        const id = data[k * 2] as number;
        let packed = data[k * 2 + 1] as number;
        const base = id * FIELD_COUNT;
        let total = 0;
        let named = 0;
        let inShort = 0;
        let longCredit = 0;
        for (let f = 0; packed !== 0; f++, packed >>>= 4) {
          const tf = packed & 15;
          if (tf === 0) continue;
          const saturation = tf / (tf + (norms[base + f] as number));
          let v = (weights[f] as number) * saturation;
          // One name said twice is one piece of evidence: among the title, aliases and tags only the
          // best counts (the fields come in that order, so `inShort` holds the best so far).
          if (f === F_ALIASES || f === F_TAGS) v = Math.max(0, v - inShort);
          total += v;
          if (f <= F_ALIASES) named += v;
          if (f <= F_SUMMARY) inShort += v;
          // BM25's term-frequency part: 1 for one mention in a field of average length.
          else if ((weights[f] as number) > 0) longCredit = Math.max(longCredit, (K1 + 1) * saturation);
        }
        pool[at + k] = total;
        pool[at + n + k] = named;
        pool[at + 2 * n + k] = inShort;
        pool[at + 3 * n + k] = inShort > 0 ? 1 : Math.min(1, longCredit);
      }
      cached = { data, n, at };
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
    const keep = (id: number, column: number, s: number, naming: number, credit: number, gradedCredit: number): void => {
      const at = touch(id);
      if (s > (rows[at + column] as number)) rows[at + column] = s;
      if (naming > (rows[at + MAX_COLUMNS + column] as number)) rows[at + MAX_COLUMNS + column] = naming;
      if (credit > (rows[at + CREDIT + column] as number)) rows[at + CREDIT + column] = credit;
      if (gradedCredit > (rows[at + GRADED_CREDIT + column] as number)) rows[at + GRADED_CREDIT + column] = gradedCredit;
    };

    // Early cut-off: where the word itself (or a strong form of it) is on pages, a weak alternative
    // of it (a thesaurus term, a far correction, a completion) whose stem is on more than
    // JOIN_ONLY_SHARE of the pages adds to pages found otherwise but brings in none of its own. Its
    // IDF is low and its weight well under the word's, so such pages would stay far under the best;
    // skipping them spares touching thousands of pages at 10,000.
    const isWeak = (alt: Alternative): boolean => WEAK_KINDS.has(alt.kind) || (alt.kind === "typo" && alt.weight < ALTERNATIVE_WEIGHTS.typo);
    const joinOnly = (alt: Alternative, strongInColumn: boolean): boolean => {
      if (!strongInColumn || !isWeak(alt)) return false;
      let rarest = Number.POSITIVE_INFINITY;
      for (const sid of alt.stems) rarest = Math.min(rarest, store.docFreq(sid));
      return rarest > JOIN_ONLY_MIN_PAGES && rarest > JOIN_ONLY_SHARE * N;
    };

    const runAlternatives = (alternatives: Alternative[], column: number, pass: "seed" | "join"): void => {
      // Corrections and completions share the IDF of their most common candidate, so a rare look-alike
      // word (likely noise) does not outscore the common word meant: Lucene's fuzzy queries do the same
      // by default (TopTermsBlendedFreqScoringRewrite).
      let maxDf = 0;
      for (const a of alternatives) if (a.kind === "typo" || a.kind === "prefix") maxDf = Math.max(maxDf, store.docFreq(a.stems[0] as number));
      const blendedIdf = bm25Idf(N, maxDf);
      const strongInColumn = alternatives.some((a) => !isWeak(a));
      for (const alt of alternatives) {
        const joins = joinOnly(alt, strongInColumn);
        if (joins !== (pass === "join")) continue;
        const idfOf = (sid: number): number => {
          const own = bm25Idf(N, store.docFreq(sid));
          return alt.kind === "typo" || alt.kind === "prefix" ? Math.min(own, blendedIdf) : own;
        };
        // Naming (ranking rule 4) counts the query's own words only: a page names the problem better
        // by saying it, not by a thesaurus term for it.
        const namingShare = isThesaurusKind(alt.kind) ? 0 : 1;
        const credit = coverageCredit(alt.kind);
        if (alt.stems.length === 1) {
          const sid = alt.stems[0] as number;
          const sc = stemScores(sid);
          if (!sc) continue;
          const scale = idfOf(sid) * alt.weight;
          const nameScale = scale * namingShare;
          const { data, n, at: from } = sc;
          const pool = this.pool;
          for (let k = 0; k < n; k++) {
            const v = pool[from + k] as number;
            if (v === 0) continue;
            const id = data[k * 2] as number;
            if (this.stamp[id] !== queryStamp) {
              if (joins) continue;
              this.stamp[id] = queryStamp;
              rows.fill(0, id * ROW, (id + 1) * ROW);
              touched.push(id);
            }
            const at = id * ROW + column;
            if (v * scale > (rows[at] as number)) rows[at] = v * scale;
            const nm = (pool[from + n + k] as number) * nameScale;
            if (nm > (rows[at + MAX_COLUMNS] as number)) rows[at + MAX_COLUMNS] = nm;
            if (credit > (rows[at + CREDIT] as number)) rows[at + CREDIT] = credit;
            const graded = credit * (pool[from + 3 * n + k] as number);
            if (graded > (rows[at + GRADED_CREDIT] as number)) rows[at + GRADED_CREDIT] = graded;
          }
          continue;
        }
        // Several stems (a phrase from the thesaurus, the parts of a compound): all must be on the
        // page; the alternative scores the mean of its stems.
        // A thesaurus phrase counts where its words are likely to stand together, in the short fields:
        // "blue" and "backing" far apart in a body are not "blue backing".
        const isPhrase = isThesaurusKind(alt.kind);
        const altStamp = ++this.counter;
        const hits: number[] = [];
        for (const sid of alt.stems) {
          const sc = stemScores(sid);
          if (!sc) continue;
          const idf = idfOf(sid);
          const pool = this.pool;
          const scoresAt = isPhrase ? sc.at + 2 * sc.n : sc.at;
          for (let k = 0; k < sc.n; k++) {
            const id = sc.data[k * 2] as number;
            const s = pool[scoresAt + k] as number;
            const naming = pool[sc.at + sc.n + k] as number;
            if (s === 0) continue;
            if (this.altStamp[id] !== altStamp) {
              this.altStamp[id] = altStamp;
              this.altSum[id] = 0;
              this.altNaming[id] = 0;
              this.altCount[id] = 0;
              this.altCredit[id] = 1;
              hits.push(id);
            }
            this.altCredit[id] = Math.min(this.altCredit[id] as number, pool[sc.at + 3 * sc.n + k] as number);
            this.altSum[id] = (this.altSum[id] as number) + s * idf;
            this.altNaming[id] = (this.altNaming[id] as number) + naming * idf;
            this.altCount[id] = (this.altCount[id] as number) + 1;
          }
        }
        const n = alt.stems.length;
        for (const id of hits) {
          if (this.altCount[id] !== n || (joins && this.stamp[id] !== queryStamp)) continue;
          keep(id, column, ((this.altSum[id] as number) / n) * alt.weight, ((this.altNaming[id] as number) / n) * alt.weight * namingShare, credit, credit * (this.altCredit[id] as number));
        }
      }
    };

    for (const pass of ["seed", "join"] as const) {
      units.forEach((u, i) => runAlternatives(u.alternatives, i, pass));
      spans.forEach((s, i) => runAlternatives(s.alternatives, units.length + i, pass));
    }

    // Combine: a unit adds weight × its best alternative; a span adds the better of its units' sum
    // and its own alternatives scaled by the weight of the words it replaces.
    const unitCount = units.length;
    const inSpan = new Int8Array(unitCount).fill(-1);
    spans.forEach((s, si) => {
      for (let k = s.first; k < s.first + s.count; k++) inSpan[k] = si;
    });
    const unitWeight = Float64Array.from(units, (u) => u.weight);
    const looseUnits = units.map((_, i) => i).filter((i) => inSpan[i] === -1);
    // Filler words are not looked up (query.ts) and do not count toward coverage either.
    const totalWeight = units.reduce((sum, u) => sum + (u.isFiller ? 0 : u.weight), 0) || 1;
    const scores = new Float64Array(touched.length);
    const naming = new Float64Array(touched.length);
    const coverage = new Float64Array(touched.length);
    const answered = new Float64Array(touched.length);
    for (let t = 0; t < touched.length; t++) {
      const at = (touched[t] as number) * ROW;
      let total = 0;
      let named = 0;
      let covered = 0;
      let met = 0;
      for (let j = 0; j < looseUnits.length; j++) {
        const i = looseUnits[j] as number;
        const v = rows[at + i] as number;
        if (v === 0) continue;
        const w = unitWeight[i] as number;
        total += w * v;
        named += w * (rows[at + MAX_COLUMNS + i] as number);
        met += w * (rows[at + CREDIT + i] as number);
        covered += w * (rows[at + GRADED_CREDIT + i] as number);
      }
      for (let si = 0; si < spans.length; si++) {
        const s = spans[si] as QuerySpan;
        let sum = 0;
        let sumNamed = 0;
        let sumCovered = 0;
        let sumMet = 0;
        let spanWeight = 0;
        for (let k = s.first; k < s.first + s.count; k++) {
          const w = unitWeight[k] as number;
          spanWeight += w;
          const v = rows[at + k] as number;
          if (v === 0) continue;
          sum += w * v;
          sumNamed += w * (rows[at + MAX_COLUMNS + k] as number);
          sumMet += w * (rows[at + CREDIT + k] as number);
          sumCovered += w * (rows[at + GRADED_CREDIT + k] as number);
        }
        const own = spanWeight * (rows[at + unitCount + si] as number);
        const ownNamed = spanWeight * (rows[at + MAX_COLUMNS + unitCount + si] as number);
        total += Math.max(sum, own);
        named += Math.max(sumNamed, ownNamed);
        met += own > 0 ? spanWeight * (rows[at + CREDIT + unitCount + si] as number) : sumMet;
        covered += own > 0 ? spanWeight * (rows[at + GRADED_CREDIT + unitCount + si] as number) : sumCovered;
      }
      scores[t] = total;
      naming[t] = named;
      coverage[t] = covered / totalWeight;
      answered[t] = met / totalWeight;
    }
    return { ids: touched, scores, naming, coverage, answered };
  }
}
