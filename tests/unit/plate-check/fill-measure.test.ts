import { spawnSync } from "node:child_process";
import fs from "node:fs";
import { describe, expect, it } from "vitest";
import { IDENTITY3, recipeSchema, type RecipeStep } from "@/lib/lab/recipe";
import { checkFrame } from "@/lib/plate-check/check";
import { cleanScreenRect, fillRecipe, recipeChannel } from "@/lib/plate-check/fill";
import { frameFromCodes } from "@/lib/plate-check/frame";
import { hueDegrees } from "@/lib/plate-check/image";
import { measureTry } from "@/lib/plate-check/measure";
import type { Findings } from "@/lib/plate-check/schemas";
import { mulberry32 } from "@/lib/random";
import { PYTHON } from "@/tests/plate-check/python";
import { generatePlate } from "@/tests/plate-check/synthetic-plates";

const dot = (a: readonly number[], b: readonly number[]) => a[0]! * b[0]! + a[1]! * b[1]! + a[2]! * b[2]!;

async function findingsOf(hue: number, seed: number): Promise<{ f: Findings; frame: ReturnType<typeof frameFromCodes> }> {
  const p = generatePlate({ width: 640, height: 360, seed, screenHue: hue, shades: 2, markerSize: 6, markerPitch: 90, foregroundShapes: 1, grain: 0.006 });
  const frame = frameFromCodes(p.codes, p.width, p.height, p.bits);
  const f = await checkFrame(frameFromCodes(p.codes.slice(), p.width, p.height, p.bits));
  return { f, frame };
}

// A recipe written for a green screen: hide in G, copy G to R and B with level fits, matte, mix, grain.
const GREEN_RECIPE: RecipeStep[] = recipeSchema.parse([
  { op: "matrix", m: [[1, 0, 0], [0.2, 0.7, 0.3], [0, 0, 1]] },
  { op: "copy", from: "g", to: "r" },
  { op: "level", channel: "r", ref: "r", fit: "gain", rect: { x: 0, y: 0, w: 10, h: 10 } },
  { op: "copy", from: "g", to: "b" },
  { op: "matte", channel: [1, -1, 0.5], source: "plate", black: 0.08, white: 0.35 },
  { op: "grow", px: 2 },
  { op: "mix" },
  { op: "grain", denoised: "00000000-0000-0000-0000-000000000000" },
]);

describe("filling a recipe from the findings", () => {
  it("on a blue screen swaps G and B throughout, solves the hide row for the found shades, fits levels on clean screen, drops the grain step", async () => {
    const { f } = await findingsOf(225, 31);
    expect(recipeChannel(GREEN_RECIPE)).toBe("g");
    const out = fillRecipe(GREEN_RECIPE, f);
    expect(out.problem).toBeNull();
    expect(out.targetChannel).toBe("b");
    expect(out.recipe.map((s) => s.op)).toEqual(["matrix", "copy", "level", "copy", "matte", "grow", "mix"]);
    expect(out.recipe[1]).toMatchObject({ op: "copy", from: "b", to: "r" });
    expect(out.recipe[3]).toMatchObject({ op: "copy", from: "b", to: "g" });
    expect(out.skipped.join(" ")).toMatch(/grain/);
    // The hide row: only row B changes, the screen keeps its level in B, every shade matches the screen in B
    // (solver definition, shared/API.md "The lab" and LAB-NOTES.md "Solver").
    const m = (out.recipe[0] as Extract<RecipeStep, { op: "matrix" }>).m;
    expect(m[0]).toEqual(IDENTITY3[0]);
    expect(m[1]).toEqual(IDENTITY3[1]);
    const s = f.screen.meanLinear!;
    expect(dot(m[2], s)).toBeCloseTo(s[2], 5);
    for (const shade of f.markers.shades) expect(dot(m[2], shade.colourLinear)).toBeCloseTo(dot(m[2], s), 5);
    // The matte row maps the screen to 0 (goal "matte").
    const row = (out.recipe[4] as Extract<RecipeStep, { op: "matte" }>).channel as number[];
    expect(Math.abs(dot(row, s))).toBeLessThan(1e-4);
    // The level rectangle lies on clean screen, clear of every marker and speck.
    const rect = (out.recipe[2] as Extract<RecipeStep, { op: "level" }>).rect!;
    expect(rect).toEqual(cleanScreenRect(f));
    for (const b of [...f.markers.items.map((i) => i.box), ...f.dust.items.map((i) => i.box)]) {
      const overlaps = b.x < rect.x + rect.w && rect.x < b.x + b.w && b.y < rect.y + rect.h && rect.y < b.y + b.h;
      expect(overlaps).toBe(false);
    }
    expect(recipeSchema.safeParse(out.recipe).success).toBe(true);
  });

  it("sets screen flattening's target to the screen's measured colour", async () => {
    const { f } = await findingsOf(120, 32);
    const out = fillRecipe([{ op: "flatten", sigma: 40, color: [0.1, 0.5, 0.1], weight: "all" }], f);
    expect(out.recipe[0]).toMatchObject({ op: "flatten", color: f.screen.meanLinear!.map((v) => Math.round(v * 1e6) / 1e6) });
  });

  it("says why a recipe cannot run: no screen, no markers, nothing left", async () => {
    const grey = frameFromCodes(new Uint16Array(120 * 80 * 3).fill(30000), 120, 80, 16);
    const none = await checkFrame(grey);
    expect(fillRecipe(GREEN_RECIPE, none).problem).toMatch(/backing screen/);
    const { f } = await findingsOf(120, 33);
    const noMarkers: Findings = { ...f, markers: { ...f.markers, count: 0, items: [], shades: [] } };
    expect(fillRecipe(GREEN_RECIPE, noMarkers).problem).toMatch(/markers/);
    expect(fillRecipe([{ op: "grain", denoised: "x" }], f).problem).toMatch(/Nothing of its recipe runs/);
  });
});

describe("measuring a try", () => {
  it("a render equal to the plate leaves all marker contrast, gains no noise and changes nothing", async () => {
    const { f, frame } = await findingsOf(120, 34);
    const img = { width: frame.width, height: frame.height, data: frame.linear };
    const m = measureTry(img, { ...img, data: new Float32Array(frame.linear) }, f, "g");
    expect(m.markerContrast!.after).toBe(m.markerContrast!.before);
    expect(m.noiseGain).toBe(1);
    expect(m.changedOutsideMatte).toBe(0);
  });

  it("painting every marker box with its ring's mean removes the contrast; doubling the grain doubles the noise gain", async () => {
    const { f, frame } = await findingsOf(120, 35);
    const W = frame.width, before = { width: W, height: frame.height, data: frame.linear };
    const painted = new Float32Array(frame.linear);
    for (const mk of f.markers.items) {
      const b = mk.box;
      for (let y = b.y - 2; y < b.y + b.h + 2; y++) for (let x = b.x - 2; x < b.x + b.w + 2; x++) for (let c = 0; c < 3; c++) painted[(y * W + x) * 3 + c] = f.screen.meanLinear![c]!;
    }
    const m = measureTry(before, { ...before, data: painted }, f, "g");
    expect(m.markerContrast!.after).toBeLessThan(0.2 * m.markerContrast!.before);
    expect(m.changedOutsideMatte).toBe(0);
    // Noise: a uniform frame with grain; after = the same grain doubled around a constant.
    const n = 200 * 120, r = mulberry32(9);
    const a = new Float32Array(n * 3), b = new Float32Array(n * 3);
    for (let i = 0; i < n * 3; i++) { const g = r() - 0.5; a[i] = 0.3 + 0.01 * g; b[i] = 0.3 + 0.02 * g; }
    const blank: Findings = { ...f, width: 200, height: 120, markers: { ...f.markers, items: [] } };
    const k = measureTry({ width: 200, height: 120, data: a }, { width: 200, height: 120, data: b }, blank, "g");
    expect(k.noiseGain!).toBeCloseTo(2, 5);
  });
});

describe("screen hue", () => {
  // Reference: Python's standard colorsys.rgb_to_hsv (an independent implementation of the HSV hexcone).
  it.skipIf(!fs.existsSync(PYTHON))("matches Python's colorsys.rgb_to_hsv on random colours", () => {
    const r = mulberry32(17);
    const colours = Array.from({ length: 200 }, () => [r(), r(), r()]);
    const out = spawnSync(PYTHON, ["-c", "import sys, json, colorsys; print(json.dumps([colorsys.rgb_to_hsv(*c)[0] * 360 for c in json.loads(sys.stdin.read())]))"], { input: JSON.stringify(colours), encoding: "utf8" });
    const ref = JSON.parse(out.stdout) as number[];
    colours.forEach((c, i) => expect(hueDegrees(c[0]!, c[1]!, c[2]!)).toBeCloseTo(ref[i]!, 9));
  });
});
