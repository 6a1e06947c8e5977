import { describe, expect, it } from "vitest";
import { checkFrame } from "@/lib/plate-check/check";
import { frameFromCodes } from "@/lib/plate-check/frame";
import type { Findings } from "@/lib/plate-check/schemas";
import { heldOut2Spec, heldOutSpec, noScreenSpec, sameHueDotSpec, screenHuedTapeSpec, tunedSpec } from "@/tests/plate-check/families";
import { scoreFindings, type Score } from "@/tests/plate-check/score";
import { expectIssueTargets } from "@/tests/plate-check/targets";
import { generatePlate, type PlateSpec } from "@/tests/plate-check/synthetic-plates";

/*
 * Accuracy of the plate check on generated plates of known truth (issue 18 targets). Sources:
 * - marker recall ≥ 95 % and precision ≥ 95 %, dead/hot recall 100 % and precision ≥ 99 %, noise
 *   within 10 %, screen hue within 2°: the issue's targets (trade expectations, no published source);
 * - noise truth: the generator's Gaussian grain sigma in code values; the estimator is Immerkær 1996
 *   (tests/unit/plate-check/noise.test.ts checks it against scipy);
 * - hue truth: the HSV (hexcone) hue of the screen's linear colour, A. R. Smith, "Color Gamut
 *   Transform Pairs", SIGGRAPH 1978 — lighting multiplies all channels, so it does not move it;
 * - coverage and unevenness truth: the generator's foreground alpha and lighting field under the
 *   check's own stated definitions (own measures, no published source).
 * Each family is scored over all its plates together and reported on its own (tests/plate-check/
 * families.ts says which were seen while developing the detectors).
 */

type Totals = { plates: number; mT: number; mF: number; mM: number; dT: number; dF: number; dM: number; shadeExact: number; maxHue: number; maxNoise: number; maxCoverage: number; maxUneven: number; dustT: number; dustM: number; hairT: number; hairM: number };

function add(t: Totals, s: Score): void {
  t.plates++;
  t.mT += s.markers.truth; t.mF += s.markers.found; t.mM += s.markers.matched;
  t.dT += s.defects.truth; t.dF += s.defects.found; t.dM += s.defects.matched;
  if (s.shades.found === s.shades.truth) t.shadeExact++;
  t.maxHue = Math.max(t.maxHue, s.hueError ?? Infinity);
  t.maxNoise = Math.max(t.maxNoise, ...s.noiseRelError.map(Math.abs));
  t.maxCoverage = Math.max(t.maxCoverage, s.coverageError ?? Infinity);
  t.maxUneven = Math.max(t.maxUneven, Math.abs(s.unevennessError ?? Infinity));
  t.dustT += s.dust.truth; t.dustM += s.dust.matched; t.hairT += s.hairs.truth; t.hairM += s.hairs.matched;
}

async function runFamily(specs: PlateSpec[]): Promise<Totals> {
  const t: Totals = { plates: 0, mT: 0, mF: 0, mM: 0, dT: 0, dF: 0, dM: 0, shadeExact: 0, maxHue: 0, maxNoise: 0, maxCoverage: 0, maxUneven: 0, dustT: 0, dustM: 0, hairT: 0, hairM: 0 };
  for (const spec of specs) {
    const plate = generatePlate(spec);
    const findings: Findings = await checkFrame(frameFromCodes(plate.codes, plate.width, plate.height, plate.bits));
    add(t, scoreFindings(findings, plate.truth));
  }
  return t;
}

function report(name: string, t: Totals): void {
  const pct = (a: number, b: number) => (b ? ((100 * a) / b).toFixed(1) : "—");
  console.log(
    `[plate-check accuracy] ${name}: ${t.plates} plates; markers recall ${pct(t.mM, t.mT)} % precision ${pct(t.mM, t.mF)} % (${t.mM}/${t.mT} found, ${t.mF} reported); ` +
      `dead/hot recall ${pct(t.dM, t.dT)} % precision ${pct(t.dM, t.dF)} %; shade count exact on ${t.shadeExact}/${t.plates}; ` +
      `worst hue error ${t.maxHue.toFixed(2)}°, worst noise error ${(100 * t.maxNoise).toFixed(2)} %, worst coverage error ${(100 * t.maxCoverage).toFixed(2)} pp, worst unevenness error ${t.maxUneven.toFixed(2)} pp; ` +
      `dust ${t.dustM}/${t.dustT}, hairs ${t.hairM}/${t.hairT}`,
  );
}

describe("plate check accuracy on generated plates", () => {
  it("tuned family: 10 plates, 800×450, 16-bit, green and blue screens, 1–4 shades, motion blur, foreground in marker colours", { timeout: 240_000 }, async () => {
    const t = await runFamily(Array.from({ length: 10 }, (_, i) => ({ ...tunedSpec(101 + i), width: 800, height: 450 })));
    report("tuned", t);
    expectIssueTargets(t);
    // Own definitions of coverage and unevenness, measured against the generator's fields. Coverage
    // runs ~1–2 points low: the pixel or so of screen beside a foreground edge that the 3×3 mean
    // mixes with the edge is counted as foreground (the truth splits edge pixels at alpha 0.5).
    expect(t.maxCoverage, "coverage within 3 percentage points").toBeLessThanOrEqual(0.03);
    expect(t.maxUneven, "unevenness within 2 percentage points").toBeLessThanOrEqual(2);
    expect(t.shadeExact / t.plates, "shade count exact on 90 % of plates").toBeGreaterThanOrEqual(0.9);
  });

  it("held-out family, seen once (1280×720, 8-bit, cyan to blue, square markers, long blur, heavy grain): 4 plates", { timeout: 240_000 }, async () => {
    const t = await runFamily(Array.from({ length: 4 }, (_, i) => heldOutSpec(i + 1)));
    report("held out (seen once)", t);
    expectIssueTargets(t);
  });

  it("held-out family 2, never tuned against (1600×900, dark screens, very heavy grain, 30 defects): 3 plates", { timeout: 300_000 }, async () => {
    const t = await runFamily(Array.from({ length: 3 }, (_, i) => heldOut2Spec(i + 1)));
    report("held out 2", t);
    expectIssueTargets(t);
  });

  it("tape of the screen's own hue (crosses), told from dust by the set it belongs to: 3 plates", { timeout: 240_000 }, async () => {
    const t = await runFamily(Array.from({ length: 3 }, (_, i) => screenHuedTapeSpec(i + 1)));
    report("screen-hued tape", t);
    expectIssueTargets(t);
    expect(t.dustM / t.dustT, "dust specks still found as dust").toBeGreaterThanOrEqual(0.9);
  });

  it("round dots of the screen's own hue (darker or lighter) among dust specks, held out: 3 plates", { timeout: 300_000 }, async () => {
    // Recall and precision for both: the same-hue dots as markers, the specks as dust (matched by
    // box, tests/plate-check/score.ts). Targets: the issue's 95 % for markers; dust the same (own).
    let sameT = 0, sameM = 0, mT = 0, mF = 0, mM = 0, dustT = 0, dustF = 0, dustM = 0;
    for (let i = 1; i <= 3; i++) {
      const plate = generatePlate(sameHueDotSpec(i));
      const f = await checkFrame(frameFromCodes(plate.codes, plate.width, plate.height, plate.bits));
      const s = scoreFindings(f, plate.truth);
      mT += s.markers.truth; mF += s.markers.found; mM += s.markers.matched;
      dustT += s.dust.truth; dustF += s.dust.found; dustM += s.dust.matched;
      const inBox = (x: number, y: number, b: { x: number; y: number; w: number; h: number }) => x >= b.x && x < b.x + b.w && y >= b.y && y < b.y + b.h;
      const same = plate.truth.markers.filter((m) => m.shade === 0);
      sameT += same.length;
      sameM += same.filter((m) => f.markers.items.some((it) => inBox(it.x, it.y, m.box))).length;
    }
    const pct = (a: number, b: number) => ((100 * a) / b).toFixed(1);
    console.log(`[plate-check accuracy] same-hue dots and dust: same-hue dots recall ${pct(sameM, sameT)} % (${sameM}/${sameT}); all markers recall ${pct(mM, mT)} % precision ${pct(mM, mF)} %; dust recall ${pct(dustM, dustT)} % precision ${pct(dustM, dustF)} % (${dustM}/${dustT}, ${dustF} reported)`);
    expect(sameM / sameT, "same-hue dot recall").toBeGreaterThanOrEqual(0.95);
    expect(mM / mT, "marker recall").toBeGreaterThanOrEqual(0.95);
    expect(mM / mF, "marker precision (no dust taken for a marker)").toBeGreaterThanOrEqual(0.95);
    expect(dustM / dustT, "dust recall (no dot taken for dust)").toBeGreaterThanOrEqual(0.95);
    expect(dustM / dustF, "dust precision").toBeGreaterThanOrEqual(0.95);
  });

  it("a frame with no screen says so: no screen, markers not searched, and still measures noise and defects", { timeout: 120_000 }, async () => {
    for (let i = 1; i <= 3; i++) {
      const plate = generatePlate(noScreenSpec(i));
      const f = await checkFrame(frameFromCodes(plate.codes, plate.width, plate.height, plate.bits));
      expect(f.screen.present).toBe(false);
      expect(f.screen.summary).toMatch(/^No backing screen/);
      expect(f.markers.searched).toBe(false);
      expect(f.markers.count).toBe(0);
      expect(f.markers.summary).toMatch(/not searched/);
      expect(f.problemTags.map((t) => t.slug)).not.toContain("tracking-markers");
      const s = scoreFindings(f, plate.truth);
      expect(Math.max(...s.noiseRelError.map(Math.abs))).toBeLessThanOrEqual(0.1);
      expect(s.defects.matched).toBe(s.defects.truth);
    }
  });
});
