/**
 * Postings: for each stem, the documents that contain it and how often in each field, packed in one
 * 32-bit word (4 bits per field). Plus per-document field lengths for BM25's length normalisation,
 * and `analyseDocument`, which turns a document into those counts.
 */
import type { SearchDocument, SearchField } from "./types";
import { isStopWord, tokenize, type Token } from "./text";
import type { Vocabulary } from "./vocabulary";

export const FIELDS: readonly SearchField[] = ["title", "aliases", "tags", "summary", "parameters", "shots", "body"];
export const FIELD_COUNT = FIELDS.length;
export const F_TITLE = 0;
export const F_ALIASES = 1;
export const F_TAGS = 2;
export const F_SUMMARY = 3;
/** Title, aliases, tags and summary in packed counts: where a thesaurus phrase counts (scoring.ts). */
export const SHORT_FIELDS_MASK = 0xffff;
export const F_PARAMETERS = 4;
const TF_MAX = 15;
/** Longest run-together pair indexed ("bluescreen", "cleanplate"); longer ones are never typed. */
const MAX_JOINED = 18;

/** The document's text per field, in FIELDS order. */
export function fieldTexts(doc: SearchDocument): string[] {
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

export class Postings {
  /** Interleaved [docId, packedTf]; ids ascend because document ids are never reused. */
  data: Uint32Array = new Uint32Array(4);
  n = 0;
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
  /** The packed per-field counts of document `id`, 0 when the stem is not on it. */
  countsOf(id: number): number {
    let lo = 0;
    let hi = this.n - 1;
    while (lo <= hi) {
      const mid = (lo + hi) >> 1;
      const v = this.data[mid * 2] as number;
      if (v === id) return this.data[mid * 2 + 1] as number;
      if (v < id) lo = mid + 1;
      else hi = mid - 1;
    }
    return 0;
  }
  trim(): void {
    if (this.data.length > this.n * 2 + 2) this.data = this.data.slice(0, Math.max(4, this.n * 2));
  }
}

/** `surfaceCounts[i]`: how often `surfaces[i]` occurs in the document (for spelling's tie-breaks). */
export type AnalysedDocument = { terms: number[]; packed: number[]; surfaces: number[]; surfaceCounts: number[]; fieldLengths: number[] };

/**
 * Counts per stem and field. Besides each word, hyphenated compounds count whole and in parts
 * ("c-stand" → cstand, stand), and in title, aliases and tags two adjacent words also count run
 * together ("blue screen" → bluescreen), so a junior's compound word finds the two-word title.
 */
export class DocumentAnalyser {
  // Scratch by stem id / surface id, reset after each document: no Map per document, far less GC.
  private tf = new Uint32Array(4096);
  private seen = new Uint32Array(4096);

  constructor(private readonly vocab: Vocabulary) {}

  analyse(doc: SearchDocument): AnalysedDocument {
    const terms: number[] = [];
    const surfaces: number[] = [];
    const fieldLengths: number[] = [];
    const texts = fieldTexts(doc);
    const count = (stemId: number, field: number): void => {
      if (stemId >= this.tf.length) this.tf = grow(this.tf, stemId);
      const p = this.tf[stemId] as number;
      if (p === 0) terms.push(stemId);
      if (((p >>> (field * 4)) & 15) < TF_MAX) this.tf[stemId] = p + (1 << (field * 4));
    };
    const word = (w: string, field: number): void => {
      const sf = this.vocab.internSurface(w);
      if (sf >= this.seen.length) this.seen = grow(this.seen, sf);
      if (this.seen[sf] === 0) surfaces.push(sf);
      this.seen[sf] = (this.seen[sf] as number) + 1;
      count(this.vocab.surfaceStem[sf] as number, field);
    };
    for (let f = 0; f < FIELD_COUNT; f++) {
      const text = texts[f] as string;
      let length = 0;
      let prev: Token | undefined;
      for (const t of tokenize(text, f === F_PARAMETERS)) {
        if (isStopWord(t.word)) {
          prev = undefined;
          continue;
        }
        length++;
        word(t.word, f);
        for (const part of t.parts ?? []) if (!isStopWord(part.word)) word(part.word, f);
        // Run-together pairs only in the short naming fields: in summaries and bodies they would add
        // ~100 MB of one-off pairs at 50,000 techniques.
        if (f <= F_TAGS && prev && !t.parts && !prev.parts && t.start - prev.end === 1 && (prev.word + t.word).length <= MAX_JOINED) {
          count(this.vocab.internStem(this.vocab.stemOf(prev.word + t.word)), f);
        }
        prev = t;
      }
      fieldLengths.push(Math.min(length, 65535));
    }
    const packed = terms.map((sid) => this.tf[sid] as number);
    for (const sid of terms) this.tf[sid] = 0;
    const surfaceCounts = surfaces.map((sf) => this.seen[sf] as number);
    for (const sf of surfaces) this.seen[sf] = 0;
    return { terms, packed, surfaces, surfaceCounts, fieldLengths };
  }
}

function grow<T extends Uint32Array | Uint8Array>(a: T, atLeast: number): T {
  let size = a.length;
  while (size <= atLeast) size *= 2;
  const next = new (a.constructor as new (n: number) => T)(size);
  next.set(a);
  return next;
}

/** All postings plus the field lengths BM25 needs, keyed by dense document ids. */
export class PostingStore {
  readonly lists: Postings[] = [];
  lengths = new Uint16Array(1024 * FIELD_COUNT);
  readonly totalLength = new Float64Array(FIELD_COUNT);
  liveDocs = 0;
  /** Bumped on every add and remove: what depends on the field averages (scoring.ts) is redone. */
  version = 0;

  addStem(): void {
    this.lists.push(new Postings());
  }

  docFreq(stemId: number): number {
    return (this.lists[stemId] as Postings).n;
  }

  /** Whether some document contains both stems (walks the shorter list, looks each id up in the other). */
  shareADocument(a: number, b: number): boolean {
    const la = this.lists[a];
    const lb = this.lists[b];
    if (!la || !lb) return false;
    const [small, big] = la.n <= lb.n ? [la, lb] : [lb, la];
    for (let i = 0; i < small.n; i++) if (big.countsOf(small.data[i * 2] as number) !== 0) return true;
    return false;
  }

  add(id: number, a: AnalysedDocument): void {
    if ((id + 1) * FIELD_COUNT > this.lengths.length) {
      let size = this.lengths.length;
      while (size < (id + 1) * FIELD_COUNT) size *= 2;
      const next = new Uint16Array(size);
      next.set(this.lengths);
      this.lengths = next;
    }
    for (let i = 0; i < a.terms.length; i++) (this.lists[a.terms[i] as number] as Postings).push(id, a.packed[i] as number);
    for (let f = 0; f < FIELD_COUNT; f++) {
      this.lengths[id * FIELD_COUNT + f] = a.fieldLengths[f] as number;
      this.totalLength[f] = (this.totalLength[f] as number) + (a.fieldLengths[f] as number);
    }
    this.liveDocs++;
    this.version++;
  }

  remove(id: number, a: AnalysedDocument): void {
    for (const sid of a.terms) (this.lists[sid] as Postings).remove(id);
    for (let f = 0; f < FIELD_COUNT; f++) this.totalLength[f] = (this.totalLength[f] as number) - (this.lengths[id * FIELD_COUNT + f] as number);
    this.liveDocs--;
    this.version++;
  }

  /** Average length per field over live documents (at least 1). */
  averageLengths(): Float64Array {
    const avg = new Float64Array(FIELD_COUNT);
    for (let f = 0; f < FIELD_COUNT; f++) avg[f] = this.liveDocs > 0 ? Math.max(1, (this.totalLength[f] as number) / this.liveDocs) : 1;
    return avg;
  }

  compact(): void {
    for (const p of this.lists) p.trim();
  }
}
