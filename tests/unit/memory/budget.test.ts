import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { MEMORY_BUDGET, MEMORY_BUDGET_TOTAL } from "@/lib/memory/budget";

/** Every .ts file under lib/, as [path, source]. */
function libSources(dir = "lib"): [string, string][] {
  return fs.readdirSync(dir, { withFileTypes: true }).flatMap((entry): [string, string][] => {
    const file = path.join(dir, entry.name);
    if (entry.isDirectory()) return libSources(file);
    return entry.name.endsWith(".ts") ? [[file, fs.readFileSync(file, "utf8")]] : [];
  });
}

describe("one memory budget for every byte-capped cache", () => {
  it("the total is the sum of the entries", () => {
    const sum = Object.values(MEMORY_BUDGET).reduce((a, b) => a + b, 0);
    expect(MEMORY_BUDGET_TOTAL).toBe(sum);
    expect(Object.values(MEMORY_BUDGET).every((bytes) => Number.isInteger(bytes) && bytes > 0)).toBe(true);
  });

  it("each cache capped in bytes takes its cap from the budget, and each entry is used by some module", () => {
    const sources = libSources().filter(([file]) => file !== path.join("lib", "memory", "budget.ts"));
    const capped = sources.filter(([, source]) => /\bmaxSize\s*:/.test(source));
    expect(capped.length).toBeGreaterThan(0);
    for (const [file, source] of capped) {
      for (const line of source.split("\n").filter((l) => /\bmaxSize\s*:/.test(l))) expect(line, file).toMatch(/MEMORY_BUDGET\.\w+/);
    }
    const used = new Set(sources.flatMap(([, source]) => [...source.matchAll(/MEMORY_BUDGET\.(\w+)/g)].map((m) => m[1])));
    // The lab's entries are read by lib/lab once issue #15 moves its hand-written caps there.
    const unused = Object.keys(MEMORY_BUDGET).filter((name) => !used.has(name) && !name.startsWith("lab"));
    expect(unused).toEqual([]);
  });
});
