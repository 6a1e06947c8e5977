/**
 * `next build` must print no warnings: the e2e harness (tests/e2e/harness.ts) keeps each build's
 * output in `<dist dir>/build.log` and fails every browser test while it holds one, so `npm test`
 * and CI fail on a warning. By hand:
 *   tsx scripts/build-log.ts .next/build.log      (exit 1 and the lines, if there are warnings)
 */
import fs from "node:fs";
import path from "node:path";
import { fileURLToPath } from "node:url";

// ECMA-48 control sequences (colours), which Next.js prints when it thinks it has a terminal.
const ANSI = /\u001b\[[0-9;?]*[ -/]*[@-~]/g;
// The route table's tree lines name routes, not problems.
const ROUTE_TABLE = /^\s*[┌├└│]/;
// Next.js marks warnings with "⚠" (its Log.warn); Turbopack and Node say "warning(s)" in words.
const WARNING = /⚠|\bwarn(ing|ings)?\b/i;

/** The lines of a build's output that are warnings, without colour codes. */
export function buildWarnings(log: string): string[] {
  return log
    .replace(ANSI, "")
    .split(/\r?\n/)
    .filter((line) => WARNING.test(line) && !ROUTE_TABLE.test(line))
    .map((line) => line.trim());
}

if (process.argv[1] && path.resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  const file = process.argv[2];
  if (!file) {
    console.error("usage: tsx scripts/build-log.ts <build log>");
    process.exit(2);
  }
  const warnings = buildWarnings(fs.readFileSync(file, "utf8"));
  for (const line of warnings) console.error(line);
  process.exit(warnings.length ? 1 : 0);
}
