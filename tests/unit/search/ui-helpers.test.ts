import { createElement } from "react";
import { renderToStaticMarkup } from "react-dom/server";
import { describe, expect, it } from "vitest";
import { ResultItem } from "@/components/search/result-item";
import { coveredWords, isWeakMatch, queryWords } from "@/lib/search-ui/coverage";
import { parseSearchState, searchHref, toggled, type SearchResultDto } from "@/lib/search-ui/params";
import { pushRecent, readRecent, recentKey, RECENT_LIMIT } from "@/lib/search-ui/recent";
import { isFinderShortcut, isTypingTarget } from "@/lib/search-ui/shortcut";

describe("search address", () => {
  it("round-trips a search through the URL, repeating tag and status", () => {
    const state = { q: "tracker dots on blue", tag: ["tracking-markers", "blue-screen"], status: ["approved" as const], sort: "recent" as const, retired: true, exact: true, offset: 20 };
    const href = searchHref(state);
    // WHATWG URL Standard, application/x-www-form-urlencoded serializer: a space is written as "+".
    expect(href).toBe("/search?q=tracker+dots+on+blue&tag=tracking-markers&tag=blue-screen&status=approved&sort=recent&retired=1&exact=1&offset=20");
    const params = new URLSearchParams(href.split("?")[1]);
    const raw: Record<string, string | string[]> = {};
    for (const key of new Set(params.keys())) raw[key] = params.getAll(key).length > 1 ? params.getAll(key) : params.get(key)!;
    expect(parseSearchState(raw)).toEqual({ state, invalid: [] });
    expect(searchHref({})).toBe("/search");
  });

  it("drops what it cannot read instead of failing the page, and says which part", () => {
    const { state, invalid } = parseSearchState({ q: "wire", status: "published", sort: "recent" });
    expect(invalid).toEqual(["status"]);
    expect(state).toMatchObject({ q: "wire", status: [], sort: "recent" });
  });

  it("toggles a facet value in and out", () => {
    expect(toggled(["a", "b"], "b")).toEqual(["a"]);
    expect(toggled(["a"], "b")).toEqual(["a", "b"]);
  });
});

describe("weak-match detection (offers a write-up request)", () => {
  const flickerOnly = [{ matches: [{ field: "body" as const, value: "…so clouds and flicker stay in step…", ranges: [[15, 22]] as [number, number][] }] }];
  it("counts content words only: the search's one stop-word list, filler words left out too", () => {
    expect(queryWords("How to remove the tracker dots on a blue screen")).toEqual(["remove", "tracker", "dots", "blue", "screen"]);
    expect(queryWords("how do i get rid of the c-stand")).toEqual(["cstand"]);
  });
  it("counts a word answered through the thesaurus as covered", () => {
    const viaOnly = [{ matches: [{ field: "title" as const, value: "Marker cleanup", ranges: [[0, 6]] as [number, number][] }], via: [{ word: "tracker", term: "marker", kind: "broader" as const, source: "thesaurus" as const }] }];
    expect(isWeakMatch("tracker cleanup", viaOnly)).toBe(false);
  });
  it("flags results that match one word of three, not results that match them all", () => {
    expect(coveredWords("zebra crossing flicker", flickerOnly[0]!.matches).covered).toEqual(["flicker"]);
    expect(isWeakMatch("zebra crossing flicker", flickerOnly)).toBe(true);
    const full = [{ matches: [{ field: "tags" as const, value: "Tracking markers", ranges: [[0, 8], [9, 16]] as [number, number][] }] }];
    // "marker" (corrected query) against "markers" (the tag): one word, plural form.
    expect(isWeakMatch("tracking marker", full)).toBe(false);
    expect(isWeakMatch("flicker", flickerOnly)).toBe(false);
    expect(isWeakMatch("zebra crossing flicker", [])).toBe(false);
  });
});

describe("recent searches", () => {
  const memory = () => {
    const m = new Map<string, string>();
    return { getItem: (k: string) => m.get(k) ?? null, setItem: (k: string, v: string) => void m.set(k, v), removeItem: (k: string) => void m.delete(k), m };
  };
  it("keeps them per person, newest first, without repeats, up to the limit", () => {
    const store = memory();
    pushRecent("ann", "wire on sky", store);
    pushRecent("ann", "tracker dots", store);
    pushRecent("ann", "Wire  on sky", store);
    expect(readRecent("ann", store)).toEqual(["Wire on sky", "tracker dots"]);
    expect(readRecent("bob", store)).toEqual([]);
    for (let i = 0; i < 20; i++) pushRecent("ann", `query ${i}`, store);
    expect(readRecent("ann", store)).toHaveLength(RECENT_LIMIT);
    expect(readRecent("ann", store)[0]).toBe("query 19");
  });
  it("survives garbage in storage", () => {
    const store = memory();
    store.setItem(recentKey("ann"), "{not json");
    expect(readRecent("ann", store)).toEqual([]);
    store.setItem(recentKey("ann"), JSON.stringify([1, "ok", null]));
    expect(readRecent("ann", store)).toEqual(["ok"]);
  });
});

describe("finder shortcut", () => {
  const el = (matches: string[], extra: Partial<{ isContentEditable: boolean; type: string }> = {}) => ({
    isContentEditable: extra.isContentEditable ?? false,
    closest: (selector: string) => {
      if (selector === "input") return matches.includes("input") ? { type: extra.type ?? "text" } : null;
      return selector.split(",").some((s) => matches.includes(s.trim())) ? {} : null;
    },
  });
  const key = (k: string, target: unknown, mods: Partial<{ ctrlKey: boolean; metaKey: boolean; altKey: boolean; shiftKey: boolean }> = {}) => ({
    key: k,
    ctrlKey: false,
    metaKey: false,
    altKey: false,
    shiftKey: false,
    isComposing: false,
    defaultPrevented: false,
    target: target as EventTarget,
    ...mods,
  });
  it("opens on Ctrl+K, ⌘K and / outside fields", () => {
    expect(isFinderShortcut(key("k", el([]), { ctrlKey: true }))).toBe(true);
    expect(isFinderShortcut(key("K", el([]), { metaKey: true }))).toBe(true);
    expect(isFinderShortcut(key("/", el([])))).toBe(true);
    expect(isFinderShortcut(key("k", el([])))).toBe(false);
    expect(isFinderShortcut(key("k", el([]), { ctrlKey: true, shiftKey: true }))).toBe(false);
  });
  it("stays out of the rich-text editor (its Mod-k makes a link, components/editor/toolbar.tsx) and of text fields", () => {
    expect(isFinderShortcut(key("k", el([".ProseMirror"]), { ctrlKey: true }))).toBe(false);
    expect(isFinderShortcut(key("k", el(["textarea"]), { metaKey: true }))).toBe(false);
    expect(isFinderShortcut(key("/", el(["input"])))).toBe(false);
    expect(isTypingTarget(el([], { isContentEditable: true }) as unknown as EventTarget)).toBe(true);
    // A focused checkbox takes no text, so "/" still opens the finder.
    expect(isFinderShortcut(key("/", el(["input"], { type: "checkbox" })))).toBe(true);
  });
});

describe("a result as rendered", () => {
  const result: SearchResultDto = {
    slug: "x",
    title: "<img src=x onerror=alert(1)> Marker cleanup",
    summary: "Markers vanish.",
    status: "approved",
    score: 1,
    matches: [{ field: "title", value: "<img src=x onerror=alert(1)> Marker cleanup", ranges: [[29, 35]] }],
    snippet: "",
    tags: [{ slug: "tracking-markers", name: "Tracking markers", kind: "problem" }],
    isHouseMethod: true,
    houseMethodFor: ["tracking-markers"],
    via: [{ word: "tracker", term: "marker", kind: "broader", source: "thesaurus" }],
    updatedAt: "2025-01-02T00:00:00.000Z",
  };
  it("marks the matched words and never turns text into markup", () => {
    const html = renderToStaticMarkup(createElement(ResultItem, { result }));
    expect(html).toContain("<mark");
    expect(html).toMatch(/<mark[^>]*>Marker<\/mark>/);
    // HTML Living Standard §13.3 (serialising text): "<" in text is written as "&lt;".
    expect(html).toContain("&lt;img src=x onerror=alert(1)&gt;");
    expect(html).not.toContain("<img");
    expect(html).toContain("Department method · Tracking markers");
    // Issue 16: which query word matched through which thesaurus term.
    expect(html).toContain("“tracker” found as");
    expect(html).toMatch(/“tracker” found as <span[^>]*>“marker”<\/span>.*\(department thesaurus\)/);
  });

  it("says where each related word came from, so WordNet's links are not taken for a lead's entries", () => {
    const via: SearchResultDto["via"] = [
      { word: "tracker", term: "marker", kind: "broader", source: "thesaurus" },
      { word: "blotchy", term: "uneven", kind: "broader", source: "lexicon" },
      { word: "tourists", term: "people", kind: "broader", source: "wordnet" },
    ];
    const text = renderToStaticMarkup(createElement(ResultItem, { result: { ...result, via } })).replace(/<[^>]+>/g, "");
    expect(text).toContain("“tracker” found as “marker” (department thesaurus)");
    expect(text).toContain("“blotchy” found as “uneven” (built-in symptom words)");
    expect(text).toContain("“tourists” found as “people” (everyday English, WordNet)");
  });
});
