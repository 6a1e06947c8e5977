import { describe, expect, it } from "vitest";

import { bm25Idf } from "@/lib/search/engine";
import { editDistance, stem, tokenize } from "@/lib/search/text";

describe("editDistance (optimal string alignment)", () => {
  it("matches the classic Levenshtein example", () => {
    // Wikipedia, "Levenshtein distance": kitten → sitting is 3 edits.
    expect(editDistance("kitten", "sitting")).toBe(3);
  });

  it("counts an adjacent transposition as one edit", () => {
    // Wikipedia, "Damerau–Levenshtein distance": CA → AC is one transposition.
    expect(editDistance("ca", "ac")).toBe(1);
    expect(editDistance("trakcing", "tracking")).toBe(1);
  });

  it("is the restricted variant: CA → ABC is 3, not 2", () => {
    // Wikipedia, "Damerau–Levenshtein distance", optimal string alignment section: OSA(CA, ABC) = 3
    // while the unrestricted Damerau–Levenshtein distance is 2.
    expect(editDistance("ca", "abc")).toBe(3);
  });

  it("stops early past the bound", () => {
    expect(editDistance("kitten", "sitting", 1)).toBe(2);
    expect(editDistance("a", "abcdef", 2)).toBe(3);
  });
});

describe("bm25Idf", () => {
  it("follows the non-negative BM25 IDF, log(1 + (N − n + 0.5) / (n + 0.5))", () => {
    // Formula from Lucene's BM25Similarity documentation; ln(1 + 9.5 / 1.5) = ln(7.3333…) = 1.99243 (from memory).
    expect(bm25Idf(10, 1)).toBeCloseTo(1.99243, 4);
    expect(bm25Idf(10, 10)).toBeGreaterThan(0);
    expect(bm25Idf(1000, 5)).toBeGreaterThan(bm25Idf(1000, 500));
  });
});

describe("tokenize", () => {
  it("gives lower-cased words with offsets into the original text", () => {
    const text = "Dust-busting the SLM_040_0120 plate";
    const toks = tokenize(text);
    expect(toks.map((t) => t.word)).toEqual(["dust", "busting", "the", "slm", "040", "0120", "plate"]);
    for (const t of toks) expect(text.slice(t.start, t.end).toLowerCase()).toBe(t.word);
  });

  it("folds accents without moving offsets", () => {
    const toks = tokenize("Café façade");
    expect(toks.map((t) => t.word)).toEqual(["cafe", "facade"]);
    expect(toks[1]).toMatchObject({ start: 5, end: 11 });
  });

  it("splits camelCase parameter names only when asked", () => {
    expect(tokenize("blackPoint matteSoftness", true).map((t) => t.word)).toEqual(["black", "point", "matte", "softness"]);
    expect(tokenize("blackPoint").map((t) => t.word)).toEqual(["blackpoint"]);
  });
});

describe("stem", () => {
  // Conflations a junior relies on (common practice, no published source).
  it.each([
    ["markers", "marker"],
    ["tracking", "track"],
    ["tracks", "track"],
    ["pixels", "pixel"],
    ["mattes", "matting"],
    ["denoising", "denoise"],
    ["scratches", "scratch"],
  ])("%s and %s meet", (a, b) => {
    expect(stem(a)).toBe(stem(b));
  });

  it("keeps distinct trade words apart", () => {
    expect(stem("grain")).not.toBe(stem("green"));
    expect(stem("wire")).not.toBe(stem("wipe"));
    // "trackers" are tracking markers, "tracks" are footprints or tyre tracks.
    expect(stem("trackers")).not.toBe(stem("tracks"));
    expect(stem("040")).toBe("040");
  });
});
