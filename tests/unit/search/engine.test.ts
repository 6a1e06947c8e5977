import { describe, expect, it } from "vitest";

import { createSearchIndex as createEngine } from "@/lib/search/engine";
import { loadLanguage } from "@/lib/search/language";
import { NEGATION_WEIGHTS } from "@/lib/search/negation";
import type { ThesaurusEntry } from "@/lib/search/thesaurus";
import type { SearchDocument, SearchOptions } from "@/lib/search/types";
import { STARTER_THESAURUS } from "@/scripts/seed/data/thesaurus";

import { searchDoc } from "@/tests/unit/search/search-doc";

import { TAGS } from "./quality/pages";

const language = await loadLanguage();
const createSearchIndex = (thesaurus: ThesaurusEntry[] = []) => createEngine({ language, thesaurus });

// Ranking and visibility rules are Plateroom's own (issue 6, PRODUCT.md "Search"), not a published source.
let n = 0;
function doc(p: Partial<SearchDocument> & { slug: string; title: string }): SearchDocument {
  n++;
  return searchDoc({ techniqueId: `t-${p.slug}`, updatedAt: `2026-03-${String(10 + (n % 18)).padStart(2, "0")}T09:00:00.000Z`, ...p });
}
const pub = (d: SearchDocument) => ({ published: d, working: null });
const slugs = (idx: ReturnType<typeof createSearchIndex>, q: string, o: Partial<SearchOptions> = {}) =>
  idx.search(q, { audience: "published", ...o }).results.map((r) => r.slug);

describe("status and house-method ordering", () => {
  it("ranks an approved technique before an equally relevant draft or review (working audience)", () => {
    const idx = createSearchIndex();
    const body = "Clean the grain after keying the plate.";
    idx.upsert("a", { published: null, working: doc({ slug: "draft-one", title: "Grain cleanup", bodyText: body, status: "draft" }) });
    idx.upsert("b", { published: null, working: doc({ slug: "review-one", title: "Grain cleanup", bodyText: body, status: "in_review" }) });
    idx.upsert("c", pub(doc({ slug: "approved-one", title: "Grain cleanup", bodyText: body })));
    expect(idx.search("grain cleanup", { audience: "working" }).results.map((r) => r.slug)[0]).toBe("approved-one");
  });

  it("treats a technique with a pending edit as approved when ranking its working view", () => {
    const idx = createSearchIndex();
    const approved = doc({ slug: "edited", title: "Grain cleanup", summary: "first text" });
    idx.upsert("a", { published: approved, working: { ...approved, summary: "edited text", status: "in_review" } });
    idx.upsert("b", { published: null, working: doc({ slug: "new-draft", title: "Grain cleanup", status: "draft" }) });
    expect(idx.search("grain cleanup", { audience: "working" }).results.map((r) => r.slug)).toEqual(["edited", "new-draft"]);
  });

  it("puts the department's method for the problem the query names first, and flags it", () => {
    const idx = createSearchIndex();
    idx.upsert("a", pub(doc({ slug: "wire-fancy", title: "Wire removal with offset frames", tags: [TAGS.wire], bodyText: "wire wire removal" })));
    idx.upsert("b", pub(doc({ slug: "wire-house", title: "Wire removal", tags: [TAGS.wire], houseMethodFor: ["wire-or-rig"] })));
    const res = idx.search("wire removal", { audience: "published" });
    expect(res.results[0]?.slug).toBe("wire-house");
    expect(res.results[0]?.isHouseMethod).toBe(true);
    expect(res.results[1]?.isHouseMethod).toBe(false);
  });

  it("does not flag the house method when the search is about another problem", () => {
    const idx = createSearchIndex();
    idx.upsert("b", pub(doc({ slug: "wire-house", title: "Wire removal over grain", tags: [TAGS.wire, TAGS.grain], houseMethodFor: ["wire-or-rig"] })));
    const res = idx.search("grain", { audience: "published" });
    expect(res.results[0]?.isHouseMethod).toBe(false);
    expect(res.results[0]?.houseMethodFor).toEqual(["wire-or-rig"]);
    // A tag filter on the problem makes the search about it.
    expect(idx.search("grain", { audience: "published", tags: ["wire-or-rig"] }).results[0]?.isHouseMethod).toBe(true);
  });

  it("hides retired techniques unless asked, and then lists them last", () => {
    const idx = createSearchIndex();
    idx.upsert("old", pub(doc({ slug: "old-way", title: "Dust busting dust busting", status: "retired" })));
    idx.upsert("new", pub(doc({ slug: "new-way", title: "Dust cleanup" })));
    expect(slugs(idx, "dust busting")).toEqual(["new-way"]);
    expect(slugs(idx, "dust busting", { includeRetired: true })).toEqual(["new-way", "old-way"]);
    expect(slugs(idx, "dust busting", { status: ["retired"] })).toEqual(["old-way"]);
    expect(slugs(idx, "", { includeRetired: true })).toEqual(["new-way", "old-way"]);
  });
});

describe("field weights", () => {
  // Issue 6: title > aliases ≈ tags > summary > parameter names ≈ shot codes > body.
  const fields: [string, Partial<SearchDocument>][] = [
    ["title", { title: "Keyer cleanup" }],
    ["aliases", { aliases: ["keyer cleanup"] }],
    ["summary", { summary: "Keyer cleanup" }],
    ["parameters", { parameterNames: ["keyerCleanup"] }],
    ["body", { bodyText: "Keyer cleanup" }],
  ];
  it("orders the same words by the field they appear in", () => {
    const idx = createSearchIndex();
    for (const [field, p] of fields) idx.upsert(field, pub(doc({ slug: `in-${field}`, title: `Technique ${field}`, ...p })));
    expect(slugs(idx, "keyer cleanup")).toEqual(fields.map(([f]) => `in-${f}`));
  });

  it("scores a tag-name match like an alias match and above the summary", () => {
    const idx = createSearchIndex();
    idx.upsert("t", pub(doc({ slug: "by-tag", title: "One", tags: [TAGS.reflections] })));
    idx.upsert("s", pub(doc({ slug: "by-summary", title: "Two", summary: "reflections" })));
    expect(slugs(idx, "reflections")).toEqual(["by-tag", "by-summary"]);
  });

  it("finds shot codes", () => {
    const idx = createSearchIndex();
    idx.upsert("s", pub(doc({ slug: "shot-user", title: "Some technique", shotCodes: ["SLM_040_0120"] })));
    idx.upsert("o", pub(doc({ slug: "other", title: "Other", shotCodes: ["SLM_041_0120"] })));
    expect(slugs(idx, "SLM_040_0120")[0]).toBe("shot-user");
  });
});

describe("matches and snippets", () => {
  const idx = createSearchIndex();
  const body =
    "Start by checking the plate for noise. ".repeat(6) + "Then take the tracking markers out with a matrix row and restore grain. " + "More notes follow here. ".repeat(8);
  idx.upsert("m", pub(doc({ slug: "m", title: "Tracking marker removal", summary: "Markers on blue", bodyText: body, parameterNames: ["markerRow"], tags: [TAGS.markers] })));
  const res = idx.search("trakcing markers", { audience: "published" });
  const r = res.results[0];

  it("gives ranges that cover exactly the matched words, typo-corrected ones included", () => {
    const title = r?.matches.find((m) => m.field === "title");
    expect(title?.ranges.map(([s, e]) => title.value.slice(s, e))).toEqual(["Tracking", "marker"]);
    const summary = r?.matches.find((m) => m.field === "summary");
    expect(summary?.ranges.map(([s, e]) => summary.value.slice(s, e))).toEqual(["Markers"]);
    const params = r?.matches.find((m) => m.field === "parameters");
    expect(params?.ranges.map(([s, e]) => params.value.slice(s, e))).toEqual(["marker"]);
    const tagValues = r?.matches.filter((m) => m.field === "tags").map((m) => m.value);
    expect(tagValues).toContain("Tracking markers");
  });

  it("cuts the snippet around the body match and gives ranges relative to it", () => {
    expect(r?.snippet).toContain("tracking markers");
    expect(r?.snippet.length).toBeLessThan(200);
    expect(r?.snippet.startsWith("…")).toBe(true);
    const bodyMatch = r?.matches.find((m) => m.field === "body");
    expect(bodyMatch?.value).toBe(r?.snippet);
    expect(bodyMatch?.ranges.map(([s, e]) => bodyMatch.value.slice(s, e))).toEqual(["tracking", "markers"]);
  });

  it("falls back to the summary start when the body has no match", () => {
    const only = idx.search("blue", { audience: "published" }).results[0];
    expect(only?.snippet).toBe("Markers on blue");
    expect(only?.matches.some((m) => m.field === "body")).toBe(false);
  });
});

describe("run-together words", () => {
  it("finds and highlights a two-word title from a compound query word", () => {
    const idx = createSearchIndex();
    idx.upsert("b", pub(doc({ slug: "b", title: "Markers on blue screen" })));
    idx.upsert("o", pub(doc({ slug: "o", title: "Blue sky and a screen door" })));
    const res = idx.search("bluescreen markers", { audience: "published" });
    expect(res.results.map((r) => r.slug)[0]).toBe("b");
    const title = res.results[0]?.matches.find((m) => m.field === "title");
    expect(title?.ranges.map(([s, e]) => title.value.slice(s, e))).toContain("blue screen");
  });
});

describe("visibility", () => {
  it("never shows a working-only draft to the published audience", () => {
    const idx = createSearchIndex();
    idx.upsert("d", { published: null, working: doc({ slug: "secret-draft", title: "Wire removal draft", status: "draft" }) });
    expect(slugs(idx, "wire removal")).toEqual([]);
    expect(idx.search("", { audience: "published" }).total).toBe(0);
    expect(idx.suggestTitles("wire", "published")).toEqual([]);
    expect(idx.search("wire removal", { audience: "working" }).results.map((r) => r.slug)).toEqual(["secret-draft"]);
  });

  it("shows artists the approved text and seniors the pending edit", () => {
    const idx = createSearchIndex();
    const approved = doc({ slug: "x", title: "Grain matching", summary: "approved words" });
    idx.upsert("x", { published: approved, working: { ...approved, title: "Grain matching revised", summary: "pending phrasing", status: "in_review" } });
    expect(slugs(idx, "pending phrasing")).toEqual([]);
    expect(idx.search("approved words", { audience: "published" }).results[0]?.status).toBe("approved");
    const working = idx.search("pending phrasing", { audience: "working" }).results;
    expect(working.map((r) => [r.slug, r.status])).toEqual([["x", "in_review"]]);
    expect(idx.search("approved words", { audience: "working" }).results).toEqual([]);
  });

  it("refuses a published view that is not approved or retired", () => {
    const idx = createSearchIndex();
    expect(() => idx.upsert("x", { published: doc({ slug: "x", title: "Bad", status: "draft" }), working: null })).toThrow(TypeError);
  });

  it("makes upserts and removals visible to the next search", () => {
    const idx = createSearchIndex();
    idx.upsert("x", pub(doc({ slug: "x", title: "Logo removal" })));
    expect(slugs(idx, "logo")).toEqual(["x"]);
    idx.upsert("x", pub(doc({ slug: "x", title: "Signage removal" })));
    expect(slugs(idx, "logo")).toEqual([]);
    expect(slugs(idx, "signage")).toEqual(["x"]);
    // A brand-new word is corrected to at once: the vocabulary updates with the document.
    expect(slugs(idx, "signag")).toEqual(["x"]);
    idx.remove("x");
    expect(slugs(idx, "signage")).toEqual([]);
    expect(idx.size()).toBe(0);
    expect(idx.search("signage", { audience: "published" }).corrected).toBeUndefined();
  });
});

describe("filters, facets, recency, paging", () => {
  const idx = createSearchIndex();
  idx.upsert("1", pub(doc({ slug: "g1", title: "Marker cleanup", tags: [TAGS.markers, TAGS.green], updatedAt: "2026-01-01T00:00:00.000Z" })));
  idx.upsert("2", pub(doc({ slug: "b1", title: "Marker cleanup blue", tags: [TAGS.markers, TAGS.blue], updatedAt: "2026-03-01T00:00:00.000Z" })));
  idx.upsert("3", pub(doc({ slug: "b2", title: "Spill on blue", tags: [TAGS.spill, TAGS.blue], updatedAt: "2026-02-01T00:00:00.000Z" })));
  idx.upsert("4", { published: null, working: doc({ slug: "w1", title: "Marker draft", tags: [TAGS.markers], status: "draft" }) });

  it("counts facets over the matching techniques", () => {
    const res = idx.search("marker", { audience: "working" });
    expect(res.total).toBe(3);
    expect(res.facets.problem).toEqual([{ slug: "tracking-markers", name: "Tracking markers", count: 3 }]);
    expect(res.facets.plate).toEqual([
      { slug: "blue-screen", name: "Blue screen", count: 1 },
      { slug: "green-screen", name: "Green screen", count: 1 },
    ]);
    expect(res.facets.status).toEqual([
      { status: "approved", count: 2 },
      { status: "draft", count: 1 },
    ]);
  });

  it("filters by tags (all of them) and status, keeping status facet counts unfiltered", () => {
    expect(slugs(idx, "marker", { tags: ["blue-screen"] })).toEqual(["b1"]);
    const drafts = idx.search("marker", { audience: "working", status: ["draft"] });
    expect(drafts.results.map((r) => r.slug)).toEqual(["w1"]);
    expect(drafts.facets.status).toEqual([
      { status: "approved", count: 2 },
      { status: "draft", count: 1 },
    ]);
  });

  it("lists by recency for an empty query with filters, or on request", () => {
    expect(slugs(idx, "", { tags: ["blue-screen"] })).toEqual(["b1", "b2"]);
    expect(slugs(idx, "  ")).toEqual(["b1", "b2", "g1"]);
    expect(slugs(idx, "marker", { sort: "recent" })).toEqual(["b1", "g1"]);
  });

  it("pages with offset and limit and reports the total", () => {
    const page = idx.search("", { audience: "published", limit: 2, offset: 1 });
    expect(page.total).toBe(3);
    expect(page.results.map((r) => r.slug)).toEqual(["b2", "g1"]);
    expect(page.tookMs).toBeGreaterThanOrEqual(0);
  });
});

// Issue 16's findings, each as the engine must now behave (Plateroom's own rules, no outside source).
describe("graded matching, the department's method and the thesaurus", () => {
  it("keeps the page whose title names the rare word although another matches more common words", () => {
    const idx = createSearchIndex();
    idx.upsert("w", pub(doc({ slug: "window-reflections", title: "Reflections in windows", bodyText: "Crew seen in the glass." })));
    idx.upsert("c", pub(doc({ slug: "car-bodywork", title: "Car bodywork", bodyText: "A shiny guy in the paint, a shiny guy again." })));
    for (let i = 0; i < 6; i++) idx.upsert(`o${i}`, pub(doc({ slug: `other-${i}`, title: `Other ${i}`, bodyText: "a guy in shot" })));
    const found = slugs(idx, "shiny guy in the window");
    expect(found).toContain("window-reflections");
    expect(found).toContain("car-bodywork");
  });

  it("does not lift the department's method above a page whose title names the query's problem better", () => {
    const idx = createSearchIndex();
    const dust = { ...TAGS.dust };
    idx.upsert("h", pub(doc({ slug: "dust-busting", title: "Dust busting film", tags: [dust], houseMethodFor: [dust.slug], bodyText: "Not for sensor dust." })));
    idx.upsert("s", pub(doc({ slug: "sensor-dust", title: "Sensor dust spots", tags: [dust], bodyText: "Dust on the sensor stays put." })));
    const res = idx.search("sensor dust", { audience: "published" });
    expect(res.results.map((r) => r.slug)).toEqual(["sensor-dust", "dust-busting"]);
    // Asked for dust alone, the department's method is promoted and flagged.
    const plain = idx.search("dust", { audience: "published" });
    expect(plain.results[0]).toMatchObject({ slug: "dust-busting", isHouseMethod: true });
  });

  it("applies synonyms and narrower terms below the exact word, and says which word matched through which term", () => {
    const idx = createSearchIndex([
      { kind: "synonyms", terms: ["regrain", "grain restore", "put grain back"] },
      { kind: "narrower", broader: "marker", terms: ["tracker", "tape cross"] },
    ]);
    idx.upsert("r", pub(doc({ slug: "regrain", title: "Regrain after paint" })));
    idx.upsert("m", pub(doc({ slug: "markers", title: "Marker cleanup" })));
    idx.upsert("t", pub(doc({ slug: "trackers", title: "Tracker cleanup" })));
    const regrain = idx.search("put grain back", { audience: "published" }).results[0];
    expect(regrain).toMatchObject({ slug: "regrain", via: [{ word: "put grain back", term: "regrain", kind: "synonym" }] });
    // The exact word outranks the thesaurus term.
    const tracker = idx.search("tracker cleanup", { audience: "published" }).results;
    expect(tracker.map((r) => r.slug)).toEqual(["trackers", "markers"]);
    expect(tracker[1]?.via).toEqual([{ word: "tracker", term: "marker", kind: "broader", source: "thesaurus" }]);
    // One way only: "marker" does not reach pages that only say "tracker".
    expect(slugs(idx, "marker")).toEqual(["markers"]);
  });

  it("takes a new thesaurus at once, without re-indexing pages", () => {
    const idx = createSearchIndex();
    idx.upsert("b", pub(doc({ slug: "boom", title: "Boom in frame" })));
    expect(slugs(idx, "microphone")).toEqual([]);
    const before = idx.version();
    idx.setThesaurus([{ kind: "synonyms", terms: ["boom", "microphone"] }]);
    expect(idx.version()).toBeGreaterThan(before);
    expect(slugs(idx, "microphone")).toEqual(["boom"]);
  });

  it("reads an irregular form by its base, on pages and in the thesaurus alike (WordNet's exception lists: men → man, flew → fly)", () => {
    const idx = createSearchIndex();
    idx.upsert("c", pub(doc({ slug: "crew", title: "Crew removal from a locked-off plate" })));
    idx.upsert("s", pub(doc({ slug: "sky", title: "Sky replacement behind a building" })));
    idx.upsert("b", pub(doc({ slug: "birds", title: "Something that flies through the frame" })));
    // "man" → crew is the built-in symptom lexicon's; "men" meets it through its base.
    expect(slugs(idx, "men at the back")).toEqual(["crew"]);
    expect(slugs(idx, "it flew past")).toEqual(["birds"]);
  });

  it("never corrects a real word, and searches exactly what was typed when asked", () => {
    const idx = createSearchIndex();
    idx.upsert("g", pub(doc({ slug: "gain", title: "Gain match" })));
    idx.upsert("r", pub(doc({ slug: "rolling", title: "Rolling shutter" })));
    expect(idx.search("gait", { audience: "published" }).corrected).toBeUndefined();
    // Not in the word list, but Hunspell's American dictionary passes it by its affix rules (as nspell reads them).
    idx.upsert("k", pub(doc({ slug: "kept", title: "Grain kept under the patch" })));
    expect(idx.search("camera dept", { audience: "published" }).corrected).toBeUndefined();
    expect(idx.search("roling shutter", { audience: "published" }).corrected).toBe("rolling shutter");
    expect(idx.search("roling shutter", { audience: "published", exact: true }).corrected).toBeUndefined();
  });

  it("tells the query as read (its correction) once it is read, as search gives it", () => {
    const idx = createSearchIndex();
    idx.upsert("r", pub(doc({ slug: "rolling", title: "Rolling shutter skew" })));
    const heard = (q: string, exact: boolean): (string | undefined)[] => {
      const calls: (string | undefined)[] = [];
      const res = idx.search(q, { audience: "published", exact }, (corrected) => calls.push(corrected));
      expect(calls, q).toEqual([res.corrected]);
      return calls;
    };
    for (const q of ["roling shutter", "rolling shuter skew", "gait", "rolling shutter", ""]) for (const exact of [false, true]) heard(q, exact);
    expect(heard("rolling shuter skew", false)).toEqual(["rolling shutter skew"]);
  });

  it("corrects to the word nearest what was typed, not to a commoner word whose stem is as near", () => {
    const idx = createSearchIndex();
    // "mark" is on three pages, "markers" on one; "markrs" is one edit from "markers" and two from "mark"
    // (their stems "marker" and "mark" are both one edit from "markr").
    ["a", "b", "c"].forEach((id) => idx.upsert(id, pub(doc({ slug: `page-${id}`, title: `Mark the frame ${id}` }))));
    idx.upsert("m", pub(doc({ slug: "markers", title: "Markers on green screen" })));
    expect(idx.search("markrs on green screen", { audience: "published" }).corrected).toBe("markers on green screen");
    // Both one edit away: the exact word more pages use wins, though "marks" shares its stem with three.
    ["d", "e"].forEach((id) => idx.upsert(id, pub(doc({ slug: `markers-${id}`, title: `Markers and more ${id}` }))));
    idx.upsert("k", pub(doc({ slug: "marks", title: "Marks on film" })));
    expect(idx.search("markrs on green screen", { audience: "published" }).corrected).toBe("markers on green screen");
  });

  it("reaches crew removal from everyday words for a person through the symptom lexicon", () => {
    const idx = createSearchIndex();
    idx.upsert("c", pub(doc({ slug: "crew", title: "Crew in the background" })));
    idx.upsert("w", pub(doc({ slug: "guy-wire", title: "Guy wire paint-out" })));
    for (const q of ["a guy strolling past", "some bloke at the back", "a girl on a bike"]) {
      const crew = idx.search(q, { audience: "published" }).results.find((r) => r.slug === "crew");
      expect(crew?.via?.map((v) => [v.term, v.source]), q).toContainEqual(["crew", "lexicon"]);
    }
  });

  it("reads what a query denies: 'didn't shoot a clean plate' puts the page for that case before the one that needs a clean plate", () => {
    const idx = createSearchIndex();
    idx.upsert("a", pub(doc({ slug: "with-plate", title: "Rig removal with a clean plate", summary: "Line up the clean pass and mix it in over the rig." })));
    idx.upsert("b", pub(doc({ slug: "no-plate", title: "Rebuilding the background", summary: "When no clean plate was shot, build one from frames of the take and paint the rig out." })));
    expect(slugs(idx, "remove the rig, they shot a clean plate")[0]).toBe("with-plate");
    expect(slugs(idx, "remove the rig, they didn't shoot a clean plate")[0]).toBe("no-plate");
    // The response says how it read the query, for the search page to show.
    expect(idx.search("remove the rig, they didn't shoot a clean plate", { audience: "published" }).denials).toEqual(["didn't shoot a clean plate"]);
    expect(idx.search("remove the rig, they shot a clean plate", { audience: "published" }).denials).toBeUndefined();
    // Read after spelling correction.
    const misspelt = idx.search("remove the rig, they didn't shoot a claen plate", { audience: "published" });
    expect(misspelt.results[0]?.slug).toBe("no-plate");
    expect(misspelt.denials).toEqual(["didn't shoot a clean plate"]);
  });

  it("reads 'the camera doesn't move' as counting against the method for a moving camera", () => {
    const idx = createSearchIndex();
    idx.upsert("l", pub(doc({ slug: "locked", title: "People walking through a locked-off shot", summary: "A median of the frames removes them." })));
    idx.upsert("m", pub(doc({ slug: "moving", title: "People walking through a moving shot", summary: "Project a clean background onto the solved track." })));
    const scores = (q: string) => new Map(idx.search(q, { audience: "published" }).results.map((r) => [r.slug, r.score]));
    // The same words either way ("doesn't" is a stop word; "moves" and "move" share a stem).
    const affirmed = scores("people walking through and the camera moves");
    const denied = scores("people walking through and the camera doesn't move");
    expect(denied.get("moving")).toBeCloseTo((affirmed.get("moving") ?? 0) * NEGATION_WEIGHTS.namedInTitle, 2);
    expect(denied.get("locked")).toBeCloseTo(affirmed.get("locked") ?? -1, 2);
  });

  it("reads 'can someone tell me…' as a question to colleagues, not as a person in the plate", () => {
    const idx = createSearchIndex([...STARTER_THESAURUS]);
    idx.upsert("c", pub(doc({ slug: "crew", title: "Removing crew from the background" })));
    idx.upsert("w", pub(doc({ slug: "wire", title: "Wire removal over sky" })));
    expect(slugs(idx, "can someone tell me how to paint out a wire")).toEqual(["wire"]);
    expect(slugs(idx, "someone in the back of the shot")).toEqual(["crew"]);
  });

  it("keeps sparks from a fire away from crew removal in the starter thesaurus", () => {
    // "spark" (set slang for an electrician) left the crew entry (migration 0017): its stem is that of "sparks".
    const idx = createSearchIndex([...STARTER_THESAURUS]);
    idx.upsert("c", pub(doc({ slug: "crew", title: "Removing crew from the background" })));
    idx.upsert("s", pub(doc({ slug: "sparks", title: "Painting out sparks from a grinder" })));
    expect(slugs(idx, "sparks flying past the lens")).toEqual(["sparks"]);
    expect(slugs(idx, "someone walking past")).toEqual(["crew"]);
  });

  it("keeps a quoted thesaurus term from meeting other forms of its stem ('back' is not a 'backing')", () => {
    const idx = createSearchIndex();
    idx.upsert("s", pub(doc({ slug: "screen", title: "Even out an uneven screen" })));
    idx.upsert("c", pub(doc({ slug: "crew", title: "Crew in the rear of frame" })));
    idx.setThesaurus([{ kind: "narrower", broader: "screen", terms: ["backing"] }]);
    // Snowball stems "backing" to "back", so the plain term answers "back" with the screen page.
    expect(slugs(idx, "back of the shot")).toContain("screen");
    idx.setThesaurus([{ kind: "narrower", broader: "screen", terms: ['"backing"'] }]);
    expect(slugs(idx, "back of the shot")).not.toContain("screen");
    expect(slugs(idx, "patchy backing")).toEqual(["screen"]);
    expect(slugs(idx, "two backings")).toEqual(["screen"]);
    const via = idx.search("patchy backing", { audience: "published" }).results[0]?.via ?? [];
    expect(via.map((v) => [v.term, v.source])).toContainEqual(["screen", "thesaurus"]);
    // A quoted term found through another word highlights its own words only, not every "back".
    const bodyMarks = (terms: string[]): string[] => {
      const one = createSearchIndex();
      one.upsert("g", pub(doc({ slug: "keyed", title: "Keyed plates", bodyText: "Shot on green backing; mix the result back over it." })));
      one.setThesaurus([{ kind: "synonyms", terms }]);
      const body = one.search("green screen", { audience: "published" }).results[0]?.matches.find((m) => m.field === "body");
      return body ? body.ranges.map(([from, to]) => body.value.slice(from, to).toLowerCase()) : [];
    };
    expect(bodyMarks(["green screen", '"green backing"'])).toEqual(["green", "backing"]);
    expect(bodyMarks(["green screen", "green backing"])).toEqual(["green", "backing", "back"]);
    // The built-in symptom words quote theirs too: "crosses" (tape marks) is not "crossing".
    idx.upsert("m", pub(doc({ slug: "markers", title: "Marker paint-out" })));
    expect(slugs(idx, "crosses")).toEqual(["markers"]);
    expect(slugs(idx, "crossing")).toEqual([]);
  });

  it("between words equally near and on as many pages, corrects to the one written more often", () => {
    const idx = createSearchIndex();
    // "markers" and "marks" are each on two pages and each one edit from "markrs"; the pages say
    // "markers" five times and "marks" twice. Among equally likely edits a corrector takes the
    // commoner word (P. Norvig, "How to Write a Spelling Corrector": counts of each word in a corpus).
    idx.upsert("a", pub(doc({ slug: "a", title: "Markers on a backing", summary: "Paint out markers; markers move with the camera." })));
    idx.upsert("b", pub(doc({ slug: "b", title: "Markers off skin", summary: "Small markers." })));
    idx.upsert("c", pub(doc({ slug: "c", title: "Marks on film", summary: "Scratch marks." })));
    idx.upsert("d", pub(doc({ slug: "d", title: "Pen marks" })));
    expect(idx.search("markrs", { audience: "published" }).corrected).toBe("markers");
    // Counts follow edits (still two pages each): now "markers" is written twice and "marks" four times.
    idx.upsert("a", pub(doc({ slug: "a", title: "Markers on a backing" })));
    idx.upsert("c", pub(doc({ slug: "c", title: "Marks on film", summary: "Marks left by tape, marks left by pens." })));
    expect(idx.search("markrs", { audience: "published" }).corrected).toBe("marks");
  });

  it("among equally near corrections, takes the one found with the query's other words", () => {
    const idx = createSearchIndex();
    ["a", "b", "c"].forEach((id) => idx.upsert(id, pub(doc({ slug: `key-${id}`, title: `A strong key ${id}` }))));
    idx.upsert("k", pub(doc({ slug: "kite", title: "Kite string over the sky" })));
    // Alone, the commoner word; beside "kite", the word that shares a page with it.
    expect(idx.search("strng", { audience: "published" }).corrected).toBe("strong");
    expect(idx.search("kite strng", { audience: "published" }).corrected).toBe("kite string");
    expect(idx.search("strng kite", { audience: "published" }).corrected).toBe("string kite");
    // Every candidate still finds its pages.
    expect(slugs(idx, "kite strng")[0]).toBe("kite");
  });

  it("reaches related word forms through stems and word families ('dark' → darkening, 'blurry' → blur)", () => {
    const idx = createSearchIndex();
    idx.upsert("d", pub(doc({ slug: "darkening", title: "Corner darkening" })));
    idx.upsert("b", pub(doc({ slug: "blur", title: "Motion blur fill" })));
    expect(slugs(idx, "dark")).toEqual(["darkening"]);
    expect(slugs(idx, "blurry")).toEqual(["blur"]);
  });

  it("keeps c-stand and 16-bit whole, and does not split a word that is a word ('sideways')", () => {
    const idx = createSearchIndex();
    idx.upsert("c", pub(doc({ slug: "c-stand", title: "C-stand at the edge" })));
    idx.upsert("s", pub(doc({ slug: "side", title: "Side light", bodyText: "ways to do it" })));
    idx.upsert("w", pub(doc({ slug: "sideways", title: "Sideways pan" })));
    expect(slugs(idx, "c-stand")[0]).toBe("c-stand");
    expect(slugs(idx, "cstand")[0]).toBe("c-stand");
    expect(slugs(idx, "sideways")).toEqual(["sideways"]);
  });
});
