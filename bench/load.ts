/*
 * Load benchmark (issue 9). Run: npx tsx bench/load.ts
 * autocannon on loopback against the built app (tests/e2e/harness.ts builds it into
 * PLATEROOM_DIST_DIR and starts it on a free port with a copy of the seeded data): the
 * technique page, search and a still preview, LOAD_CONNECTIONS (50) connections for
 * LOAD_DURATION (30) seconds each, signed in as the demo senior. Writes the key "load" of
 * bench/results.json and prints a table. Target: p95 < 150 ms for the page and search.
 * /api/health (no session, one `select 1`) is measured last the same way: what a route that
 * reads the database once costs on this machine.
 */
import os from "node:os";
import autocannon from "autocannon";
import { apiClient, createApiToken, signInCookie } from "@/bench/lib/http-client";
import { percentile, writeResultsKey } from "@/bench/lib/results";
import { CACHE_STATUS_HEADER, RENDER_HEADER } from "@/lib/page-cache/headers";
import { DEMO_PASSWORD, startApp } from "@/tests/e2e/harness";

const DURATION = Number(process.env.LOAD_DURATION ?? 30);
const CONNECTIONS = Number(process.env.LOAD_CONNECTIONS ?? 50);
const TARGET_P95_MS = 150;
const TECHNIQUE = "marker-channel-cleanup";
const SEARCH = "/api/search?q=trakcing%20markrs";

type Measured = {
  path: string;
  requestsPerSec: number;
  requests: number;
  /** Latency of every answer (any status), ms, nearest rank. */
  p50: number;
  p95: number;
  p99: number;
  max: number;
  errors: number;
  timeouts: number;
  non2xx: number;
  statusCodes: Record<string, number>;
  bytesPerSec: number;
  targetP95Ms?: number;
  metTarget?: boolean;
};
type Skipped = { path: string; skipped: string };

async function warm(url: string, headers: Record<string, string>, n = 10): Promise<number> {
  let status = 0;
  for (let i = 0; i < n; i++) {
    const res = await fetch(url, { headers, redirect: "manual" });
    await res.arrayBuffer();
    status = res.status;
  }
  return status;
}

async function hammer(baseUrl: string, path: string, headers: Record<string, string>): Promise<Measured> {
  const latencies: number[] = [];
  const instance = autocannon({ url: `${baseUrl}${path}`, connections: CONNECTIONS, duration: DURATION, headers, timeout: 20 });
  // autocannon's own percentiles skip p95 (it reports p90 and p97.5), so every answer's time is kept.
  instance.on("response", (_client: unknown, _status: number, _bytes: number, ms: number) => latencies.push(ms));
  const r = await instance;
  const round = (x: number) => Math.round(x * 10) / 10;
  return {
    path,
    requestsPerSec: round(r.requests.average),
    requests: r.requests.total,
    p50: round(percentile(latencies, 50)),
    p95: round(percentile(latencies, 95)),
    p99: round(percentile(latencies, 99)),
    max: round(Math.max(...latencies)),
    errors: r.errors,
    timeouts: r.timeouts,
    non2xx: r.non2xx,
    statusCodes: Object.fromEntries(Object.entries(r.statusCodeStats ?? {}).map(([k, v]) => [k, v.count])),
    bytesPerSec: Math.round(r.throughput.average),
  };
}

const app = await startApp();
try {
  const cookie = await signInCookie(app.baseUrl, "senior@kestrel.test", DEMO_PASSWORD);
  const token = await createApiToken(app.baseUrl, "senior@kestrel.test", DEMO_PASSWORD, "load benchmark");
  const api = apiClient(app.baseUrl, token);
  const results: Record<string, Measured | Skipped> = {};
  const loadavgAtStart = os.loadavg();

  const pagePath = `/techniques/${TECHNIQUE}`;
  const pageStatus = await warm(`${app.baseUrl}${pagePath}`, { cookie });
  if (pageStatus !== 200) throw new Error(`${pagePath} answered ${pageStatus} when warming up`);
  // A browser's navigation (W3C Fetch Metadata): only those may be answered from the page cache.
  const navigation = { cookie, accept: "text/html", "sec-fetch-dest": "document", "sec-fetch-mode": "navigate" };
  results.page = { ...(await hammer(app.baseUrl, pagePath, navigation)), targetP95Ms: TARGET_P95_MS };
  const answeredBy = (await fetch(`${app.baseUrl}${pagePath}`, { headers: navigation })).headers.get(CACHE_STATUS_HEADER);
  if (answeredBy !== "hit") throw new Error(`${pagePath} was not answered from the page cache after the run (${answeredBy})`);
  // Context, not a target: the same page rendered every time (the page cache's render request).
  results.pageRendered = await hammer(app.baseUrl, pagePath, { ...navigation, [RENDER_HEADER]: "1" });

  const searchStatus = await warm(`${app.baseUrl}${SEARCH}`, { authorization: `Bearer ${token}` });
  if (searchStatus === 404) results.search = { path: SEARCH, skipped: "GET /api/search answered 404: not built yet" };
  else results.search = { ...(await hammer(app.baseUrl, SEARCH, { authorization: `Bearer ${token}` })), targetP95Ms: TARGET_P95_MS };

  const pairs = await api.json<{ items: { before: { id: string } }[] }>("GET", `/api/stills/pairs?technique=${TECHNIQUE}`);
  const stillId = pairs.body.items[0]?.before.id;
  if (!stillId) results.preview = { path: "/api/stills/{id}/preview", skipped: `no still pair on ${TECHNIQUE} (status ${pairs.status})` };
  else {
    const previewPath = `/api/stills/${stillId}/preview`;
    await warm(`${app.baseUrl}${previewPath}`, { authorization: `Bearer ${token}` });
    results.preview = await hammer(app.baseUrl, previewPath, { authorization: `Bearer ${token}` });
  }

  // Reference: a route with no session that reads the database once (`select 1`).
  results.health = await hammer(app.baseUrl, "/api/health", {});

  for (const m of Object.values(results)) if ("p95" in m && m.targetP95Ms) m.metTarget = m.p95 < m.targetP95Ms;
  writeResultsKey("load", {
    measuredAt: new Date().toISOString(),
    machine: { cpus: os.cpus().length, node: process.version, loadavgAtStart, loadavgAtEnd: os.loadavg() },
    settings: { connections: CONNECTIONS, durationSeconds: DURATION, targetP95Ms: TARGET_P95_MS, auth: "page: session cookie; api: bearer token (demo senior)" },
    notes: [
      "autocannon 9 on loopback against `next start` of a production build, one target at a time; the load generator shares the machine's cores with the server.",
      "p50/p95/p99/max: nearest-rank percentiles over every answer's latency in ms (autocannon reports no p95).",
      "requestsPerSec: autocannon's mean of per-second counts.",
      "page: one signed-in person reloading a technique page; after the first render it is answered from the page cache (lib/page-cache), checked by its x-plateroom-page-cache header. pageRendered: the same page rendered on every request, for context.",
      "search: repeated identical queries are answered from the search memo until the index changes (lib/search-ui/run.ts).",
    ],
    targets: results,
  });

  const rows = Object.entries(results).map(([name, m]) =>
    "skipped" in m
      ? { target: name, path: m.path, "req/s": "-", p50: "-", p95: "-", p99: "-", errors: "-", non2xx: "-", note: `skipped: ${m.skipped}` }
      : { target: name, path: m.path, "req/s": m.requestsPerSec, p50: m.p50, p95: m.p95, p99: m.p99, errors: m.errors + m.timeouts, non2xx: m.non2xx, note: m.targetP95Ms ? (m.metTarget ? `p95 < ${m.targetP95Ms} ms: met` : `p95 < ${m.targetP95Ms} ms: NOT met`) : "" },
  );
  console.log(`\nLoad: ${CONNECTIONS} connections × ${DURATION} s per target (load average at start ${loadavgAtStart.map((x) => x.toFixed(1)).join(" ")})`);
  console.table(rows);
} finally {
  await app.stop();
}
