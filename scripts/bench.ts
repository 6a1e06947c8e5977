/*
 * `npm run bench`: the still lab, search (in-process, then through the running demo), plate check, load, oversized-body, password-reset timing and soak
 * benchmarks in turn, each in its own process (so one's heap, worker threads and server do not
 * weigh on the next), then one summary from bench/results.json. Names after `--` run only those
 * steps: `npm run bench -- technique-page` (the uncached technique-page row alone). `npm run bench -- --quick` passes
 * --quick to lab and search, runs the load targets for 10 s with 20 connections, 40 reset pairs
 * and a 60 s soak; LOAD_DURATION / LOAD_CONNECTIONS, RESET_PAIRS, SOAK_DURATION / SOAK_CONNECTIONS override.
 */
import { spawnSync } from "node:child_process";
import fs from "node:fs";
import path from "node:path";
import { RESULTS_PATH } from "@/bench/lib/results";

const root = process.cwd();
const tsx = path.join(root, "node_modules", ".bin", "tsx");
const quick = process.argv.includes("--quick");
// `npm run bench -- technique-page soak`: only the named steps (each also runs alone with tsx).
const only = process.argv.slice(2).filter((a) => !a.startsWith("--"));

// Every script runs with the react-server condition, as `npm run bench` itself does: lib modules
// import "server-only", which resolves to an empty module only under it.
const steps: { name: string; script: string; args: string[]; env?: Record<string, string> }[] = [
  { name: "lab", script: "bench/lab.ts", args: quick ? ["--quick"] : [] },
  { name: "exr", script: "bench/exr.ts", args: quick ? ["--quick"] : [] },
  { name: "search", script: "bench/search.ts", args: quick ? ["--quick"] : [] },
  { name: "search-live", script: "bench/search-live.ts", args: [] },
  { name: "technique-page", script: "bench/technique-page.ts", args: [], env: quick ? { PAGE_DURATION: process.env.PAGE_DURATION ?? "10" } : {} },
  { name: "plate-check", script: "bench/plate-check.ts", args: quick ? ["--quick"] : [] },
  { name: "load", script: "bench/load.ts", args: [], env: quick ? { LOAD_DURATION: process.env.LOAD_DURATION ?? "10", LOAD_CONNECTIONS: process.env.LOAD_CONNECTIONS ?? "20" } : {} },
  { name: "bodies", script: "bench/bodies.ts", args: [] },
  { name: "reset-timing", script: "bench/reset-timing.ts", args: [], env: quick ? { RESET_PAIRS: process.env.RESET_PAIRS ?? "40" } : {} },
  { name: "soak", script: "bench/soak.ts", args: [], env: quick ? { SOAK_DURATION: process.env.SOAK_DURATION ?? "60", SOAK_CONNECTIONS: process.env.SOAK_CONNECTIONS ?? "20" } : {} },
];

// A child inherits the -C react-server of `npm run bench`'s tsx only through NODE_OPTIONS, which
// is cleared so each script runs exactly as it does on its own.
const { NODE_OPTIONS: _nodeOptions, ...baseEnv } = process.env;
const unknown = only.filter((name) => !steps.some((step) => step.name === name));
if (unknown.length) throw new Error(`No benchmark named ${unknown.join(", ")}; there are: ${steps.map((step) => step.name).join(", ")}`);
const outcomes: { name: string; status: number | null; seconds: number }[] = [];
for (const step of steps.filter((st) => !only.length || only.includes(st.name))) {
  console.log(`\n=== ${step.name}: tsx -C react-server ${step.script} ${step.args.join(" ")}`);
  const started = Date.now();
  const r = spawnSync(tsx, ["-C", "react-server", step.script, ...step.args], { cwd: root, stdio: "inherit", env: { ...baseEnv, ...step.env } });
  outcomes.push({ name: step.name, status: r.status, seconds: Math.round((Date.now() - started) / 1000) });
}

type Json = Record<string, unknown>;
const results = (fs.existsSync(RESULTS_PATH) ? JSON.parse(fs.readFileSync(RESULTS_PATH, "utf8")) : {}) as Record<string, Json | undefined>;
const get = (o: unknown, ...keys: (string | number)[]): unknown => keys.reduce<unknown>((v, k) => (v && typeof v === "object" ? (v as Record<string, unknown>)[k] : undefined), o);
const fmt = (v: unknown, digits = 1): string => (typeof v === "number" ? v.toFixed(digits) : v === undefined ? "-" : String(v));

console.log("\n=== Summary (bench/results.json)");
console.table(outcomes.map((o) => ({ benchmark: o.name, exit: o.status, seconds: o.seconds })));

const lab = results.lab;
if (lab) {
  const sizes = (get(lab, "sizes") ?? {}) as Record<string, Json>;
  console.log("Still lab: full demo recipe");
  console.table(
    Object.entries(sizes).map(([size, s]) => ({
      size, "steps ms": fmt(s.recipeStepsMs, 0), "exact ms": fmt(s.recipeExactMs, 0), "exact + flatten σ40 ms": fmt(s.recipeFlattenExactMs, 0),
      "proxy ms": fmt(s.proxyMs, 0), "float copy ms": fmt(s.copyMs, 2),
    })),
  );
  const targets = get(lab, "targets");
  if (targets) console.log("Still lab targets:", targets);
}

const exr = results.exr;
if (exr) {
  console.log(`OpenEXR decode (load average ${fmt(get(exr, "loadAverage", "before", 0), 2)})`);
  console.table(((get(exr, "decode") ?? []) as Json[]).map((r) => ({ size: r.size, compression: r.compression, "decode ms": r.decodeMs, "float copy ms": r.copyMs, "× copy": r.ratio })));
  console.log("4K OpenEXR upload:", get(exr, "upload4k"));
}

const plate = results.plateCheck;
if (plate) {
  console.log(`Plate check (load average ${fmt(get(plate, "loadAverage", "before", 0), 2)} → ${fmt(get(plate, "loadAverage", "after", 0), 2)})`);
  console.table(((get(plate, "check") ?? []) as Json[]).map((r) => ({ size: r.size, "check ms": r.checkMs, "cpu ms": r.checkCpuMs, "copy ms": r.copyMs, "× copy": r.ratio, "with decode ms": r.withDecodeMs })));
  console.log("Plate check targets:", get(plate, "targets"));
}

const search = results.search;
if (search) {
  const rows = (get(search, "rows") ?? []) as Json[];
  console.log("Search");
  // What the product serves is words then meaning; the words-alone engine is beside it.
  console.table(
    rows.map((r) => ({
      techniques: r.size,
      "build ms": r.buildMs,
      "p50 / p95 ms": `${fmt(r.meaningP50)} / ${fmt(r.meaningP95)}`,
      "words alone p50 / p95 ms": `${fmt(r.p50)} / ${fmt(r.p95)}`,
      "fuse p50 ms": r.fuseP50,
      "memory MB": r.memoryMB,
      quality: r.quality,
    })),
  );
  const targets = get(search, "targets");
  if (targets) console.log("Search targets:", targets);
}

const searchLive = results.searchLive;
if (searchLive) {
  console.log(`Search through the running demo (unseen page sets added through the API, ranked ${fmt(get(searchLive, "ranking"))}; top-1 / top-3 %)`);
  const sets = (get(searchLive, "sets") ?? []) as Json[];
  const kinds = (s: Json) => Object.fromEntries(((s.all ?? []) as Json[]).map((k) => [String(k.kind), `${fmt(k.top1)} / ${fmt(k.top3)}`]));
  console.table(sets.map((s) => ({ set: s.name, ...kinds(s), "tookMs p50/p95": `${fmt(get(s, "tookMs", "p50"))} / ${fmt(get(s, "tookMs", "p95"))}` })));
}

const page = results.techniquePage;
if (page) {
  const la = (k: string) => ((get(page, "machine", k) ?? []) as number[]).map((x) => x.toFixed(1)).join(" ");
  console.log(`Technique page rendered every request (${fmt(get(page, "settings", "connections"), 0)} connections × ${fmt(get(page, "settings", "durationSeconds"), 0)} s; load average ${la("loadavgAtStart")} → ${la("loadavgAtEnd")})`);
  console.table([{ "req/s": page.requestsPerSec, "p50 ms": page.p50, "p95 ms": page.p95, errors: page.errors, "of which time-outs": page.timeouts, non2xx: page.non2xx, "≥ 100 req/s": page.metTarget ? "met" : "not met" }]);
}

const load = results.load;
if (load) {
  const targets = (get(load, "targets") ?? {}) as Record<string, Json>;
  console.log(`Load (${fmt(get(load, "settings", "connections"), 0)} connections × ${fmt(get(load, "settings", "durationSeconds"), 0)} s)`);
  console.table(
    Object.entries(targets).map(([name, t]) =>
      t.skipped ? { target: name, "req/s": "-", "p50 ms": "-", "p95 ms": "-", "p99 ms": "-", errors: "-", non2xx: "-", "p95 target": `skipped: ${String(t.skipped)}` }
        : { target: name, "req/s": t.requestsPerSec, "p50 ms": t.p50, "p95 ms": t.p95, "p99 ms": t.p99, errors: Number(t.errors) + Number(t.timeouts), non2xx: t.non2xx, "p95 target": t.targetP95Ms ? (t.metTarget ? "met" : "not met") : "" },
    ),
  );
}

const bodies = results.bodies;
if (bodies) {
  console.log("Oversized bodies (server memory, MB)");
  console.table(["streamed", "declared"].map((k) => ({ round: k, ...(get(bodies, k) as Json) })));
}

const reset = results.resetTiming;
if (reset) {
  console.log(`Password-reset timing (${fmt(get(reset, "pairs"), 0)} known and unknown addresses each)`);
  console.table({ known: get(reset, "knownMs"), unknown: get(reset, "unknownMs") });
  console.log(`median difference ${fmt(get(reset, "medianDifferenceMs"), 2)} ms, permutation test p = ${fmt(get(reset, "permutationTestP"), 2)}`);
}

const soak = results.soak;
if (soak) {
  console.log(`Soak (${fmt(get(soak, "settings", "connections"), 0)} connections × ${fmt(get(soak, "settings", "durationSeconds"), 0)} s): memory MB`, get(soak, "memoryMB"));
  console.log("Memory slope, MB per minute:", get(soak, "slopeMBPerMinute"));
  console.log(`Verdict: ${fmt(get(soak, "verdict"))}; load average ${fmt(get(soak, "machine", "loadavgAtStart"))} → ${fmt(get(soak, "machine", "loadavgAtEnd"))}`);
}

process.exitCode = outcomes.every((o) => o.status === 0) ? 0 : 1;
