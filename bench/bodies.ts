/*
 * Oversized request bodies (issue 19 item 5). Run: npx tsx -C react-server bench/bodies.ts
 * Starts the built app on a copy of the seeded data, then sends 20 concurrent oversized bodies
 * (300 MB each, made as they are sent, never held by this script) to JSON routes, once streamed
 * without Content-Length and once declaring it, and samples the server's resident memory
 * (/proc, the server process and its children) every 50 ms. Writes the key "bodies" of
 * bench/results.json. Expectation: every answer is 413, and the server's memory stays where it
 * was before (the bodies are never buffered); before the limit, 300 MB bodies were read in full.
 */
import fs from "node:fs";
import http from "node:http";
import os from "node:os";
import { createApiToken } from "@/bench/lib/http-client";
import { treeRss } from "@/bench/lib/process-memory";
import { writeResultsKey } from "@/bench/lib/results";
import { DEMO_PASSWORD, copySeededData, startServerOn } from "@/tests/e2e/harness";

const CONCURRENT = 20;
const BODY_BYTES = 300 * 1024 * 1024;
const CHUNK = Buffer.alloc(64 * 1024, "1");
const ROUTES = ["/api/lab/run", "/api/lab/solve", "/api/tokens", "/api/techniques"];

/** Resident memory of the server and its children, in MB. */
const treeRssMb = (pid: number): number => Math.round(treeRss(pid) / (1024 * 1024));

type Outcome = { status: number | "closed"; sentMb: number; ms: number };

/** POSTs up to BODY_BYTES, written as the socket drains, stopping as soon as an answer or a close arrives. */
function oversized(baseUrl: string, path: string, token: string, declare: boolean): Promise<Outcome> {
  const started = Date.now();
  const url = new URL(path, baseUrl);
  return new Promise((resolve) => {
    let sent = 0;
    let done = false;
    const finish = (status: Outcome["status"]) => {
      if (done) return;
      done = true;
      resolve({ status, sentMb: Math.round(sent / (1024 * 1024)), ms: Date.now() - started });
      req.destroy();
    };
    const headers: Record<string, string> = { Authorization: `Bearer ${token}`, "Content-Type": "application/json" };
    if (declare) headers["Content-Length"] = String(BODY_BYTES);
    const req = http.request({ hostname: url.hostname, port: url.port, path: url.pathname, method: "POST", headers });
    req.on("response", (res) => {
      res.resume();
      finish(res.statusCode ?? 0);
    });
    req.on("error", () => finish("closed"));
    const write = () => {
      while (!done && sent < BODY_BYTES) {
        sent += CHUNK.length;
        if (!req.write(CHUNK)) return void req.once("drain", write);
      }
      if (!done) req.end();
    };
    write();
  });
}

async function round(baseUrl: string, pid: number, token: string, declare: boolean) {
  const samples: number[] = [];
  const sampler = setInterval(() => samples.push(treeRssMb(pid)), 50);
  const before = treeRssMb(pid);
  const outcomes = await Promise.all(Array.from({ length: CONCURRENT }, (_, i) => oversized(baseUrl, ROUTES[i % ROUTES.length]!, token, declare)));
  clearInterval(sampler);
  await new Promise((r) => setTimeout(r, 2000));
  const after = treeRssMb(pid);
  const statuses: Record<string, number> = {};
  for (const o of outcomes) statuses[String(o.status)] = (statuses[String(o.status)] ?? 0) + 1;
  return {
    declaredContentLength: declare,
    statuses,
    rssMbBefore: before,
    rssMbPeak: Math.max(before, ...samples),
    rssMbAfter2s: after,
    clientSentMbMax: Math.max(...outcomes.map((o) => o.sentMb)),
    slowestAnswerMs: Math.max(...outcomes.map((o) => o.ms)),
  };
}

const { work, dataDir, uploadsDir } = copySeededData();
const server = await startServerOn(dataDir, uploadsDir);
try {
  const token = await createApiToken(server.baseUrl, "senior@kestrel.test", DEMO_PASSWORD, "bodies benchmark");
  // Load every route's code first, so the memory measured is the bodies', not the first compile.
  for (const route of ROUTES) {
    const res = await fetch(`${server.baseUrl}${route}`, { method: "POST", headers: { Authorization: `Bearer ${token}`, "Content-Type": "application/json" }, body: "{}" });
    await res.arrayBuffer();
  }
  const loadavgAtStart = os.loadavg();
  const pid = server.child.pid!;
  const streamed = await round(server.baseUrl, pid, token, false);
  const declared = await round(server.baseUrl, pid, token, true);
  const result = {
    measuredAt: new Date().toISOString(),
    machine: { cpus: os.cpus().length, node: process.version, loadavgAtStart, loadavgAtEnd: os.loadavg() },
    settings: { concurrent: CONCURRENT, bodyMb: BODY_BYTES / (1024 * 1024), routes: ROUTES },
    notes: [
      "rssMb*: resident memory of `next start` and its children, sampled every 50 ms while the 20 bodies were being sent.",
      "clientSentMbMax: the most any client had written when its answer (or the close) arrived; the rest was never sent.",
      "statuses 'closed': the server answered 413 and closed the connection while the client was still writing, so the client saw the close before it read the answer.",
    ],
    streamed,
    declared,
  };
  writeResultsKey("bodies", result);
  console.log(`Oversized bodies: ${CONCURRENT} × ${BODY_BYTES / (1024 * 1024)} MB (load average at start ${loadavgAtStart.map((x) => x.toFixed(1)).join(" ")})`);
  console.table({ streamed, declared });
} finally {
  server.child.kill("SIGTERM");
  await server.exited();
  fs.rmSync(work, { recursive: true, force: true });
}
