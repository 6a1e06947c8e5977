/**
 * Search benchmark (issue 6): `npx tsx bench/search.ts` (add `--quick` for 1k/10k only).
 *
 * For 1,000, 10,000 and 50,000 synthetic techniques (bench/lib/corpus.ts) with the quality fixture
 * embedded: index build time, retained memory, query latency p50/p95 over a fixed misspelt query set,
 * plain fuse.js over the same corpus in the same run, top-3 quality, and update-visible latency.
 * Writes the key "search" of bench/results.json. Node's default heap (≈4 GB on this machine) is
 * enough; on a smaller box run with NODE_OPTIONS=--max-old-space-size=3072.
 */
import os from "node:os";
import { setFlagsFromString } from "node:v8";
import { runInNewContext } from "node:vm";

import Fuse from "fuse.js";

import { createSearchIndex } from "@/lib/search/engine";
import type { SearchDocument } from "@/lib/search/types";
import { FIXTURE_DOCS, QUALITY_QUERIES } from "@/tests/unit/search/fixtures";

import { syntheticCorpus, syntheticQueries } from "./lib/corpus";
import { percentile, writeResultsKey } from "./lib/results";

// Expose gc without needing a node flag, so memory is measured after collection.
setFlagsFromString("--expose-gc");
const gc = runInNewContext("gc") as () => void;
const heapMB = (): number => {
  gc();
  gc();
  return process.memoryUsage().heapUsed / 1_048_576;
};

const SIZES = process.argv.includes("--quick") ? [1_000, 10_000] : [1_000, 10_000, 50_000];
const REPEATS = 3;
// fuse.js takes seconds per query at 10k+; it is timed on a fixed sample of the same queries.
const FUSE_SAMPLE: Record<number, number> = { 1_000: 20, 10_000: 12, 50_000: 6 };

type Row = {
  size: number;
  buildMs: number;
  buildCpuMs: number;
  memoryMB: number;
  structuresMB: number;
  queries: number;
  p50: number;
  p95: number;
  max: number;
  /** Process CPU ms per query: shows how much of the wall time was waiting for a shared core. */
  cpuP50: number;
  cpuP95: number;
  fuseQueries: number;
  fuseP50: number;
  fuseP95: number;
  oursOnFuseSampleP50: number;
  oursOnFuseSampleP95: number;
  speedupP50: number;
  speedupP95: number;
  quality: string;
  qualityMisses: string[];
  updateP50: number;
  updateP95: number;
  updateMax: number;
  updateCpuP95: number;
};

function corpusOf(size: number) {
  const synthetic = syntheticCorpus(size - FIXTURE_DOCS.length);
  const fixture = FIXTURE_DOCS.map((d) => ({ techniqueId: d.techniqueId, published: d, working: null as SearchDocument | null }));
  // Spread the fixture through the corpus so it is not all at the lowest internal ids.
  const out = [...synthetic];
  fixture.forEach((f, i) => out.splice(Math.floor(((i + 1) * out.length) / (fixture.length + 1)), 0, f));
  return out;
}

function time<T>(fn: () => T): [T, number] {
  const t0 = performance.now();
  const v = fn();
  return [v, performance.now() - t0];
}

function runSize(size: number): Row {
  const base = heapMB();
  let corpus: ReturnType<typeof corpusOf> | null = corpusOf(size);
  const withDocs = heapMB();
  const index = createSearchIndex();
  const buildCpu0 = process.cpuUsage();
  const [, buildMs] = time(() => index.load(corpus ?? []));
  const buildCpu = process.cpuUsage(buildCpu0);
  const withIndex = heapMB();
  const queries = [...QUALITY_QUERIES.map((q) => q.query), ...syntheticQueries(corpus, 40)];
  const publishedDocs = corpus.flatMap((e) => (e.published && e.published.status !== "retired" ? [e.published] : []));
  corpus = null;
  // Everything the index retains, document text included (the loader's arrays are gone by now).
  const memoryMB = heapMB() - base;
  const structuresMB = withIndex - withDocs;

  // Warm up, then time every query REPEATS times.
  for (const q of queries) index.search(q, { audience: "published" });
  const lat: number[] = [];
  const cpu: number[] = [];
  const perQuery = new Map<string, number[]>();
  for (let rep = 0; rep < REPEATS; rep++) {
    for (const q of queries) {
      const c0 = process.cpuUsage();
      const [, ms] = time(() => index.search(q, { audience: "published", limit: 20 }));
      const c1 = process.cpuUsage(c0);
      cpu.push((c1.user + c1.system) / 1000);
      lat.push(ms);
      perQuery.set(q, [...(perQuery.get(q) ?? []), ms]);
    }
  }

  const misses: string[] = [];
  for (const q of QUALITY_QUERIES) {
    const top = index.search(q.query, { audience: "published", limit: 3 }).results.map((r) => r.slug);
    if (!top.includes(q.expected)) misses.push(`${q.query} → ${top.join(", ")}`);
  }

  // Update-visible latency: write a new version with a fresh word, then search until it is found.
  const updates: number[] = [];
  const updatesCpu: number[] = [];
  const sample = publishedDocs.filter((_, i) => i % Math.max(1, Math.floor(publishedDocs.length / 30)) === 0).slice(0, 30);
  sample.forEach((d, i) => {
    const marker = `zephyrine${i}`;
    const u0 = process.cpuUsage();
    const [found, ms] = time(() => {
      index.upsert(d.techniqueId, { published: { ...d, title: `${d.title} ${marker}` }, working: null });
      return index.search(marker, { audience: "published" }).results[0]?.slug;
    });
    const u1 = process.cpuUsage(u0);
    if (found !== d.slug) throw new Error(`update not visible for ${d.slug}`);
    updates.push(ms);
    updatesCpu.push((u1.user + u1.system) / 1000);
    const [, removeMs] = time(() => {
      index.remove(d.techniqueId);
      if (index.search(marker, { audience: "published" }).total !== 0) throw new Error("removal not visible");
    });
    updates.push(removeMs);
    index.upsert(d.techniqueId, { published: d, working: null });
  });

  // Plain fuse.js over the same published documents: every field but the body (with it fuse is ~10× slower).
  const fuseN = Math.min(FUSE_SAMPLE[size] ?? 6, queries.length);
  const fuseQueries = [...queries.slice(0, Math.ceil(fuseN / 2)), ...queries.slice(QUALITY_QUERIES.length, QUALITY_QUERIES.length + Math.floor(fuseN / 2))];
  const fuse = new Fuse(publishedDocs, {
    keys: ["title", "aliases", "tags.name", "tags.aliases", "summary", "parameterNames", "shotCodes"],
    includeScore: true,
    includeMatches: true,
    ignoreLocation: true,
    threshold: 0.4,
  });
  fuse.search(fuseQueries[0] ?? "", { limit: 20 });
  const fuseLat: number[] = [];
  for (const q of fuseQueries) fuseLat.push(time(() => fuse.search(q, { limit: 20 }))[1]);
  const oursSample = fuseQueries.flatMap((q) => perQuery.get(q) ?? []);

  const r2 = (v: number): number => Math.round(v * 100) / 100;
  const row: Row = {
    size,
    buildMs: Math.round(buildMs),
    buildCpuMs: Math.round((buildCpu.user + buildCpu.system) / 1000),
    memoryMB: Math.round(memoryMB),
    structuresMB: Math.round(structuresMB),
    queries: queries.length,
    p50: r2(percentile(lat, 50)),
    p95: r2(percentile(lat, 95)),
    max: r2(Math.max(...lat)),
    cpuP50: r2(percentile(cpu, 50)),
    cpuP95: r2(percentile(cpu, 95)),
    fuseQueries: fuseQueries.length,
    fuseP50: Math.round(percentile(fuseLat, 50)),
    fuseP95: Math.round(percentile(fuseLat, 95)),
    oursOnFuseSampleP50: r2(percentile(oursSample, 50)),
    oursOnFuseSampleP95: r2(percentile(oursSample, 95)),
    speedupP50: Math.round(percentile(fuseLat, 50) / percentile(oursSample, 50)),
    speedupP95: Math.round(percentile(fuseLat, 95) / percentile(oursSample, 95)),
    quality: `${QUALITY_QUERIES.length - misses.length}/${QUALITY_QUERIES.length}`,
    qualityMisses: misses,
    updateP50: r2(percentile(updates, 50)),
    updateP95: r2(percentile(updates, 95)),
    updateMax: r2(Math.max(...updates)),
    updateCpuP95: r2(percentile(updatesCpu, 95)),
  };
  console.error(`  ${size}: done`);
  return row;
}

const started = performance.now();
const loadAverageAtStart = os.loadavg().map((v) => Math.round(v * 10) / 10);
const rows: Row[] = [];
for (const size of SIZES) rows.push(runSize(size));

console.log("\nSearch benchmark (ms unless noted)");
console.table(
  rows.map((r) => ({
    size: r.size,
    "build ms (cpu)": `${r.buildMs} (${r.buildCpuMs})`,
    "memory MB": r.memoryMB,
    p50: r.p50,
    p95: r.p95,
    max: r.max,
    "cpu p50/p95": `${r.cpuP50}/${r.cpuP95}`,
    "fuse p50/p95": `${r.fuseP50}/${r.fuseP95} (n=${r.fuseQueries})`,
    "speed-up p50/p95": `${r.speedupP50}×/${r.speedupP95}×`,
    "top-3": r.quality,
    "update p95/max": `${r.updateP95}/${r.updateMax}`,
    "update cpu p95": r.updateCpuP95,
  })),
);
const at = (n: number) => rows.find((r) => r.size === n);
const targets = {
  p95At10kUnder25ms: at(10_000) ? (at(10_000) as Row).p95 < 25 : null,
  p95At50kUnder100ms: at(50_000) ? (at(50_000) as Row).p95 < 100 : null,
  speedupAt10kAtLeast50x: at(10_000) ? (at(10_000) as Row).speedupP50 >= 50 && (at(10_000) as Row).speedupP95 >= 50 : null,
  memoryAt50kUnder300MB: at(50_000) ? (at(50_000) as Row).memoryMB < 300 : null,
  updateVisibleUnder50ms: rows.every((r) => r.updateMax < 50),
  top3QualityAtEverySize: rows.every((r) => r.qualityMisses.length === 0),
};
console.log("targets", targets);
writeResultsKey("search", {
  measuredAt: new Date().toISOString(),
  machine: { cpus: os.cpus().length, node: process.version, loadAverageAtStart, loadAverageAtEnd: os.loadavg().map((v) => Math.round(v * 10) / 10) },
  notes: [
    `p50/p95/max wall ms over every query of the fixed set (${QUALITY_QUERIES.length} junior quality queries + 40 misspelt synthetic title queries), run ${REPEATS} times after a warm-up; audience published, limit 20. cpuP50/cpuP95: process CPU ms for the same calls.`,
    "synthetic techniques cover other problems than the quality fixture (see bench/lib/corpus.ts) but share plate tags and trade vocabulary.",
    "fuse.js 7.5 timed on a fixed sample of the same queries (fuseQueries) over title, aliases, tag names/aliases, summary, parameter names and shot codes (no body); speed-up compares with our latency on that same sample.",
    "memoryMB: heap retained after gc with the loader's arrays dropped (document text the index keeps included); structuresMB: heap growth from building the index while the documents were held elsewhere.",
    "update: upsert of a changed title then a search finding it, and remove then a search not finding it; 30 of each.",
  ],
  targets,
  rows,
  totalSeconds: Math.round((performance.now() - started) / 1000),
});
