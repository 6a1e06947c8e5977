/*
 * Technique-page throughput, uncached (issue 19). Run alone:
 *   npm run bench -- technique-page        (or: npx tsx -C react-server bench/technique-page.ts)
 * autocannon at PAGE_CONNECTIONS (50) connections for PAGE_DURATION (30) s against `next start`
 * of the production build (tests/e2e/harness.ts), signed in as the demo senior, every request
 * carrying the page cache's render header so each one is a full server render (the page cache in
 * proxy.ts never answers). Target: ≥ 100 requests/s. PAGE_PROFILE=1 also writes a V8 CPU profile
 * of the server to bench/.profiles/ (sum it with bench/profile-summary.ts) — the profiler slows the run.
 * Then SHELL_DURATION (≤ 10) s of the settings page, the signed-in shell's floor, as a yardstick:
 * "pageToShellCpuRatio" changes little with other sessions' load, the CPU ms per request do.
 * Before measuring, PAGE_WARMUP (10) s of the same load, not counted: V8 optimises the render code
 * over the first seconds under load (the first 10 s ran ~25 % slower than the next), and a server
 * in use has long passed that point. Writes the key "techniquePage" of bench/results.json with the
 * load average before and after.
 */
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import autocannon from "autocannon";
import { signInCookie } from "@/bench/lib/http-client";
import { treeCpuSeconds } from "@/bench/lib/process-memory";
import { percentile, writeResultsKey } from "@/bench/lib/results";
import { RENDER_HEADER } from "@/lib/page-cache/headers";
import { DEMO_PASSWORD, startApp } from "@/tests/e2e/harness";

const DURATION = Number(process.env.PAGE_DURATION ?? 30);
const WARMUP = Number(process.env.PAGE_WARMUP ?? 10);
const CONNECTIONS = Number(process.env.PAGE_CONNECTIONS ?? 50);
const PROFILE = process.env.PAGE_PROFILE === "1";
const SHELL_DURATION = Math.min(10, DURATION);
const TARGET_RPS = 100;
const TECHNIQUE = "marker-channel-cleanup";

const profileDir = path.resolve("bench/.profiles");
if (PROFILE) fs.mkdirSync(profileDir, { recursive: true });
const app = await startApp(PROFILE ? { nodeArgs: ["--cpu-prof", `--cpu-prof-dir=${profileDir}`] } : {});
try {
  const cookie = await signInCookie(app.baseUrl, "senior@kestrel.test", DEMO_PASSWORD);
  const pagePath = `/techniques/${TECHNIQUE}`;
  const headers = { cookie, accept: "text/html", "sec-fetch-dest": "document", "sec-fetch-mode": "navigate", [RENDER_HEADER]: "1" };
  // Warm-up: compile-on-first-use paths, the database's caches, a few renders.
  for (let i = 0; i < 20; i++) {
    const res = await fetch(`${app.baseUrl}${pagePath}`, { headers, redirect: "manual" });
    const html = await res.text();
    if (res.status !== 200 || !html.includes("Before and after")) throw new Error(`${pagePath} answered ${res.status} when warming up`);
    if (res.headers.get("x-plateroom-page-cache")) throw new Error(`${pagePath} was answered from the page cache; the benchmark must render`);
  }

  if (WARMUP > 0) await autocannon({ url: `${app.baseUrl}${pagePath}`, connections: CONNECTIONS, duration: WARMUP, headers, timeout: 20 });

  const loadavgAtStart = os.loadavg();
  const latencies: number[] = [];
  const cpuAtStart = treeCpuSeconds(app.pid);
  const instance = autocannon({ url: `${app.baseUrl}${pagePath}`, connections: CONNECTIONS, duration: DURATION, headers, timeout: 20 });
  instance.on("response", (_c: unknown, _s: number, _b: number, ms: number) => latencies.push(ms));
  const r = await instance;
  const serverCpuSeconds = treeCpuSeconds(app.pid) - cpuAtStart;
  // The same measure for the settings page (the signed-in shell and little else), run straight
  // after: under other sessions' load both rise together, so the ratio compares runs fairly.
  // Requests the client gave up on may still be rendering: one answered request first lets them drain.
  await (await fetch(`${app.baseUrl}/settings`, { headers })).text();
  const shellCpuAtStart = treeCpuSeconds(app.pid);
  const shell = await autocannon({ url: `${app.baseUrl}/settings`, connections: CONNECTIONS, duration: SHELL_DURATION, headers, timeout: 20 });
  const shellCpuSeconds = treeCpuSeconds(app.pid) - shellCpuAtStart;
  const loadavgAtEnd = os.loadavg();
  const round = (x: number) => Math.round(x * 10) / 10;
  const result = {
    measuredAt: new Date().toISOString(),
    machine: { cpus: os.cpus().length, node: process.version, loadavgAtStart, loadavgAtEnd },
    settings: { path: pagePath, connections: CONNECTIONS, durationSeconds: DURATION, warmupSeconds: WARMUP, targetRequestsPerSec: TARGET_RPS, profiled: PROFILE, auth: "session cookie (demo senior)" },
    requestsPerSec: round(r.requests.average),
    requests: r.requests.total,
    p50: round(percentile(latencies, 50)),
    p95: round(percentile(latencies, 95)),
    p99: round(percentile(latencies, 99)),
    errors: r.errors,
    timeouts: r.timeouts,
    non2xx: r.non2xx,
    // Less dependent on other sessions than req/s: what one render costs the server in CPU.
    serverCpuMsPerRequest: r.requests.total ? round((serverCpuSeconds * 1000) / r.requests.total) : null,
    shellCpuMsPerRequest: shell.requests.total && !shell.non2xx ? round((shellCpuSeconds * 1000) / shell.requests.total) : null,
    pageToShellCpuRatio: r.requests.total && shell.requests.total ? Math.round(((serverCpuSeconds / r.requests.total) / (shellCpuSeconds / shell.requests.total)) * 100) / 100 : null,
    metTarget: r.requests.average >= TARGET_RPS && r.errors + r.non2xx === 0, // autocannon counts time-outs among errors
    notes: [
      "Every request carries the page cache's render header: a full server render (session, layout, page, all sections), never the cached copy.",
      "The load generator shares the machine's 2 cores with the server and with other sessions: read the numbers beside the load averages.",
    ],
  };
  writeResultsKey("techniquePage", result);
  console.log(`\nTechnique page, rendered every request: ${CONNECTIONS} connections × ${DURATION} s (load average ${loadavgAtStart.map((x) => x.toFixed(1)).join(" ")} → ${loadavgAtEnd.map((x) => x.toFixed(1)).join(" ")})`);
  console.table([{ "req/s": result.requestsPerSec, p50: result.p50, p95: result.p95, p99: result.p99, errors: r.errors, non2xx: r.non2xx, "server CPU ms/req": result.serverCpuMsPerRequest, "shell ms/req": result.shellCpuMsPerRequest, [`≥ ${TARGET_RPS} req/s`]: result.metTarget ? "met" : "NOT met" }]);
} finally {
  await app.stop();
  if (PROFILE) console.log(`CPU profile(s) in ${profileDir}`);
}
