import fc from "fast-check";
import { describe, expect, it } from "vitest";

import { NEGATION_WEIGHTS, negatedWords, negationFactor, readDenials } from "@/lib/search/negation";

// How far a negation reaches is Plateroom's own rule (issue 16), written from plain English usage:
// a negator covers the words after it up to the end of its clause. Not from a published source.
const words = (text: string) => negatedWords(text).map((n) => n.word);
/** Each denial as written, for people to read. */
const denialPhrases = (text: string) => readDenials(text).map((d) => d.phrase);

describe("negatedWords", () => {
  it("covers what follows 'no', 'without', 'none', with or without the apostrophe in contractions", () => {
    expect(words("there is no tracking data on this one")).toEqual(["tracking", "data"]);
    expect(words("they didn't shoot a clean plate")).toEqual(["clean", "plate"]);
    expect(words("they didnt shoot a clean plate")).toEqual(["clean", "plate"]);
  });

  it("after 'not' and 'didn't', denies the object of a verb of having, or what a determiner introduces", () => {
    expect(words("we didn't get a clean plate")).toEqual(["clean", "plate"]);
    expect(words("we don't have any reference frames")).toEqual(["reference", "frames"]);
    expect(words("there isn't any tracking data")).toEqual(["tracking", "data"]);
    expect(words("not a clean plate in sight")).toEqual(["clean", "plate"]);
  });

  it("denies a verb of motion itself: whether the camera moves splits methods", () => {
    expect(words("the camera doesnt move")).toEqual(["move"]);
    expect(words("the camera does not move at all")).toEqual(["move"]);
  });

  it("denies nothing for what is wrong rather than missing, or for what the asker cannot do", () => {
    expect(words("the grain doesn't match the plate")).toEqual([]);
    expect(words("the edge isn't sharp")).toEqual([]);
    expect(words("didn't remove the wire")).toEqual([]);
    expect(words("can't get rid of the shimmer")).toEqual([]);
    expect(words("can't remove the wire")).toEqual([]);
    expect(words("we are not able to track it")).toEqual([]);
  });

  it("stops at a clause mark, a conjunction, a question word, an infinitive or a preposition", () => {
    expect(words("no clean plate, the rig is in every frame")).toEqual(["clean", "plate"]);
    expect(words("no markers but the screen has creases")).toEqual(["markers"]);
    expect(words("no clean plate of the empty street")).toEqual(["clean", "plate"]);
    // The prepositions WordNet has no adverb sense for end it too (text.ts's place words).
    expect(words("no markers against the sky")).toEqual(["markers"]);
    expect(words("no wires beside the actor")).toEqual(["wires"]);
    // "way" is a filler word, then the infinitive ends the reach.
    expect(words("no way to know which frame is clean")).toEqual([]);
  });

  it("covers at most three content words and skips filler words", () => {
    expect(words("didn't get any big heavy metal crane arm")).toEqual(["big", "heavy", "metal"]);
  });

  it("treats a hedge as being about the asker, not the plate", () => {
    expect(words("not sure the grain matches")).toEqual([]);
    expect(words("i don't know the right wire fix")).toEqual([]);
    expect(words("no idea, white specks everywhere")).toEqual([]);
    expect(words("not sure how to remove wires")).toEqual([]);
  });

  it("marks what 'without' covers as a circumstance", () => {
    expect(negatedWords("a clean pass without the rig")).toEqual([{ word: "rig", isCircumstance: true }]);
    expect(negatedWords("no rig")).toEqual([{ word: "rig", isCircumstance: false }]);
  });

  it("finds nothing in text that denies nothing", () => {
    expect(negatedWords("remove the tracking markers from the green screen")).toEqual([]);
    expect(negatedWords("")).toEqual([]);
  });
});

describe("readDenials", () => {
  it("gives each denial as typed, from its negator to its last word", () => {
    expect(denialPhrases("they didn't shoot a clean plate, the rig is in every frame")).toEqual(["didn't shoot a clean plate"]);
    expect(denialPhrases("No markers and the camera doesnt move")).toEqual(["No markers", "doesnt move"]);
    expect(denialPhrases("the camera does not move")).toEqual(["does not move"]);
    expect(denialPhrases("not sure how to remove wires")).toEqual([]);
  });
});

describe("negationFactor", () => {
  const denies = (...stems: [string, boolean][]) => new Map(stems);
  const set = (...s: string[]) => new Set(s);
  const title = (...words: string[]) => (stem: string) => words.includes(stem);

  it("lifts a page that denies what the query denies", () => {
    expect(negationFactor(denies(["plate", false]), set("plate"), title("rebuild", "background"))).toBe(NEGATION_WEIGHTS.sharedDenial);
    expect(NEGATION_WEIGHTS.sharedDenial).toBeGreaterThan(1);
  });

  it("lowers a page whose title names plainly what the query denies", () => {
    expect(negationFactor(denies(["plate", false]), set(), title("rig", "clean", "plate"))).toBe(NEGATION_WEIGHTS.namedInTitle);
    expect(NEGATION_WEIGHTS.namedInTitle).toBeLessThan(1);
  });

  it("lowers no page for a circumstance ('without'), and leaves unrelated pages alone", () => {
    expect(negationFactor(denies(["rig", true]), set(), title("rig", "removal"))).toBe(1);
    expect(negationFactor(denies(["plate", false]), set(), title("grain", "match"))).toBe(1);
    expect(negationFactor(new Map(), set("plate"), title("plate"))).toBe(1);
  });
});

describe("negation on any text", () => {
  // Words a query might hold, negators among them, with punctuation, so scopes start and end anywhere.
  const word = fc.constantFrom("no", "not", "didn't", "doesnt", "without", "isn't", "can't", "a", "the", "clean", "plate", "shoot", "move", "marker", "of", "and", ",", ".", "grain", "get", "any", "é", "'s", "c-stand", "16-bit");
  it("never throws, gives each denial as a piece of the text that starts at a negator or its auxiliary, and covers at most three words a denial", () => {
    fc.assert(
      fc.property(fc.array(word, { maxLength: 14 }), fc.constantFrom(" ", "  ", " - "), (words, gap) => {
        const text = words.join(gap);
        const phrases = denialPhrases(text);
        for (const p of phrases) {
          expect(text.includes(p)).toBe(true);
          expect(p.toLowerCase()).toMatch(/^(no|not|didn't|doesnt|without|isn't|do|does|did|is|are|was|were|has|have|had)\b/);
        }
        expect(negatedWords(text).length).toBeLessThanOrEqual(phrases.length * 3);
      }),
      { numRuns: 500 },
    );
  });
});
