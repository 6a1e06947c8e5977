import fs from "node:fs";
import path from "node:path";
import type { Page } from "playwright-core";

/* axe-core (Deque's engine of the WCAG 2.1 rules, an outside checker) run in a page under test. */

const AXE_SOURCE = fs.readFileSync(path.join(process.cwd(), "node_modules", "axe-core", "axe.min.js"), "utf8");

type Violation = { id: string; impact: string | null; help: string; nodes: { target: string[]; failureSummary?: string }[] };

/** Runs axe-core on the page as it is; the serious and critical violations, in words a reader can act on. */
export async function seriousViolations(page: Page): Promise<string[]> {
  // Evaluated through the debugging protocol, so the app's Content-Security-Policy stays as it is.
  if (!(await page.evaluate(() => "axe" in window))) await page.evaluate(AXE_SOURCE);
  const violations = await page.evaluate(async () => {
    const result = await (window as unknown as { axe: { run(ctx: Document, options: object): Promise<{ violations: Violation[] }> } }).axe.run(document, {
      resultTypes: ["violations"],
    });
    return result.violations.map((v) => ({ id: v.id, impact: v.impact, help: v.help, nodes: v.nodes.map((n) => ({ target: n.target, failureSummary: n.failureSummary })) }));
  });
  return violations
    .filter((v) => v.impact === "serious" || v.impact === "critical")
    .flatMap((v) => v.nodes.map((n) => `${v.id} (${v.impact}): ${v.help} at ${n.target.join(" ")} — ${n.failureSummary ?? ""}`));
}

