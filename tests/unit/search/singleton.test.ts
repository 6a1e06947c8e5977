import { describe, expect, it } from "vitest";

import { getSearchIndex, rebuildSearchIndex } from "@/lib/search";

import { FIXTURE_DOCS } from "./fixtures";

// Process-wide index (lib/search/index.ts): Plateroom's own contract, no published source.
describe("getSearchIndex / rebuildSearchIndex", () => {
  it("returns one index per process and swaps in a rebuilt one", async () => {
    expect(getSearchIndex()).toBe(getSearchIndex());
    const before = getSearchIndex();
    const count = await rebuildSearchIndex(() =>
      Promise.resolve(FIXTURE_DOCS.map((d) => ({ techniqueId: d.techniqueId, published: d, working: null }))),
    );
    expect(count).toBe(FIXTURE_DOCS.length);
    expect(getSearchIndex()).not.toBe(before);
    expect(getSearchIndex().search("dust bustng", { audience: "published", limit: 1 }).results[0]?.slug).toBe("dust-busting-film");

    // A rebuild reflects the database as loaded: a technique gone from it is gone from search.
    await rebuildSearchIndex(() => Promise.resolve(FIXTURE_DOCS.filter((d) => d.slug !== "dust-busting-film").map((d) => ({ techniqueId: d.techniqueId, published: d, working: null }))));
    expect(getSearchIndex().search("dust busting", { audience: "published" }).results.map((r) => r.slug)).not.toContain("dust-busting-film");
  });
});
