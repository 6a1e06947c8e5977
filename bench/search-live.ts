/*
 * Search through the running product (issue 16): `npx tsx -C react-server bench/search-live.ts`.
 * bench/search.ts measures the engine in-process over page sets of its own; this goes the way an
 * outside checker does. For each unseen page set (tests/unit/search/quality, written apart from the
 * engine) it starts the built app on a fresh copy of the seeded demo (tests/e2e/harness.ts), so the
 * set meets the demo's own pages and nothing else. Then, through the HTTP API:
 * - a lead creates the set's tags that the demo lacks (a tag the demo has, by name, is reused);
 * - a senior writes each page (POST /api/techniques: title, summary, aliases, tags, the body as one
 *   paragraph; a page's parameter names and shot codes are left out: recipes and shots need real
 *   steps and shows) and submits it, and a lead approves it and makes it the department's method
 *   where the set says so (which replaces the demo's method for that tag, if any);
 * - an artist runs each of the set's queries (GET /api/search), first and only time.
 * Reports top-1, top-3 and MRR per kind (bench/lib/quality.ts, as bench/search.ts does), correctly
 * spelt words "corrected", and the server's own tookMs (the first search to bring a new page into a
 * top 10 also encodes that page) under the key "searchLive" of bench/results.json.
 */
import { apiClient, createApiToken, type Api } from "@/bench/lib/http-client";
import { evaluateQuality, hunspellJudge, type KindScore, type QualitySearch } from "@/bench/lib/quality";
import { percentile, writeResultsKey } from "@/bench/lib/results";
import type { SearchDocument, SearchResponse } from "@/lib/search/types";
import { DEMO_PASSWORD, startApp } from "@/tests/e2e/harness";
import { QUALITY_PAGES } from "@/tests/unit/search/quality/pages";
import { isHeldOut, QUALITY_QUERIES, type QualityQuery } from "@/tests/unit/search/quality/queries";
import { UNSEEN_SETS } from "@/tests/unit/search/quality/unseen-sets";

type LiveSet = { name: string; pages: SearchDocument[]; queries: QualityQuery[]; listMisses?: boolean };

// `--tuned`: the quality set's pages and its tuned queries instead (never the held-out ones), with their
// misses listed — where the demo's own pages get in the way, for tuning general rules; the unseen
// sets then say whether a rule holds. Printed only, not written to results.json.
const TUNING = process.argv.includes("--tuned");
// `--no-methods`: the set's pages go in approved but none is made a department method, so the demo's
// methods stay (an outside checker adding pages may well not set any).
const SET_METHODS = !process.argv.includes("--no-methods");
// Each set's writers together: the set is added to the demo once and all its queries run over it.
const SETS: LiveSet[] = TUNING
  ? [{ name: "quality pages, tuned queries", pages: QUALITY_PAGES, queries: QUALITY_QUERIES.filter((q) => !isHeldOut(q)), listMisses: true }]
  : UNSEEN_SETS.map((set) => ({ name: set.name, pages: set.pages, queries: set.writers.flatMap((w) => w.queries) }));

type SetResult = {
  name: string;
  pagesAdded: number;
  queries: number;
  all: KindScore[];
  realWordsCorrected: { count: number; examples: string[]; wordsChecked: number };
  /** What the server reports for each search (ms). */
  tookMs: { p50: number; p95: number; max: number };
  /** One page written, submitted, approved (and made the department's method) through the API (ms). */
  addPageMs: { p50: number; max: number };
  /** Queries whose page was not first, by what came first: another page of the set, or one of the demo's own. */
  notFirst: { toPageOfSet: number; toDemoPage: number; nothingFound: number };
};

async function call<T>(api: Api, method: string, path: string, body?: unknown): Promise<T> {
  const res = await api.json<T>(method, path, body);
  if (res.status >= 300) throw new Error(`${method} ${path} answered ${res.status}: ${JSON.stringify(res.body)}`);
  return res.body;
}

const token = (baseUrl: string, role: string) => createApiToken(baseUrl, `${role}@kestrel.test`, DEMO_PASSWORD, "search live benchmark");

async function runSet(set: LiveSet): Promise<SetResult> {
  const app = await startApp();
  try {
    const [lead, senior, artist] = (await Promise.all(["lead", "senior", "artist"].map((role) => token(app.baseUrl, role)))).map((t) => apiClient(app.baseUrl, t)) as [Api, Api, Api];
    const existing = await call<{ items: { slug: string; name: string }[] }>(lead, "GET", "/api/tags");
    const tagSlug = new Map(existing.items.map((t) => [t.name.toLowerCase(), t.slug]));
    const slugOf = new Map<string, string>();
    const addMs: number[] = [];
    for (const page of set.pages) {
      for (const t of page.tags) {
        if (tagSlug.has(t.name.toLowerCase())) continue;
        const made = await call<{ slug: string }>(lead, "POST", "/api/tags", { kind: t.kind, name: t.name, aliases: t.aliases });
        tagSlug.set(t.name.toLowerCase(), made.slug);
      }
      const started = performance.now();
      const tags = page.tags.map((t) => tagSlug.get(t.name.toLowerCase()) as string);
      const body = { type: "doc", content: [{ type: "paragraph", content: [{ type: "text", text: page.bodyText }] }] };
      const made = await call<{ slug: string; revision: number }>(senior, "POST", "/api/techniques", { title: page.title, summary: page.summary, aliases: page.aliases, tags, body });
      const submitted = await call<{ revision?: number }>(senior, "POST", `/api/techniques/${made.slug}/submit`);
      await call(lead, "POST", `/api/techniques/${made.slug}/review`, { revision: submitted.revision ?? made.revision, decision: "approve" });
      for (const key of SET_METHODS ? page.houseMethodFor : []) {
        const tag = page.tags.find((t) => t.slug === key);
        if (tag) await call(lead, "PUT", `/api/tags/${tagSlug.get(tag.name.toLowerCase())}/house-method`, { technique: made.slug });
      }
      addMs.push(performance.now() - started);
      slugOf.set(page.slug, made.slug);
    }
    const took: number[] = [];
    // Each query's first three results: which page came first, and for --tuned what the three were.
    const topFor = new Map<string, SearchResponse["results"]>();
    const firstFor = (query: string): string | undefined => topFor.get(query)?.[0]?.slug;
    const search: QualitySearch = async (query) => {
      const res = await artist.get(`/api/search?q=${encodeURIComponent(query)}`);
      if (!res.ok) throw new Error(`GET /api/search answered ${res.status} for "${query}": ${await res.text()}`);
      const answer = (await res.json()) as SearchResponse;
      took.push(answer.tookMs);
      topFor.set(query, answer.results.slice(0, 3));
      return answer;
    };
    const queries = set.queries.map((q) => ({ ...q, expected: slugOf.get(q.expected) ?? `(not added: ${q.expected})` }));
    const judge = await hunspellJudge(set.pages);
    // Unseen queries are held out: their misses are counted, never listed (nothing may be tuned on them).
    const report = await evaluateQuality(search, queries, judge, () => true);
    if (set.listMisses)
      for (const q of queries)
        if (firstFor(q.query) !== q.expected) {
          const top = (topFor.get(q.query) ?? []).map((r) => `${r.title} [${r.slug}] ${r.score.toFixed(2)}${r.isHouseMethod ? " H" : ""} ${r.matches.map((m) => m.field).join(",")}`);
          console.log(`[${q.kind}] ${q.query}\n  expected ${q.expected}; got ${top.join(" | ") || "nothing"}`);
        }
    const round = (v: number) => Math.round(v * 100) / 100;
    const ofSet = new Set(slugOf.values());
    const notFirst = { toPageOfSet: 0, toDemoPage: 0, nothingFound: 0 };
    for (const q of queries) {
      const first = firstFor(q.query);
      if (first === q.expected) continue;
      if (first === undefined) notFirst.nothingFound++;
      else if (ofSet.has(first)) notFirst.toPageOfSet++;
      else notFirst.toDemoPage++;
    }
    return {
      name: set.name,
      pagesAdded: slugOf.size,
      queries: queries.length,
      all: report.all,
      realWordsCorrected: report.realWordsCorrected,
      tookMs: { p50: round(percentile(took, 50)), p95: round(percentile(took, 95)), max: round(Math.max(...took)) },
      addPageMs: { p50: Math.round(percentile(addMs, 50)), max: Math.round(Math.max(...addMs)) },
      notFirst,
    };
  } finally {
    await app.stop();
  }
}

// PLATEROOM_SEARCH_MEANING=off for the run measures the engine alone (the app reads it from this environment).
const ranking = process.env.PLATEROOM_SEARCH_MEANING === "off" ? "by words alone" : "by words, then meaning";
const results: SetResult[] = [];
for (const set of SETS) {
  const r = await runSet(set);
  console.log(`\n${r.name}: ${r.pagesAdded} pages added to the demo through the API, ${r.queries} queries as an artist (ranked ${ranking})`);
  console.table(r.all);
  console.log(`not first: ${r.notFirst.toPageOfSet} behind another page of the set, ${r.notFirst.toDemoPage} behind a demo page, ${r.notFirst.nothingFound} with nothing found`);
  console.log(`correctly spelt words "corrected": ${r.realWordsCorrected.count} of ${r.realWordsCorrected.wordsChecked}; tookMs p50 ${r.tookMs.p50}, p95 ${r.tookMs.p95}, max ${r.tookMs.max}; a page added in ${r.addPageMs.p50} ms (max ${r.addPageMs.max})`);
  results.push(r);
}
if (!TUNING) writeResultsKey("searchLive", {
  date: new Date().toISOString(),
  ranking,
  method: `each unseen page set added to a fresh copy of the seeded demo through the HTTP API (tags by the lead, pages by the senior, approved${SET_METHODS ? " and made department methods" : " (none made a department method: --no-methods)"} by the lead), then every query once as the artist through GET /api/search`,
  sets: results,
});
