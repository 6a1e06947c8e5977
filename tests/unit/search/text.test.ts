import { describe, expect, it } from "vitest";

import { editDistance, FILLER_WEIGHT, GENERIC_WEIGHT, isAddressee, isStopWord, queryWordWeight, tokenize, trigrams } from "@/lib/search/text";

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

describe("tokenize", () => {
  it("gives lower-cased words with offsets into the original text", () => {
    const text = "Dust on the SLM_040_0120 plate";
    const toks = tokenize(text);
    expect(toks.map((t) => t.word)).toEqual(["dust", "on", "the", "slm", "040", "0120", "plate"]);
    for (const t of toks) expect(text.slice(t.start, t.end).toLowerCase()).toBe(t.word);
  });

  it("keeps hyphenated and numeric trade tokens whole, with their parts (c-stand, 16-bit, 3x3, 2K)", () => {
    const toks = tokenize("Move the c-stand; 16-bit 3x3 matrix at 2K, dust-busting");
    expect(toks.map((t) => t.word)).toEqual(["move", "the", "cstand", "16bit", "3x3", "matrix", "at", "2k", "dustbusting"]);
    const cstand = toks[2];
    expect(cstand?.parts?.map((p) => p.word)).toEqual(["stand"]);
    expect(toks[3]?.parts?.map((p) => p.word)).toEqual(["16", "bit"]);
    expect(toks[8]?.parts?.map((p) => p.word)).toEqual(["dust", "busting"]);
    expect("Move the c-stand".slice(cstand?.start, cstand?.end)).toBe("c-stand");
  });

  it("drops single letters but keeps single digits", () => {
    expect(tokenize("a 3 x b plate").map((t) => t.word)).toEqual(["3", "plate"]);
  });

  it("folds apostrophes and accents without moving offsets, and leaves a possessive 's out of the word", () => {
    const toks = tokenize("the actor’s moiré doesn't");
    expect(toks.map((t) => t.word)).toEqual(["the", "actor", "moire", "doesnt"]);
    expect(toks[1]).toMatchObject({ start: 4, end: 11 });
    expect(toks[2]).toMatchObject({ start: 12, end: 17 });
    // "actress's" would otherwise be the non-word "actresss"; "'s" inside a longer run stays folded.
    expect(tokenize("the actress's face, it's").map((t) => t.word)).toEqual(["the", "actress", "face", "it"]);
    expect(tokenize("o'shea's").map((t) => t.word)).toEqual(["oshea"]);
  });

  it("splits camelCase parameter names only when asked", () => {
    expect(tokenize("blackPoint matteSoftness", true).map((t) => t.word)).toEqual(["black", "point", "matte", "softness"]);
    expect(tokenize("blackPoint").map((t) => t.word)).toEqual(["blackpoint"]);
  });
});

describe("the one stop-word list and query word weights", () => {
  it("drops function words and contractions, never trade words", () => {
    for (const w of ["the", "of", "how", "i", "doesnt", "whats", "her", "own", "because"]) expect(isStopWord(w), w).toBe(true);
    for (const w of ["plate", "screen", "remove", "grain", "out", "back", "take"]) expect(isStopWord(w), w).toBe(false);
  });

  it("weighs filler words little, generic action words half, problem words fully", () => {
    for (const w of ["need", "get", "rid", "take", "how", "best", "out"]) if (!isStopWord(w)) expect(queryWordWeight(w), w).toBe(FILLER_WEIGHT);
    expect(queryWordWeight("remove")).toBe(GENERIC_WEIGHT);
    // In any inflection: "the image goes darker" is not about going; "backing" stays a trade word.
    for (const w of ["goes", "went", "used", "tells", "knew", "helped", "puts"]) expect(queryWordWeight(w), w).toBe(FILLER_WEIGHT);
    for (const w of ["removes", "fixes", "cleaned", "repaired"]) expect(queryWordWeight(w), w).toBe(GENERIC_WEIGHT);
    expect(queryWordWeight("backing")).toBe(1);
    // Prepositions WordNet has no adverb sense for say where, not what ("wires against the sky").
    for (const w of ["against", "during", "towards", "onto"]) expect(queryWordWeight(w), w).toBe(GENERIC_WEIGHT);
    for (const w of ["marker", "wire", "flicker", "shiny"]) expect(queryWordWeight(w), w).toBe(1);
    expect(FILLER_WEIGHT).toBeLessThan(GENERIC_WEIGHT);
  });

  it("leaves out whom a question is put to ('can someone tell me'), not a person in the plate", () => {
    const addressees = (text: string) => {
      const tokens = tokenize(text);
      return tokens.filter((_, i) => isAddressee(tokens, i)).map((t) => t.word);
    };
    expect(addressees("can someone tell me how to paint out a wire")).toEqual(["someone"]);
    expect(addressees("does anybody know a fix for flicker")).toEqual(["anybody"]);
    expect(addressees("someone walks through the back of the frame")).toEqual([]);
    expect(addressees("i can see someone in the window")).toEqual([]);
  });
});

describe("trigrams", () => {
  it("pads the word with one space each side", () => {
    expect(trigrams("dust")).toEqual([" du", "dus", "ust", "st "]);
  });
});
