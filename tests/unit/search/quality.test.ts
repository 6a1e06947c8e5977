import { describe, expect, it } from "vitest";

import { createSearchIndex } from "@/lib/search/engine";

import { FIXTURE_DOCS, QUALITY_QUERIES } from "./fixtures";

// Issue 6 "Quality": each junior query must put its intended technique in the top 3 among look-alikes.
// The query → technique pairs and the reasons (in fixtures.ts) are trade judgement: common practice,
// no published source.
describe("search quality: junior queries among look-alike techniques", () => {
  const index = createSearchIndex();
  index.load(FIXTURE_DOCS.map((d) => ({ techniqueId: d.techniqueId, published: d, working: null })));

  it("has a meaningful set (≥ 25 queries, every expected slug exists)", () => {
    expect(QUALITY_QUERIES.length).toBeGreaterThanOrEqual(25);
    const slugs = new Set(FIXTURE_DOCS.map((d) => d.slug));
    for (const q of QUALITY_QUERIES) expect(slugs.has(q.expected), q.expected).toBe(true);
  });

  it.each(QUALITY_QUERIES)("'$query' finds $expected in the top 3 ($reason)", ({ query, expected }) => {
    for (const audience of ["published", "working"] as const) {
      const top = index.search(query, { audience, limit: 3 }).results.map((r) => r.slug);
      expect(top, `${audience}: ${top.join(", ")}`).toContain(expected);
    }
  });

  it("quick finder titles: misspelt partial input still finds the technique", () => {
    // Typed mid-word, as in the quick finder: "dust bus" → dust busting.
    expect(index.suggestTitles("dust bus", "published", 3).map((s) => s.slug)).toContain("dust-busting-film");
    expect(index.suggestTitles("wire remov", "published", 3).map((s) => s.slug)).toContain("wire-removal-sky");
    expect(index.suggestTitles("trakcing mark", "published", 3).map((s) => s.slug)).toContain("markers-green-screen-matrix");
  });

  it("reports the corrected query in the user's own word order and spacing", () => {
    const res = index.search("wire remvoal  sky", { audience: "published" });
    expect(res.corrected).toBe("wire removal  sky");
    expect(index.search("wire removal sky", { audience: "published" }).corrected).toBeUndefined();
  });
});
