import fc from "fast-check";
import { describe, expect, test } from "vitest";

import { diffRevisions, recipeText, wordDiff, type DiffSegment, type RevisionSnapshot } from "@/lib/techniques/diff";

const side = (segments: DiffSegment[], kind: "added" | "removed") =>
  segments.filter((s) => s.kind === "same" || s.kind === kind).map((s) => s.text).join("");

const words = (segments: DiffSegment[], kind: DiffSegment["kind"]) =>
  segments.filter((s) => s.kind === kind).flatMap((s) => s.text.split(/\s+/).filter(Boolean));

describe("wordDiff", () => {
  test("a changed word", () => {
    expect(wordDiff("erode the matte by 2 pixels", "erode the matte by 3 pixels")).toEqual([
      { kind: "same", text: "erode the matte by " },
      { kind: "removed", text: "2" },
      { kind: "added", text: "3" },
      { kind: "same", text: " pixels" },
    ]);
  });

  test("Myers' worked example as words: ABCABBA → CBABAC needs D = 5 edits", () => {
    // E. W. Myers, "An O(ND) Difference Algorithm and Its Variations", Algorithmica 1 (1986),
    // the example of Fig. 1: the shortest edit script has D = 5 (LCS length 4). From memory.
    const segments = wordDiff("A B C A B B A", "C B A B A C");
    expect(words(segments, "removed").length + words(segments, "added").length).toBe(5);
    expect(words(segments, "same").length).toBe(4);
  });

  test("identical and empty texts", () => {
    expect(wordDiff("same text", "same text")).toEqual([{ kind: "same", text: "same text" }]);
    expect(wordDiff("", "")).toEqual([]);
    expect(wordDiff("", "new")).toEqual([{ kind: "added", text: "new" }]);
  });

  test("property: each side is rebuilt exactly; neighbouring segments differ in kind", () => {
    const text = fc.array(fc.constantFrom("grain", "matte", "erode", "2", "3", " ", "\n", "\n\n", ".", ","), { maxLength: 30 }).map((a) => a.join(""));
    fc.assert(
      fc.property(text, text, (a, b) => {
        const segments = wordDiff(a, b);
        expect(side(segments, "removed")).toBe(a);
        expect(side(segments, "added")).toBe(b);
        segments.forEach((s, i) => {
          expect(s.text).not.toBe("");
          if (i > 0) expect(segments[i - 1]?.kind).not.toBe(s.kind);
        });
      }),
      { numRuns: 300 },
    );
  });
});

describe("diffRevisions", () => {
  const base: RevisionSnapshot = {
    title: "Marker removal with a colour matrix",
    summary: "Hide markers in the cleanest channel.",
    aliases: ["tracking marker cleanup"],
    tags: ["tracking markers", "green screen"],
    bodyText: "Sample the marker.\n\nSolve the row.",
    recipe: [{ op: "matrix", rows: [[1, 0, 0], [0, 1, 0], [0, 0, 1]] }],
  };

  test("only changed fields, in a fixed order, with word segments", () => {
    const recipe = [{ rows: [[1, 0, 0], [0, 1, 0], [0, 0, 1]], op: "matrix", offset: [0, 0.1, 0] }];
    const changed = diffRevisions(base, {
      ...base,
      summary: "Hide markers in the cleanest channel first.",
      tags: ["green screen", "tracking markers", "wire or rig"],
      recipe,
    });
    expect(changed.map((c) => c.field)).toEqual(["summary", "tags", "recipe"]);
    expect(changed[0]?.segments).toEqual([
      { kind: "same", text: "Hide markers in the cleanest channel" },
      { kind: "added", text: " first" },
      { kind: "same", text: "." },
    ]);
    expect(changed[1]?.segments.filter((s) => s.kind !== "same").map((s) => s.text.trim())).toEqual(["wire or rig"]);
    expect(side(changed[2]!.segments, "added")).toBe(recipeText(recipe));
    expect(side(changed[2]!.segments, "removed")).toBe(recipeText(base.recipe));
    expect(changed[2]?.segments.filter((s) => s.kind === "removed")).toEqual([]);
  });

  test("tag order and recipe key order are not changes", () => {
    expect(
      diffRevisions(base, { ...base, tags: [...base.tags].reverse(), recipe: [{ rows: [[1, 0, 0], [0, 1, 0], [0, 0, 1]], op: "matrix" }] }),
    ).toEqual([]);
  });

  test("a recipe added where there was none", () => {
    const changed = diffRevisions({ ...base, recipe: null }, base);
    expect(changed.map((c) => c.field)).toEqual(["recipe"]);
    expect(changed[0]?.segments.every((s) => s.kind === "added")).toBe(true);
  });
});
