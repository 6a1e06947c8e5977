import fs from "node:fs";
import path from "node:path";

export const RESULTS_PATH = path.resolve("bench/results.json");

/** Replace one top-level key of bench/results.json, keeping what other benchmarks wrote. */
export function writeResultsKey(key: string, value: unknown): void {
  let current: Record<string, unknown> = {};
  if (fs.existsSync(RESULTS_PATH)) {
    try {
      current = JSON.parse(fs.readFileSync(RESULTS_PATH, "utf8")) as Record<string, unknown>;
    } catch {
      // A half-written or hand-edited file should not lose this run's numbers.
      current = {};
    }
  }
  current[key] = value;
  const tmp = `${RESULTS_PATH}.${process.pid}.tmp`;
  fs.writeFileSync(tmp, `${JSON.stringify(current, null, 2)}\n`);
  fs.renameSync(tmp, RESULTS_PATH);
}

/** Nearest-rank percentile of an unsorted sample. */
export function percentile(values: readonly number[], p: number): number {
  if (values.length === 0) return Number.NaN;
  const sorted = [...values].sort((a, b) => a - b);
  const rank = Math.ceil((p / 100) * sorted.length);
  return sorted[Math.min(sorted.length - 1, Math.max(0, rank - 1))] as number;
}
