import { describe, expect, it } from "vitest";
import { WordTable } from "@/lib/search/word-table";

// Our own structure (lib/search/word-table.ts): a sorted word list searched by halving.
describe("WordTable", () => {
  const table = new WordTable(["blur", "dust", "grain", "matte", "wire"]);

  it("finds every word it holds, at its place in the order", () => {
    expect(["blur", "dust", "grain", "matte", "wire"].map((w) => table.indexOf(w))).toEqual([0, 1, 2, 3, 4]);
    expect(table.word(2)).toBe("grain");
    expect(table.length).toBe(5);
  });

  it("answers no for words between, before and after its own, and for an empty table", () => {
    for (const w of ["a", "blurs", "flicker", "zebra", ""]) expect(table.has(w)).toBe(false);
    expect(new WordTable([]).has("dust")).toBe(false);
  });
});
