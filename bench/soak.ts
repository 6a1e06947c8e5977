/*
 * Soak benchmark (issue 19): SOAK_DURATION (600) seconds at SOAK_CONNECTIONS (50) connections
 * against `next start` of the production build, each connection cycling through a technique page
 * rendered on every request (the page cache's render request, so nothing is answered from
 * memory), a search whose words change every request (past the search memo) and a still
 * preview. The server's resident memory (its process tree, /proc) is sampled every 5 s; the
 * result is the memory slope after warm-up, as a whole and per third, in MB per minute.
 * "Levels off" means the last third's slope is near zero while the first third's may still
 * climb. Run: npx tsx -C react-server bench/soak.ts. Writes the key "soak" of bench/results.json.
 */
import os from "node:os";
import autocannon from "autocannon";
import { apiClient, createApiToken, signInCookie } from "@/bench/lib/http-client";
import { slopeMbPerMinute, treeRss } from "@/bench/lib/process-memory";
import { percentile, writeResultsKey } from "@/bench/lib/results";
import { RENDER_HEADER } from "@/lib/page-cache/headers";
import { DEMO_PASSWORD, startApp } from "@/tests/e2e/harness";

const DURATION = Number(process.env.SOAK_DURATION ?? 600);
const CONNECTIONS = Number(process.env.SOAK_CONNECTIONS ?? 50);
const WARM_UP_S = Math.min(60, Math.round(DURATION / 10));
const SAMPLE_MS = 5000;
const TECHNIQUE = "marker-channel-cleanup";
const WORDS = ["marker", "markrs", "tracking", "wire", "rig", "dust", "grain", "sky", "screen", "uneven", "blue", "green", "crosses", "dots", "reflection", "boom"];

const app = await startApp();
try {
  const cookie = await signInCookie(app.baseUrl, "senior@kestrel.test", DEMO_PASSWORD);
  const token = await createApiToken(app.baseUrl, "senior@kestrel.test", DEMO_PASSWORD, "soak benchmark");
  const api = apiClient(app.baseUrl, token);
  const pairs = await api.json<{ items: { before: { id: string } }[] }>("GET", `/api/stills/pairs?technique=${TECHNIQUE}`);
  const stillId = pairs.body.items[0]?.before.id;
  if (!stillId) throw new Error(`no still pair on ${TECHNIQUE}`);

  const page = { method: "GET" as const, path: `/techniques/${TECHNIQUE}`, headers: { cookie, accept: "text/html", "sec-fetch-dest": "document", "sec-fetch-mode": "navigate", [RENDER_HEADER]: "1" } };
  let n = 0;
  const search = {
    method: "GET" as const,
    path: "/api/search",
    headers: { authorization: `Bearer ${token}` },
    // A new query every time: two words of the list, so the memo of identical searches never answers.
    setupRequest: (req: { path: string }) => {
      n++;
      req.path = `/api/search?q=${WORDS[n % WORDS.length]}%20${WORDS[(n * 7 + 3) % WORDS.length]}&offset=${n % 3}`;
      return req;
    },
  };
  const preview = { method: "GET" as const, path: `/api/stills/${stillId}/preview`, headers: { authorization: `Bearer ${token}` } };

  const loadavgAtStart = os.loadavg();
  const started = Date.now();
  const memory: [number, number][] = [];
  const sampler = setInterval(() => memory.push([(Date.now() - started) / 1000, treeRss(app.pid)]), SAMPLE_MS);
  memory.push([0, treeRss(app.pid)]);
  const latencies: number[] = [];
  const instance = autocannon({ url: app.baseUrl, connections: CONNECTIONS, duration: DURATION, timeout: 30, requests: [page, search, preview] });
  instance.on("response", (_c: unknown, _s: number, _b: number, ms: number) => latencies.push(ms));
  const r = await instance;
  clearInterval(sampler);
  memory.push([(Date.now() - started) / 1000, treeRss(app.pid)]);

  const steady = memory.filter(([t]) => t >= WARM_UP_S);
  const third = Math.floor(steady.length / 3);
  const mb = (b: number) => Math.round(b / (1024 * 1024));
  const result = {
    measuredAt: new Date().toISOString(),
    machine: { cpus: os.cpus().length, node: process.version, loadavgAtStart, loadavgAtEnd: os.loadavg() },
    settings: { durationSeconds: DURATION, connections: CONNECTIONS, warmUpSeconds: WARM_UP_S, sampleSeconds: SAMPLE_MS / 1000, mix: ["technique page rendered (no page cache)", "search, a new query each time", "still preview"] },
    requests: r.requests.total,
    requestsPerSec: Math.round(r.requests.average * 10) / 10,
    p50: percentile(latencies, 50),
    p95: percentile(latencies, 95),
    errors: r.errors,
    timeouts: r.timeouts,
    non2xx: r.non2xx,
    memoryMB: { start: mb(memory[0]![1]), afterWarmUp: mb(steady[0]?.[1] ?? 0), end: mb(memory.at(-1)![1]), max: mb(Math.max(...memory.map(([, b]) => b))) },
    slopeMBPerMinute: {
      afterWarmUp: slopeMbPerMinute(steady),
      firstThird: slopeMbPerMinute(steady.slice(0, third)),
      middleThird: slopeMbPerMinute(steady.slice(third, 2 * third)),
      lastThird: slopeMbPerMinute(steady.slice(2 * third)),
    },
    samples: memory.map(([t, b]) => [Math.round(t), mb(b)]),
    notes: [
      "Resident memory of the server's process tree from /proc, every 5 s; slopes are least-squares fits (simple-statistics linearRegression) in MB per minute.",
      "The load generator runs on the same 2 cores as the server, beside other sessions' work: see the load averages.",
    ],
  };
  writeResultsKey("soak", result);
  console.log(`\nSoak: ${CONNECTIONS} connections × ${DURATION} s (load average at start ${loadavgAtStart.map((x) => x.toFixed(1)).join(" ")})`);
  console.table([{ requests: result.requests, "req/s": result.requestsPerSec, p95: result.p95, errors: r.errors + r.timeouts, non2xx: r.non2xx, ...result.memoryMB }]);
  console.table(result.slopeMBPerMinute);
} finally {
  await app.stop();
}
