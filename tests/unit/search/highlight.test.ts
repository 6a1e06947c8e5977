import fc from "fast-check";
import { describe, expect, it } from "vitest";

import { highlight } from "@/lib/search/highlight";

describe("highlight", () => {
  it("splits text at half-open ranges", () => {
    expect(highlight("dust busting film", [[5, 12]])).toEqual([
      { text: "dust ", isMatch: false },
      { text: "busting", isMatch: true },
      { text: " film", isMatch: false },
    ]);
  });

  it("merges overlapping and touching ranges, sorts and clamps them", () => {
    expect(highlight("abcdef", [[4, 99], [0, 2], [1, 3], [3, 3]])).toEqual([
      { text: "abc", isMatch: true },
      { text: "d", isMatch: false },
      { text: "ef", isMatch: true },
    ]);
  });

  it("returns the text unmarked without ranges", () => {
    expect(highlight("plate", [])).toEqual([{ text: "plate", isMatch: false }]);
  });

  it("always joins back to the input (property)", () => {
    fc.assert(
      fc.property(fc.string(), fc.array(fc.tuple(fc.integer({ min: -5, max: 40 }), fc.integer({ min: -5, max: 40 }))), (text, ranges) => {
        const segs = highlight(text, ranges);
        expect(segs.map((s) => s.text).join("")).toBe(text);
        for (let i = 1; i < segs.length; i++) {
          // Adjacent marked segments would mean an unmerged overlap.
          expect(segs[i - 1]?.isMatch && segs[i]?.isMatch).toBeFalsy();
        }
      }),
    );
  });
});
