/**
 * The vocabulary: every surface word the index has seen (for spelling correction and completion of
 * partial words) mapped to its stem (what postings are kept by). Stems get dense ids that the
 * posting store indexes arrays with.
 */
import type { Language } from "./language";
import type { WordNetLink } from "./wordnet";
import { familyCandidates, snowballStem } from "./stemming";
import { editDistance, trigrams } from "./text";

/** `distance`: the closer of word-to-word and stem-to-stem edits; `surfaceDistance`: word-to-word alone. */
export type Candidate = { surfaceId: number; distance: number; surfaceDistance: number };

/** Stems remembered for words that are not surfaces; ~4 MB at most. */
const STEM_CACHE_SIZE = 50_000;

export class Vocabulary {
  private readonly surfaceIds = new Map<string, number>();
  readonly surfaceWords: string[] = [];
  readonly surfaceStem: number[] = [];
  /** Documents using each surface, plus thesaurus pins: a word with none is not offered as a correction. */
  private readonly surfaceRefs: number[] = [];
  /** How often each surface occurs in all documents (a thesaurus pin counts once). */
  private readonly surfaceCounts: number[] = [];
  /** Thesaurus pins of each surface (also counted in surfaceRefs): what pages alone use is the difference. */
  private readonly surfacePins: number[] = [];
  private readonly trigramIndex = new Map<string, number[]>();
  private sorted: string[] = [];
  private unsorted: string[] = [];

  private readonly stemIds = new Map<string, number>();
  readonly stemWords: string[] = [];
  /** Surface ids of each stem ("marker", "markers" for "marker"). */
  private readonly stemSurfaces: number[][] = [];
  /** Called with each new stem id, so the posting store can grow with it. */
  onNewStem: (stemId: number) => void = () => {};

  private readonly stemCache = new Map<string, string>();

  constructor(private readonly language: Language) {}

  /** The normalised stem of a token: Snowball, then British spelling mapped to American. */
  stemOf(word: string): string {
    const known = this.surfaceIds.get(word);
    if (known !== undefined) return this.stemWords[this.surfaceStem[known] as number] as string;
    // Words that are not surfaces (run-together pairs, query words) repeat a lot; Porter2 is regex work.
    let stem = this.stemCache.get(word);
    if (stem === undefined) {
      if (this.stemCache.size >= STEM_CACHE_SIZE) this.stemCache.clear();
      stem = this.language.normaliseStem(snowballStem(word));
      this.stemCache.set(word, stem);
    }
    return stem;
  }

  /** Id of a stem string, created when missing. */
  internStem(stem: string): number {
    let id = this.stemIds.get(stem);
    if (id === undefined) {
      id = this.stemWords.length;
      this.stemIds.set(stem, id);
      this.stemWords.push(stem);
      this.stemSurfaces.push([]);
      this.onNewStem(id);
    }
    return id;
  }

  stemIdOf(stem: string): number | undefined {
    return this.stemIds.get(stem);
  }

  /** Surface id of a token, created (with its stem) when missing. */
  internSurface(word: string): number {
    let id = this.surfaceIds.get(word);
    if (id === undefined) {
      const stemId = this.internStem(this.stemOf(word));
      id = this.surfaceWords.length;
      this.surfaceIds.set(word, id);
      this.surfaceWords.push(word);
      this.surfaceStem.push(stemId);
      (this.stemSurfaces[stemId] as number[]).push(id);
      this.surfaceRefs.push(0);
      this.surfaceCounts.push(0);
      this.surfacePins.push(0);
      this.unsorted.push(word);
      for (const g of trigrams(word)) {
        const list = this.trigramIndex.get(g);
        if (list) list.push(id);
        else this.trigramIndex.set(g, [id]);
      }
    }
    return id;
  }

  /** The surface words of a stem; none for a stem that exists only as a run-together pair. */
  surfacesOf(stemId: number): string[] {
    return (this.stemSurfaces[stemId] ?? []).map((id) => this.surfaceWords[id] as string);
  }

  surfaceIdOf(word: string): number | undefined {
    return this.surfaceIds.get(word);
  }

  /** `delta` documents (or thesaurus pins) now use the word, `occurrences` times in all (default: once each). */
  addRef(surfaceId: number, delta: number, occurrences = delta): void {
    this.surfaceRefs[surfaceId] = (this.surfaceRefs[surfaceId] as number) + delta;
    this.surfaceCounts[surfaceId] = (this.surfaceCounts[surfaceId] as number) + occurrences;
  }

  /** A thesaurus word pinned (`delta` 1) or let go (−1): it counts as a word in use, not as a page's. */
  pin(surfaceId: number, delta: 1 | -1): void {
    this.surfacePins[surfaceId] = (this.surfacePins[surfaceId] as number) + delta;
    this.addRef(surfaceId, delta);
  }

  /** A word that some page uses right now (thesaurus pins aside). */
  private onPages(surfaceId: number): boolean {
    return (this.surfaceRefs[surfaceId] as number) > (this.surfacePins[surfaceId] as number);
  }

  isLive(surfaceId: number): boolean {
    return (this.surfaceRefs[surfaceId] as number) > 0;
  }

  /** How many documents use this exact word (plus thesaurus pins). */
  surfaceUses(surfaceId: number): number {
    return this.surfaceRefs[surfaceId] ?? 0;
  }

  /** How often this exact word occurs in all documents (plus thesaurus pins). */
  surfaceOccurrences(surfaceId: number): number {
    return this.surfaceCounts[surfaceId] ?? 0;
  }

  /** A word that pages or the thesaurus use right now. */
  isKnownWord(word: string): boolean {
    const id = this.surfaceIds.get(word);
    return id !== undefined && this.isLive(id);
  }

  /**
   * The pages' spelling of a word they spell the other way, British or American ("gray" where pages
   * say "grey", "colors" → "colours"): a live page word with the same normalised stem whose own
   * Snowball stem differs (so only the spelling rule made them one stem, not an inflection), the
   * nearest in letters. Undefined when the pages use the word as typed, or no other spelling of it
   * (thesaurus words do not count: the encoder compares the query with pages, not with the thesaurus).
   */
  pageSpelling(word: string): string | undefined {
    const typed = this.surfaceIds.get(word);
    if (typed !== undefined && this.onPages(typed)) return undefined;
    const stemId = this.stemIds.get(this.stemOf(word));
    if (stemId === undefined) return undefined;
    const ownStem = snowballStem(word);
    let best: string | undefined;
    let bestDistance = Infinity;
    for (const id of this.stemSurfaces[stemId] as number[]) {
      const page = this.surfaceWords[id] as string;
      if (!this.onPages(id)) continue;
      // Pages that spell it the query's way too ("color" beside "colour") need no other spelling.
      if (snowballStem(page) === ownStem) return undefined;
      const d = editDistance(word, page, bestDistance);
      if (d < bestDistance) [best, bestDistance] = [page, d];
    }
    return best;
  }

  /** WordNet's related everyday words of a query word (language.ts). */
  relatedWords(word: string): WordNetLink[] {
    return this.language.wordNet.related(word);
  }

  /** Dictionary forms of an inflected word (WordNet's rules): "brighter" → bright. */
  baseForms(word: string): string[] {
    return this.language.wordNet.baseForms(word);
  }

  /** A word WordNet knows mostly as an adverb ("behind", "away"): where or how, not what. */
  isMostlyAdverb(word: string): boolean {
    return this.language.wordNet.isMostlyAdverb(word);
  }

  isEnglishWord(word: string): boolean {
    return this.language.isEnglishWord(word);
  }

  /** A word spelling correction leaves alone: in the word list or passed by Hunspell (language.ts). */
  passesSpellCheck(word: string): boolean {
    return this.language.passesSpellCheck(word);
  }

  /** Live surface words that start with `prefix` (at most `limit`), shortest distance in the sort first. */
  completions(prefix: string, limit = 200): number[] {
    const vocab = this.sortedSurfaces();
    let lo = 0;
    let hi = vocab.length;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if ((vocab[mid] as string) < prefix) lo = mid + 1;
      else hi = mid;
    }
    const out: number[] = [];
    for (let i = lo; i < vocab.length && i < lo + limit; i++) {
      const w = vocab[i] as string;
      if (!w.startsWith(prefix)) break;
      const id = this.surfaceIds.get(w) as number;
      if (this.isLive(id) && w !== prefix) out.push(id);
    }
    return out;
  }

  /**
   * Live words within `maxDistance` edits of `word` (optimal string alignment), comparing stems too:
   * "flaten" is one edit from "flatten" although the pages only say "flattening". Only the closest
   * distance found is returned.
   */
  corrections(word: string, maxDistance: number): Candidate[] {
    if (maxDistance <= 0) return [];
    const grams = trigrams(word);
    const counts = new Map<number, number>();
    for (const g of grams) {
      const list = this.trigramIndex.get(g);
      if (!list) continue;
      for (const id of list) counts.set(id, (counts.get(id) ?? 0) + 1);
    }
    // One edit destroys at most 3 padded trigrams (4 for a transposition), so fewer shared ones rule a word out.
    const need = Math.max(1, grams.length - 4 * maxDistance);
    const queryStem = this.stemOf(word);
    const within = (a: string, b: string): number => (Math.abs(a.length - b.length) > maxDistance ? maxDistance + 1 : editDistance(a, b, maxDistance));
    const found: Candidate[] = [];
    for (const [id, c] of counts) {
      if (c < need || !this.isLive(id)) continue;
      const surfaceDistance = within(word, this.surfaceWords[id] as string);
      const d = Math.min(surfaceDistance, within(queryStem, this.stemWords[this.surfaceStem[id] as number] as string));
      if (d <= maxDistance) found.push({ surfaceId: id, distance: d, surfaceDistance });
    }
    // A transposition in a short word can leave no trigram in common ("fcae"/"face"): try those directly.
    if (word.length <= 5) {
      for (let i = 0; i + 1 < word.length; i++) {
        const swapped = word.slice(0, i) + word[i + 1] + word[i] + word.slice(i + 2);
        const id = this.surfaceIds.get(swapped);
        if (id !== undefined && swapped !== word && this.isLive(id) && !found.some((f) => f.surfaceId === id)) found.push({ surfaceId: id, distance: 1, surfaceDistance: 1 });
      }
    }
    const best = Math.min(...found.map((f) => f.distance));
    return found.filter((f) => f.distance === best);
  }

  /** Stem ids of the word family of `stem` that the vocabulary has ("dark" ↔ "darken"). */
  family(stem: string): number[] {
    const out: number[] = [];
    for (const c of familyCandidates(stem)) {
      const id = this.stemIds.get(c);
      if (id !== undefined) out.push(id);
    }
    return out;
  }

  private sortedSurfaces(): string[] {
    if (this.unsorted.length > 64) {
      this.sorted = this.sorted.concat(this.unsorted).sort();
    } else {
      for (const w of this.unsorted) {
        let lo = 0;
        let hi = this.sorted.length;
        while (lo < hi) {
          const mid = (lo + hi) >> 1;
          if ((this.sorted[mid] as string) < w) lo = mid + 1;
          else hi = mid;
        }
        this.sorted.splice(lo, 0, w);
      }
    }
    this.unsorted = [];
    return this.sorted;
  }
}
