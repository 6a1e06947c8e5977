import { describe, expect, it } from "vitest";

import { applySearchChange, getSearchIndex, rebuildSearchIndex } from "@/lib/search";

import { QUALITY_PAGES } from "./quality/pages";

// Process-wide index (lib/search/index.ts): Plateroom's own contract, no published source.
describe("getSearchIndex / rebuildSearchIndex / applySearchChange", () => {
  const rows = (docs: typeof QUALITY_PAGES) => docs.map((d) => ({ techniqueId: d.techniqueId, published: d, working: null }));

  it("returns one index per process and swaps in a rebuilt one", async () => {
    expect(getSearchIndex()).toBe(getSearchIndex());
    const before = getSearchIndex();
    const count = await rebuildSearchIndex(() => Promise.resolve(rows(QUALITY_PAGES)), () => Promise.resolve([{ kind: "synonyms", terms: ["gate hair", "hair in the gate"] }]));
    expect(count).toBe(QUALITY_PAGES.length);
    expect(getSearchIndex()).not.toBe(before);
    expect(getSearchIndex().search("dust bustng", { audience: "published", limit: 1 }).results[0]?.slug).toBe("dust-busting-film-scans");

    // A rebuild reflects the database as loaded: a technique gone from it is gone from search.
    await rebuildSearchIndex(() => Promise.resolve(rows(QUALITY_PAGES.filter((d) => d.slug !== "dust-busting-film-scans"))));
    expect(getSearchIndex().search("dust busting", { audience: "published" }).results.map((r) => r.slug)).not.toContain("dust-busting-film-scans");
  });

  it("applies one change at a time: a technique, its removal, the thesaurus", async () => {
    const page = QUALITY_PAGES.find((p) => p.slug === "gate-hair-edge")!;
    await applySearchChange({ kind: "technique", techniqueId: page.techniqueId, views: { published: { ...page, title: "Hair in the gate, zanzibarite" }, working: null } });
    expect(getSearchIndex().search("zanzibarite", { audience: "published" }).results.map((r) => r.slug)).toEqual(["gate-hair-edge"]);
    await applySearchChange({ kind: "technique", techniqueId: page.techniqueId, views: null });
    expect(getSearchIndex().search("zanzibarite", { audience: "published" }).total).toBe(0);

    const version = getSearchIndex().version();
    await applySearchChange({ kind: "thesaurus", entries: [{ kind: "synonyms", terms: ["dirt", "dirtbox"] }] });
    expect(getSearchIndex().version()).toBeGreaterThan(version);
    expect(getSearchIndex().search("dirtbox", { audience: "published" }).results.length).toBeGreaterThan(0);
  });
});
