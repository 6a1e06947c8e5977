import { describe, expect, it } from "vitest";

import { createLanguage, deriveVariantPairs, loadLanguage } from "@/lib/search/language";
import { snowballStem } from "@/lib/search/stemming";

describe("loadLanguage (word-list, dictionary-en, dictionary-en-gb)", async () => {
  const language = await loadLanguage();

  it("knows real words, including the ones the issue saw 'corrected' (bent, talk, going, tips, gait)", () => {
    for (const w of ["bent", "talk", "going", "tips", "gait", "sideways", "colour", "color", "grey", "gray", "matte"]) expect(language.isEnglishWord(w), w).toBe(true);
    for (const w of ["roling", "trakcing", "markrs", "sensr"]) expect(language.isEnglishWord(w), w).toBe(false);
  });

  it("passes for spelling what Hunspell's dictionaries pass by their affix rules, which the word list lacks (dept)", () => {
    expect(language.isEnglishWord("dept")).toBe(false);
    expect(language.passesSpellCheck("dept")).toBe(true);
    for (const w of ["bent", "colour", "gray"]) expect(language.passesSpellCheck(w), w).toBe(true);
    // …and still not a slip of a real word, nor a trade abbreviation neither source has (leads' thesaurus words are known to search).
    for (const w of ["depts", "kpet", "markrs", "rgb"]) expect(language.passesSpellCheck(w), w).toBe(false);
  });

  it("maps British spellings to American stems (colour/color, grey/gray, centre/center, stabilise/stabilize)", () => {
    const same = (gb: string, us: string) => expect(language.normaliseStem(snowballStem(gb)), `${gb}/${us}`).toBe(language.normaliseStem(snowballStem(us)));
    same("colour", "color");
    same("coloured", "colored");
    same("grey", "gray");
    same("centre", "center");
    same("stabilise", "stabilize");
    same("harbour", "harbor");
    same("analyse", "analyze");
    expect(language.variantPairs.length).toBeGreaterThan(300);
  });

  it("does not pair words that are simply different (tour/tor, wise/wize)", () => {
    expect(language.normaliseStem(snowballStem("tour"))).toBe(snowballStem("tour"));
    expect(language.normaliseStem(snowballStem("wise"))).toBe(snowballStem("wise"));
  });
});

describe("deriveVariantPairs", () => {
  it("pairs a British-only word with an American-only one by a spelling rule", () => {
    const americanOnly = new Set(["color", "gray", "center", "realize", "analyze"]);
    expect(deriveVariantPairs(americanOnly, ["colour", "grey", "centre", "realise", "analyse", "tyre"])).toEqual([
      ["analyse", "analyze"],
      ["centre", "center"],
      ["colour", "color"],
      ["grey", "gray"],
      ["realise", "realize"],
    ]);
  });

  it("needs the American form to be American-only: no pair when it is missing", () => {
    expect(deriveVariantPairs(new Set(["tor"]), ["tour"])).toEqual([["tour", "tor"]]);
    expect(deriveVariantPairs(new Set(), ["tour"])).toEqual([]);
  });

  it("builds a small language for tests", () => {
    const l = createLanguage(["plate", "Grain"], [["colour", "color"]]);
    expect(l.isEnglishWord("grain")).toBe(true);
    expect(l.isEnglishWord("grian")).toBe(false);
    expect(l.normaliseStem("colour")).toBe("color");
  });
});
