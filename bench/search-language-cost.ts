/**
 * `NODE_OPTIONS=--expose-gc npx tsx -C react-server bench/search-language-cost.ts`: what the search
 * engine's language data costs a process at start-up — the English word list and Hunspell pairs, then
 * WordNet 3.1 (wordnet.ts) — in wall time, retained memory (V8 heap + external buffers after a full
 * collection) and resident memory. Each part is loaded in a fresh child process so one does not pay
 * for the other. Not a timed test: the numbers depend on the machine's load (printed beside them).
 */
import { execFileSync } from "node:child_process";
import os from "node:os";

const part = process.argv[2];

if (part === "language" || part === "wordnet") {
  const gc = (globalThis as { gc?: () => void }).gc;
  if (!gc) throw new Error("run with NODE_OPTIONS=--expose-gc");
  gc();
  const before = process.memoryUsage();
  const t0 = performance.now();
  const size =
    part === "wordnet" ? (await (await import("@/lib/search/wordnet")).loadWordNet()).size : (await (await import("@/lib/search/language")).loadLanguage()).variantPairs.length;
  const ms = performance.now() - t0;
  const peakRss = process.memoryUsage().rss;
  gc();
  await new Promise((resolve) => setTimeout(resolve, 1000));
  gc();
  const after = process.memoryUsage();
  const mb = (b: number): number => Math.round(b / 1e5) / 10;
  console.log(
    JSON.stringify({
      part,
      size,
      loadMs: Math.round(ms),
      retainedMb: mb(after.heapUsed + after.external - before.heapUsed - before.external),
      rssGrowthMb: mb(peakRss - before.rss),
      rssAfterGcMb: mb(after.rss - before.rss),
    }),
  );
} else {
  console.log("load average at start", os.loadavg().map((v) => v.toFixed(2)).join(" "));
  for (const p of ["wordnet", "language"]) {
    // language.ts loads WordNet too: its row is the whole language data, WordNet included.
    const out = execFileSync("npx", ["tsx", "-C", "react-server", "bench/search-language-cost.ts", p], { env: { ...process.env, NODE_OPTIONS: "--expose-gc" }, encoding: "utf8" });
    console.log(out.trim());
  }
  console.log("load average at end", os.loadavg().map((v) => v.toFixed(2)).join(" "));
}
