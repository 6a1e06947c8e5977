import fs from "node:fs";
import path from "node:path";
import type { Page } from "playwright-core";

/* axe-core (Deque's engine of the WCAG 2.1 rules, an outside checker) run in a page under test. */

const AXE_SOURCE = fs.readFileSync(path.join(process.cwd(), "node_modules", "axe-core", "axe.min.js"), "utf8");

type Violation = { id: string; impact: string | null; help: string; nodes: { target: string[]; failureSummary?: string }[] };

/** Runs axe-core on the page as it is; the serious and critical violations, in words a reader can act on. */
export async function seriousViolations(page: Page): Promise<string[]> {
  // Evaluated through the debugging protocol, so the app's Content-Security-Policy stays as it is.
  // Colours at rest, not halfway through a CSS transition: a button that has just loaded its state
  // (e.g. Follow turning into Following) fades between two colour pairs for 150 ms, and axe once
  // measured the blend.
  await page.waitForFunction(() => document.getAnimations().every((a) => !(a instanceof CSSTransition) || a.playState !== "running"), undefined, { timeout: 10_000 });
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


const requestsOf = new WeakMap<Page, { inFlight: number; lastChange: number }>();

/** Counts the page's requests in flight from now on (call it before the page navigates). */
export function watchRequests(page: Page): void {
  if (requestsOf.has(page)) return;
  const state = { inFlight: 0, lastChange: Date.now() };
  requestsOf.set(page, state);
  const change = (delta: number) => {
    state.inFlight = Math.max(0, state.inFlight + delta);
    state.lastChange = Date.now();
  };
  page.on("request", () => change(1));
  page.on("requestfinished", () => change(-1));
  page.on("requestfailed", () => change(-1));
}

/**
 * Waits until the page has loaded, no request is in flight, and its main thread has gone idle
 * with still none started (hydration done, the effects that fetch lists have run and their
 * answers rendered). The real condition, in place of a fixed half-second of network silence;
 * gives up quietly after `timeoutMs`, as Playwright's "networkidle" wait did here.
 */
export async function networkQuiet(page: Page, timeoutMs = 15_000): Promise<void> {
  const state = requestsOf.get(page);
  if (!state) throw new Error("networkQuiet needs watchRequests(page) before the page navigates");
  const until = Date.now() + timeoutMs;
  await page.waitForLoadState("load", { timeout: timeoutMs }).catch(() => undefined);
  while (Date.now() < until) {
    if (state.inFlight > 0 || Date.now() - state.lastChange < 100) {
      await new Promise((r) => setTimeout(r, 20));
      continue;
    }
    const seen = state.lastChange;
    const idle = await page
      .evaluate(() => new Promise<boolean>((resolve) => requestIdleCallback((deadline) => resolve(!deadline.didTimeout), { timeout: 2000 })))
      .catch(() => false);
    if (idle && state.inFlight === 0 && state.lastChange === seen) return;
  }
}
