import { execFileSync } from "node:child_process";
import { describe, expect, it } from "vitest";

import { familyCandidates, snowballStem } from "@/lib/search/stemming";
import { tokenize } from "@/lib/search/text";
import { QUALITY_PAGES } from "@/tests/unit/search/quality/pages";
import { QUALITY_QUERIES } from "@/tests/unit/search/quality/queries";

/**
 * Outside reference: the Snowball project's English stemmer as Debian ships it for Python
 * (python3-snowballstemmer, installed by .ci/run), run over every word of the quality pages and
 * queries. Our stems must be exactly its stems, apart from tokens with digits, which we keep whole.
 */
function pythonSnowball(words: string[]): string[] {
  const script = "import sys, json, snowballstemmer\ns = snowballstemmer.stemmer('english')\nprint(json.dumps(s.stemWords(json.load(sys.stdin))))";
  return JSON.parse(execFileSync("/usr/bin/python3", ["-c", script], { input: JSON.stringify(words), encoding: "utf8" })) as string[];
}

describe("snowballStem", () => {
  const texts = [...QUALITY_PAGES.flatMap((p) => [p.title, p.summary, p.bodyText, ...p.aliases]), ...QUALITY_QUERIES.map((q) => q.query)];
  const words = [...new Set(texts.flatMap((t) => tokenize(t).map((x) => x.word)))].filter((w) => !/[0-9]/.test(w)).sort();

  it(`gives the Snowball English stem for each of the ${words.length} words of the quality set (python3-snowballstemmer)`, () => {
    expect(words.length).toBeGreaterThan(1000);
    const expected = pythonSnowball(words);
    const differ = words.filter((w, i) => snowballStem(w) !== expected[i]).map((w) => `${w}: ${snowballStem(w)} ≠ ${expected[words.indexOf(w)]}`);
    expect(differ).toEqual([]);
  });

  it("keeps tokens with digits whole (3x3, 2k, 16bit, shot codes)", () => {
    for (const w of ["3x3", "2k", "16bit", "0120", "4ks"]) expect(snowballStem(w)).toBe(w);
  });
});

describe("familyCandidates", () => {
  // The examples and the trade's "de-"/"un-" words (common practice, no published source).
  it.each([
    ["dark", "darken"],
    ["blur", "blurri"],
    ["flicker", "deflick"],
    ["spill", "despil"],
    ["distort", "undistort"],
    ["vignett", "vignet"],
    ["face", "facial"],
  ])("relates %s and %s both ways", (a, b) => {
    const [sa, sb] = [a, b];
    expect(familyCandidates(sa)).toContain(sb);
    expect(familyCandidates(sb)).toContain(sa);
  });

  it("does not relate a tracker (marker) to tracks, or reach numbers", () => {
    expect(familyCandidates(snowballStem("trackers"))).not.toContain(snowballStem("tracks"));
    expect(familyCandidates("16bit")).toEqual([]);
  });
});
