import { expect } from "vitest";

/** Summed counts and worst errors over a family of generated plates. */
export type TargetTotals = { mT: number; mF: number; mM: number; dT: number; dF: number; dM: number; maxHue: number; maxNoise: number };

/**
 * Issue 18's accuracy targets, one place for every family: marker recall and precision ≥ 95 %,
 * dead/hot pixel recall 100 % and precision ≥ 99 %, noise σ within 10 % of truth, screen hue within 2°.
 */
export function expectIssueTargets(t: TargetTotals): void {
  expect(t.mM / t.mT, "marker recall").toBeGreaterThanOrEqual(0.95);
  expect(t.mM / t.mF, "marker precision").toBeGreaterThanOrEqual(0.95);
  expect(t.dM / t.dT, "dead/hot recall").toBe(1);
  expect(t.dM / t.dF, "dead/hot precision").toBeGreaterThanOrEqual(0.99);
  expect(t.maxNoise, "noise sigma within 10 % of truth, every channel of every plate").toBeLessThanOrEqual(0.1);
  expect(t.maxHue, "screen hue within 2°").toBeLessThanOrEqual(2);
}
