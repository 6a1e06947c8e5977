/*
 * Password-reset timing (OWASP Forgot Password Cheat Sheet: "Ensure that responses return in a
 * consistent amount of time"). Against `next start` of the production build: RESET_PAIRS (150)
 * requests for existing accounts and as many for unknown addresses, interleaved in a shuffled
 * order, one at a time, each from its own client address (the app trusts loopback as a proxy
 * here, and every request names an address of the benchmarking range 198.18.0.0/15, RFC 2544)
 * and for its own e-mail, so no limit is reached. Reports each group's median, p90 and mean, and
 * a two-sided permutation test of the difference of means (simple-statistics permutationTest):
 * a large p says the times do not tell the groups apart. Run: npx tsx -C react-server
 * bench/reset-timing.ts. Writes the key "resetTiming" of bench/results.json.
 */
import os from "node:os";
import { mean, permutationTest } from "simple-statistics";
import { signInCookie } from "@/bench/lib/http-client";
import { percentile, writeResultsKey } from "@/bench/lib/results";
import { DEMO_PASSWORD, startApp } from "@/tests/e2e/harness";

const PAIRS = Number(process.env.RESET_PAIRS ?? 150);

const app = await startApp({ env: { PLATEROOM_TRUSTED_PROXIES: "127.0.0.1,::1" } });
try {
  const admin = await signInCookie(app.baseUrl, "admin@kestrel.test", DEMO_PASSWORD);
  const known: string[] = [];
  for (let i = 0; i < PAIRS; i++) {
    const email = `reset-bench-${i}@kestrel.test`;
    const res = await fetch(`${app.baseUrl}/api/people`, {
      method: "POST",
      headers: { cookie: admin, "content-type": "application/json" },
      body: JSON.stringify({ email, name: `Reset Bench ${i}`, role: "artist" }),
    });
    if (res.status !== 201) throw new Error(`inviting ${email} answered ${res.status}`);
    known.push(email);
  }
  const unknown = known.map((_, i) => `no-account-${i}@kestrel.test`);
  let address = 0;
  const ask = async (email: string): Promise<number> => {
    address++;
    const started = performance.now();
    const res = await fetch(`${app.baseUrl}/api/password-resets`, {
      method: "POST",
      headers: { "content-type": "application/json", "x-forwarded-for": `198.18.${address >> 8}.${address & 255}` },
      body: JSON.stringify({ email }),
    });
    await res.arrayBuffer();
    const ms = performance.now() - started;
    if (res.status !== 202) throw new Error(`reset for ${email} answered ${res.status}`);
    return ms;
  };
  for (let i = 0; i < 10; i++) await ask(`warm-up-${i}@kestrel.test`);

  // A fixed shuffle (seeded) so neither group always goes first.
  const order = [...known.map((e) => ({ e, known: true })), ...unknown.map((e) => ({ e, known: false }))];
  let seed = 19;
  for (let i = order.length - 1; i > 0; i--) {
    seed = (seed * 1103515245 + 12345) >>> 0;
    const j = seed % (i + 1);
    [order[i], order[j]] = [order[j]!, order[i]!];
  }
  const loadavgAtStart = os.loadavg();
  const times = { known: [] as number[], unknown: [] as number[] };
  for (const { e, known: k } of order) (k ? times.known : times.unknown).push(await ask(e));

  const summary = (xs: number[]) => ({ median: round(percentile(xs, 50)), p90: round(percentile(xs, 90)), mean: round(mean(xs)) });
  const round = (x: number) => Math.round(x * 100) / 100;
  const result = {
    measuredAt: new Date().toISOString(),
    machine: { cpus: os.cpus().length, node: process.version, loadavgAtStart, loadavgAtEnd: os.loadavg() },
    pairs: PAIRS,
    knownMs: summary(times.known),
    unknownMs: summary(times.unknown),
    medianDifferenceMs: round(percentile(times.known, 50) - percentile(times.unknown, 50)),
    permutationTestP: round(permutationTest(times.known, times.unknown, "two_side", 10_000)),
    notes: [
      "Client-side wall time of POST /api/password-resets over loopback, one request at a time.",
      "p is the two-sided permutation test of the difference of means; p above 0.05 means the times do not separate known from unknown addresses at that level.",
    ],
  };
  writeResultsKey("resetTiming", result);
  console.log(`\nReset timing, ${PAIRS} known and ${PAIRS} unknown addresses (load average ${loadavgAtStart.map((x) => x.toFixed(1)).join(" ")})`);
  console.table({ known: result.knownMs, unknown: result.unknownMs });
  console.log(`median difference ${result.medianDifferenceMs} ms, permutation test p = ${result.permutationTestP}`);
} finally {
  await app.stop();
}
