/**
 * A sorted list of words kept as one string with offsets, searched by halving: ~4 MB for the English
 * word list instead of ~30 MB for a Set of strings. Used for the word list (language.ts) and WordNet's
 * lemmas (wordnet.ts). `sorted` must be sorted by JavaScript's default order and hold no repeats.
 */
export class WordTable {
  private readonly text: string;
  private readonly offsets: Uint32Array;
  constructor(sorted: readonly string[]) {
    this.text = sorted.join("\n");
    this.offsets = new Uint32Array(sorted.length + 1);
    let at = 0;
    sorted.forEach((w, i) => {
      this.offsets[i] = at;
      at += w.length + 1;
    });
    this.offsets[sorted.length] = at;
  }
  get length(): number {
    return this.offsets.length - 1;
  }
  word(i: number): string {
    return this.text.slice(this.offsets[i], (this.offsets[i + 1] as number) - 1);
  }
  indexOf(word: string): number {
    let lo = 0;
    let hi = this.length - 1;
    while (lo <= hi) {
      const mid = (lo + hi) >> 1;
      const w = this.word(mid);
      if (w === word) return mid;
      if (w < word) lo = mid + 1;
      else hi = mid - 1;
    }
    return -1;
  }
  has(word: string): boolean {
    return this.indexOf(word) >= 0;
  }
}
