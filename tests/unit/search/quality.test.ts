import { describe, expect, it } from "vitest";

import { byWords, byWordsThenMeaning, evaluateQuality, hunspellJudge, type QualityReport, type SpellJudge } from "@/bench/lib/quality";
import { STARTER_THESAURUS } from "@/scripts/seed/data/thesaurus";
import { createSearchIndex } from "@/lib/search/engine";
import { loadLanguage } from "@/lib/search/language";
import { createMeaning } from "@/lib/search/meaning";
import { sentenceEncoder } from "@/lib/search/meaning-model";
import type { SearchDocument, SearchIndex } from "@/lib/search/types";

import { QUALITY_PAGES } from "./quality/pages";
import { isHeldOut, QUALITY_QUERIES, type QualityQuery, type QueryKind, QUERY_KINDS } from "./quality/queries";
import { UNSEEN_PAGES } from "./quality/unseen-pages";
import { UNSEEN_QUERIES } from "./quality/unseen-queries";
import { UNSEEN_QUERIES_SECOND } from "./quality/unseen-queries-second";
import { UNSEEN_QUERIES_THIRD } from "./quality/unseen-queries-third";
import { UNSEEN_PAGES_SECOND } from "./quality/unseen-pages-second";
import { UNSEEN_PAGES_SECOND_QUERIES } from "./quality/unseen-pages-second-queries";
import { UNSEEN_PAGES_THIRD } from "./quality/unseen-pages-third";
import { UNSEEN_PAGES_THIRD_QUERIES } from "./quality/unseen-pages-third-queries";

/** The report of ranking by words then meaning with the real encoder, computed once, when first asked. */
function lazyMeaningReport(index: SearchIndex, queries: readonly QualityQuery[], judge: SpellJudge, isHeldOutQuery?: (q: QualityQuery) => boolean): () => Promise<QualityReport> {
  let report: Promise<QualityReport> | undefined;
  return () =>
    (report ??= sentenceEncoder().then((encode) => {
      if (!encode) throw new Error("the sentence encoder did not load");
      return evaluateQuality(byWordsThenMeaning(index, createMeaning(encode)), queries, judge, isHeldOutQuery);
    }));
}

type KindFloors = Record<QueryKind, { top1: number; top3: number }>;

/** The kind's row of `report` is at or above its floor, and at or above `alsoAtLeast` (the engine alone) when given. */
function expectAtFloor(report: QualityReport, kind: QueryKind, floors: KindFloors, alsoAtLeast?: QualityReport): void {
  const row = report.all.find((r) => r.kind === kind);
  const other = alsoAtLeast?.all.find((r) => r.kind === kind);
  expect(row?.top3, JSON.stringify(row)).toBeGreaterThanOrEqual(Math.max(floors[kind].top3, other?.top3 ?? 0));
  expect(row?.top1, JSON.stringify(row)).toBeGreaterThanOrEqual(Math.max(floors[kind].top1, other?.top1 ?? 0));
}

/**
 * The checks of an unseen page set written by one writer and queried by another (30 queries a kind):
 * its shape, no real word corrected, and each kind at or above its floor, searched over its pages alone.
 */
function unseenPageSetSuite(pages: SearchDocument[], queries: QualityQuery[], otherSets: SearchDocument[], floors: KindFloors): void {
  // Built when a test first asks, so collecting the tests loads nothing.
  let report: Promise<QualityReport> | undefined;
  const withMeaning = (): Promise<QualityReport> =>
    (report ??= (async () => {
      const index = createSearchIndex({ language: await loadLanguage(), thesaurus: STARTER_THESAURUS });
      index.load(pages.map((d) => ({ techniqueId: d.techniqueId, published: d, working: null })));
      const judge = await hunspellJudge(pages);
      return lazyMeaningReport(index, queries, judge, () => true)();
    })());

  it("has 40 pages of its own and 30 distinct queries of each kind on them, and corrects no real word", async () => {
    const slugs = new Set(pages.map((p) => p.slug));
    expect(slugs.size).toBe(40);
    const others = new Set(otherSets.map((p) => p.slug));
    expect([...slugs].filter((s) => others.has(s))).toEqual([]);
    for (const kind of QUERY_KINDS) expect(queries.filter((q) => q.kind === kind).length, kind).toBe(30);
    for (const q of queries) expect(slugs.has(q.expected), q.expected).toBe(true);
    expect(new Set(queries.map((q) => q.query)).size).toBe(queries.length);
    const { realWordsCorrected } = await withMeaning();
    expect(realWordsCorrected.wordsChecked).toBeGreaterThan(500);
    expect(realWordsCorrected.examples).toEqual([]);
  });
  it.each(QUERY_KINDS)("%s queries ranked by words then meaning stay at or above their floor", async (kind) => {
    expectAtFloor(await withMeaning(), kind, floors);
  });
}

// Issue 16 "Quality": junior queries over look-alike pages. The query → page pairs and their reasons
// are trade judgement (common practice, no published source). The targets (top-1 ≥ 95 %, top-3 ≥ 99 %)
// are measured by `npm run bench`; this test guards against regressions with floors below today's
// numbers, and checks the rule that no correctly spelt word is ever "corrected" (Hunspell en-US and
// en-GB as the outside judge of spelling).
describe("search quality set", async () => {
  const index = createSearchIndex({ language: await loadLanguage(), thesaurus: STARTER_THESAURUS });
  index.load(QUALITY_PAGES.map((d) => ({ techniqueId: d.techniqueId, published: d, working: null })));
  const judge = await hunspellJudge(QUALITY_PAGES);
  const report = await evaluateQuality(byWords(index), QUALITY_QUERIES, judge);

  it("has at least 200 queries in four kinds over at least 100 pages, each with a reason and an existing page", () => {
    expect(QUALITY_PAGES.length).toBeGreaterThanOrEqual(100);
    expect(QUALITY_QUERIES.length).toBeGreaterThanOrEqual(200);
    const slugs = new Set(QUALITY_PAGES.map((p) => p.slug));
    expect(slugs.size).toBe(QUALITY_PAGES.length);
    for (const q of QUALITY_QUERIES) {
      expect(slugs.has(q.expected), q.expected).toBe(true);
      expect(q.reason.length, q.query).toBeGreaterThan(3);
    }
    for (const kind of QUERY_KINDS) expect(QUALITY_QUERIES.filter((q) => q.kind === kind).length, kind).toBeGreaterThanOrEqual(50);
    expect(new Set(QUALITY_QUERIES.map((q) => q.query)).size).toBe(QUALITY_QUERIES.length);
  });

  it("holds out at least a quarter of each kind and at least 10 queries a kind, and keeps at least 40 a kind to tune on", () => {
    for (const kind of QUERY_KINDS) {
      const all = QUALITY_QUERIES.filter((q) => q.kind === kind);
      const heldOut = all.filter(isHeldOut).length;
      expect(heldOut, kind).toBeGreaterThanOrEqual(Math.max(10, Math.floor(all.length / 4)));
      expect(all.length - heldOut, kind).toBeGreaterThanOrEqual(40);
    }
  });

  it("corrects no correctly spelt word", () => {
    expect(report.realWordsCorrected.wordsChecked).toBeGreaterThan(1000);
    expect(report.realWordsCorrected.examples).toEqual([]);
  });

  // Floors under today's numbers (whole set, 2026-12-03). Describe-what-you-see is lower: 94 of its
  // 142 queries are held out, 68 of them from the third batch written before the WordNet layer.
  const FLOORS: KindFloors = {
    plain: { top1: 85, top3: 95 },
    typo: { top1: 90, top3: 95 },
    describe: { top1: 70, top3: 84 },
    filler: { top1: 85, top3: 95 },
  };
  it.each(QUERY_KINDS)("%s queries stay at or above their floor for first place and the top 3 (whole set)", (kind) => {
    expectAtFloor(report, kind, FLOORS);
  });

  // What people get: the engine's order, then ranking by meaning (lib/search/meaning.ts) with the real
  // sentence encoder. Floors under today's numbers (whole set, 2026-12-04: 97.0/98.5, 98.9/98.9,
  // 79.1/91.9, 93.9/98.5), and never below the engine alone.
  const MEANING_FLOORS: typeof FLOORS = {
    plain: { top1: 94, top3: 97 },
    typo: { top1: 96, top3: 97 },
    describe: { top1: 77, top3: 90 },
    filler: { top1: 91, top3: 97 },
  };
  const withMeaning = lazyMeaningReport(index, QUALITY_QUERIES, judge);
  it.each(QUERY_KINDS)("%s queries ranked by words then meaning stay at or above their floor and the engine alone", async (kind) => {
    expectAtFloor(await withMeaning(), kind, MEANING_FLOORS, report);
  });

  it("quick finder titles: misspelt partial input still finds the technique", () => {
    expect(index.suggestTitles("dust bus", "published", 3).map((s) => s.slug)).toContain("dust-busting-film-scans");
    expect(index.suggestTitles("wire remov", "published", 3).map((s) => s.slug)).toContain("wire-over-sky");
    // Ten pages are about tracking markers; any of them answers, but only they.
    const markerPages = index.suggestTitles("trakcing mark", "published", 5).map((s) => s.slug);
    expect(markerPages).toHaveLength(5);
    for (const slug of markerPages) expect(slug).toMatch(/^markers-/);
  });

  it("reports the corrected query in the user's own word order and spacing", () => {
    const res = index.search("wire remvoal  sky", { audience: "published" });
    expect(res.corrected).toBe("wire removal  sky");
    expect(index.search("wire removal sky", { audience: "published" }).corrected).toBeUndefined();
  });
});

// The unseen set: 40 pages and 160 queries written on 2026-12-04 apart from the engine (the writer
// read neither the engine, the thesaurus nor the quality set) and never tuned on — the nearest thing
// here to a check with pages the project has not seen. Query → page pairs are trade judgement
// (common practice). Floors under the first measurement (2026-12-04, words then meaning: plain
// 100/100, typo 100/100, describe 82.5/97.5, filler 95/100; words alone describe 77.5/92.5, filler
// 92.5/100), and meaning never below the engine alone.
describe("search quality on pages no tuning saw", async () => {
  const index = createSearchIndex({ language: await loadLanguage(), thesaurus: STARTER_THESAURUS });
  index.load(UNSEEN_PAGES.map((d) => ({ techniqueId: d.techniqueId, published: d, working: null })));
  const judge = await hunspellJudge(UNSEEN_PAGES);
  const allHeldOut = () => true;
  const byWordsReport = await evaluateQuality(byWords(index), UNSEEN_QUERIES, judge, allHeldOut);

  it("has 40 queries of each kind, each with a reason and one existing page, and lists no misses", () => {
    const slugs = new Set(UNSEEN_PAGES.map((p) => p.slug));
    expect(slugs.size).toBe(UNSEEN_PAGES.length);
    expect([...slugs].filter((s) => QUALITY_PAGES.some((p) => p.slug === s))).toEqual([]);
    for (const kind of QUERY_KINDS) expect(UNSEEN_QUERIES.filter((q) => q.kind === kind).length, kind).toBe(40);
    for (const q of UNSEEN_QUERIES) {
      expect(slugs.has(q.expected), q.expected).toBe(true);
      expect(q.reason.length, q.query).toBeGreaterThan(3);
    }
    expect(byWordsReport.tunedMisses).toEqual([]);
  });

  it("corrects no correctly spelt word", () => {
    expect(byWordsReport.realWordsCorrected.wordsChecked).toBeGreaterThan(1000);
    expect(byWordsReport.realWordsCorrected.examples).toEqual([]);
  });

  const UNSEEN_FLOORS: KindFloors = {
    plain: { top1: 95, top3: 97 },
    typo: { top1: 95, top3: 97 },
    describe: { top1: 77, top3: 92 },
    filler: { top1: 90, top3: 97 },
  };
  const withMeaning = lazyMeaningReport(index, UNSEEN_QUERIES, judge, allHeldOut);
  it.each(QUERY_KINDS)("%s queries ranked by words then meaning stay at or above their floor and the engine alone", async (kind) => {
    expectAtFloor(await withMeaning(), kind, UNSEEN_FLOORS, byWordsReport);
  });

  // A second writer's 120 queries over the same pages, from their titles and summaries only (first
  // measurement, words then meaning: plain 100/100, typo 96.7/100, describe 83.3/100, filler 93.3/100;
  // words alone typo 100/100 — meaning cost one typo query its first place, so only the whole set is
  // held to "not below words alone").
  const SECOND_FLOORS: KindFloors = {
    plain: { top1: 95, top3: 97 },
    typo: { top1: 93, top3: 97 },
    describe: { top1: 77, top3: 95 },
    filler: { top1: 88, top3: 97 },
  };
  const secondWithMeaning = lazyMeaningReport(index, UNSEEN_QUERIES_SECOND, judge, allHeldOut);
  it("has a second writer's 30 distinct queries of each kind over the same pages, and corrects no real word", async () => {
    const slugs = new Set(UNSEEN_PAGES.map((p) => p.slug));
    for (const kind of QUERY_KINDS) expect(UNSEEN_QUERIES_SECOND.filter((q) => q.kind === kind).length, kind).toBe(30);
    for (const q of UNSEEN_QUERIES_SECOND) expect(slugs.has(q.expected), q.expected).toBe(true);
    expect(new Set(UNSEEN_QUERIES_SECOND.map((q) => q.query)).size).toBe(UNSEEN_QUERIES_SECOND.length);
    expect((await secondWithMeaning()).realWordsCorrected.examples).toEqual([]);
  });
  it.each(QUERY_KINDS)("%s queries of the second writer stay at or above their floor", async (kind) => {
    expectAtFloor(await secondWithMeaning(), kind, SECOND_FLOORS);
  });
  // A third writer's 120, written the same way on 2026-12-05 (first measurement, words then meaning:
  // plain 93.3/100, typo 100/100, describe 96.7/100, filler 93.3/100; words alone plain 96.7, describe
  // 93.3, filler 96.7/96.7 — meaning moves single queries both ways here, so no "not below" rule).
  const THIRD_FLOORS: KindFloors = {
    plain: { top1: 90, top3: 97 },
    typo: { top1: 95, top3: 97 },
    describe: { top1: 90, top3: 97 },
    filler: { top1: 90, top3: 97 },
  };
  const thirdWithMeaning = lazyMeaningReport(index, UNSEEN_QUERIES_THIRD, judge, allHeldOut);
  it("has a third writer's 30 distinct queries of each kind over the same pages, and corrects no real word", async () => {
    const slugs = new Set(UNSEEN_PAGES.map((p) => p.slug));
    for (const kind of QUERY_KINDS) expect(UNSEEN_QUERIES_THIRD.filter((q) => q.kind === kind).length, kind).toBe(30);
    for (const q of UNSEEN_QUERIES_THIRD) expect(slugs.has(q.expected), q.expected).toBe(true);
    expect(new Set(UNSEEN_QUERIES_THIRD.map((q) => q.query)).size).toBe(UNSEEN_QUERIES_THIRD.length);
    expect((await thirdWithMeaning()).realWordsCorrected.examples).toEqual([]);
  });
  it.each(QUERY_KINDS)("%s queries of the third writer stay at or above their floor", async (kind) => {
    expectAtFloor(await thirdWithMeaning(), kind, THIRD_FLOORS);
  });

  it("ranks the second writer's queries, taken together, no worse with meaning than by words alone", async () => {
    const alone = (await evaluateQuality(byWords(index), UNSEEN_QUERIES_SECOND, judge, allHeldOut)).all.find((r) => r.kind === "all");
    const withIt = (await secondWithMeaning()).all.find((r) => r.kind === "all");
    expect(withIt?.top1).toBeGreaterThanOrEqual(alone?.top1 ?? 0);
    expect(withIt?.top3).toBeGreaterThanOrEqual(alone?.top3 ?? 0);
  });
});

// A second unseen page set (2026-12-05): 40 pages in other look-alike groups (heat haze, water on the
// lens, screens in shot, frame repair, blown highlights, skin, floor marks…) by a writer who read
// neither the engine, its thesaurus and lexicon nor any query set, and 120 queries (30 a kind) by
// another who saw only those pages' titles and summaries. Held out whole. Floors under the first
// measurement (words then meaning: plain 100/100, typo 100/100, describe 96.7/100, filler 100/100;
// words alone 100/100 in every kind — meaning moved one describe query to second place).
describe("search quality on a second set of pages no tuning saw", () => {
  unseenPageSetSuite(UNSEEN_PAGES_SECOND, UNSEEN_PAGES_SECOND_QUERIES, [...QUALITY_PAGES, ...UNSEEN_PAGES], {
    plain: { top1: 95, top3: 97 },
    typo: { top1: 95, top3: 97 },
    describe: { top1: 90, top3: 97 },
    filler: { top1: 95, top3: 97 },
  });
});

// A third unseen page set (2026-12-05, after the morning's last engine change): 40 pages in the problem
// areas the demo covers too (markers, wires, rigs, crew, film dust, grain, reflections, flares, screens,
// shadows, boom mics) by a writer who read neither the engine, its thesaurus and lexicon nor any query
// set, and 120 queries (30 a kind) by another who saw only those pages' titles and summaries. Held out
// whole. Floors under the first measurement (words then meaning: plain 100/100, typo 100/100, describe
// 86.7/96.7, filler 96.7/100; words alone describe 86.7/100 and filler 100/100 — here meaning cost a
// describe query its top three and a filler query its first place, so no "meaning at least as good" check).
describe("search quality on a third set of pages no tuning saw", () => {
  unseenPageSetSuite(UNSEEN_PAGES_THIRD, UNSEEN_PAGES_THIRD_QUERIES, [...QUALITY_PAGES, ...UNSEEN_PAGES, ...UNSEEN_PAGES_SECOND], {
    plain: { top1: 95, top3: 97 },
    typo: { top1: 95, top3: 97 },
    describe: { top1: 83, top3: 93 },
    filler: { top1: 93, top3: 97 },
  });
});
