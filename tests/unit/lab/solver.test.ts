import { inverse, Matrix } from "ml-matrix";
import { beforeAll, describe, expect, it } from "vitest";
import { applyStep, codesSource, createLabState, decodeStill, runRecipe } from "@/lib/lab/engine";
import { recipeSchema } from "@/lib/lab/recipe";
import { solveRow } from "@/lib/lab/solver";
import { demoCleanupRecipe, generateSyntheticPlate, type SyntheticPlate } from "@/lib/lab/synthetic";

function rand(seed: number): () => number {
  let a = seed >>> 0;
  return () => ((a = (Math.imul(a, 1664525) + 1013904223) >>> 0) / 2 ** 32);
}
const rgb = (r: () => number): [number, number, number] => [r(), r(), r()];
const dot = (a: readonly number[], b: readonly number[]) => a[0]! * b[0]! + a[1]! * b[1]! + a[2]! * b[2]!;
const CH = { r: 0, g: 1, b: 2 } as const;

describe("solver: hide", () => {
  it("meets r·s = s_c and r·m_i = r·s to 1e-9 and equals the closed-form minimum change (ml-matrix)", () => {
    const r = rand(1);
    for (let trial = 0; trial < 50; trial++) {
      const channel = (["r", "g", "b"] as const)[trial % 3]!;
      const c = CH[channel];
      const markers = Array.from({ length: 1 + (trial % 2) }, () => rgb(r));
      const screen = [rgb(r)];
      const s = screen[0]!;
      const out = solveRow({ markers, screen, goal: { kind: "hide", channel } });
      expect(Math.abs(dot(out.row, s) - s[c])).toBeLessThan(1e-9);
      for (const m of markers) expect(Math.abs(dot(out.row, m) - dot(out.row, s))).toBeLessThan(1e-9);
      // Closed form: min ‖d‖ subject to A d = t, A = [m_i − s; sᵀ], t = [−(m_i − s)_c; 0]
      // → d = Aᵀ (A Aᵀ)⁻¹ t, computed independently with ml-matrix's inverse.
      const A = new Matrix([...markers.map((m) => [m[0] - s[0], m[1] - s[1], m[2] - s[2]]), [...s]]);
      const t = Matrix.columnVector([...markers.map((m) => -(m[c] - s[c])), 0]);
      const d = A.transpose().mmul(inverse(A.mmul(A.transpose()))).mmul(t);
      for (let j = 0; j < 3; j++) expect(Math.abs(out.row[j]! - ((j === c ? 1 : 0) + d.get(j, 0)))).toBeLessThan(1e-9);
      // Only the target row changes.
      for (let i = 0; i < 3; i++) if (i !== c) expect(out.matrix[i]).toEqual([0, 1, 2].map((j) => (i === j ? 1 : 0)));
      expect(out.matrix[c]).toEqual(out.row);
      expect(out.residual).toBeLessThan(1e-9);
      expect(out.noiseGain).toBeCloseTo(Math.hypot(...out.row), 12);
    }
  });

  it("with more shades than freedom, is the least-squares fit and still keeps the screen level", () => {
    const r = rand(2);
    const markers = Array.from({ length: 5 }, () => rgb(r));
    const s = rgb(r);
    const out = solveRow({ markers, screen: [s], goal: { kind: "hide", channel: "g" } });
    expect(Math.abs(dot(out.row, s) - s[1])).toBeLessThan(1e-9);
    // Normal equations of min ‖D d − b‖ over d ⊥ s: P Dᵀ (D d − b) = 0.
    const D = new Matrix(markers.map((m) => [m[0] - s[0], m[1] - s[1], m[2] - s[2]]));
    const b = Matrix.columnVector(markers.map((m) => -(m[1] - s[1])));
    const dvec = Matrix.columnVector([out.row[0], out.row[1] - 1, out.row[2]]);
    const ss = dot(s, s);
    const P = Matrix.eye(3).sub(Matrix.columnVector(s).mmul(Matrix.rowVector(s)).div(ss));
    const grad = P.mmul(D.transpose()).mmul(D.mmul(dvec).sub(b));
    for (let j = 0; j < 3; j++) expect(Math.abs(grad.get(j, 0))).toBeLessThan(1e-9);
    expect(out.perShade).toHaveLength(5);
    expect(out.residual).toBeGreaterThan(0);
  });
});

describe("solver: matte", () => {
  it("maps markers to 1 and the screen to 0 (1e-9)", () => {
    const r = rand(3);
    for (let trial = 0; trial < 30; trial++) {
      const markers = Array.from({ length: 1 + (trial % 2) }, () => rgb(r));
      const s = rgb(r);
      const out = solveRow({ markers, screen: [s], goal: { kind: "matte", channel: "b" } });
      expect(Math.abs(dot(out.row, s))).toBeLessThan(1e-9);
      for (const m of markers) expect(Math.abs(dot(out.row, m) - 1)).toBeLessThan(1e-9);
    }
  });
  it("ridge keeps r·s = 0 and shrinks the row", () => {
    const markers: [number, number, number][] = [[0.5, 0.2, 0.3], [0.52, 0.21, 0.29]];
    const s: [number, number, number] = [0.1, 0.6, 0.2];
    const plain = solveRow({ markers, screen: [s], goal: { kind: "matte", channel: "g" } });
    const ridge = solveRow({ markers, screen: [s], goal: { kind: "matte", channel: "g" }, ridge: 0.1 });
    expect(Math.abs(dot(ridge.row, s))).toBeLessThan(1e-9);
    expect(ridge.noiseGain).toBeLessThan(plain.noiseGain);
  });
});

describe("on the synthetic demo plate", () => {
  let syn: SyntheticPlate;
  beforeAll(async () => {
    syn = await generateSyntheticPlate({ width: 768, height: 405, seed: 21, compressionLevel: 1 });
  });

  it("the solved matrix drops the marker/screen contrast in the screen channel below 1% of the screen level", async () => {
    const steps = recipeSchema.parse(demoCleanupRecipe({ denoisedStillId: "d", width: syn.width, screen: syn.screen, markerSamples: syn.markerSamples, screenSamples: syn.screenSamples, screenRect: syn.screenRect }));
    const den = await decodeStill(syn.denoised);
    const state = createLabState({ width: syn.width, height: syn.height, plate: codesSource(den, "linear") });
    const g = (x: number, y: number) => state.cur[(Math.round(y) * syn.width + Math.round(x)) * 3 + 1]!;
    // Markers whose side samples would fall off the frame are left out of the measurement.
    const inside = syn.markers.filter((m) => m.x - m.size - 6 >= 0 && m.x + m.size + 6 <= syn.width - 1);
    expect(inside.length).toBeGreaterThan(20);
    const contrast = () => inside.map((m) => {
      const screen = (g(m.x - m.size - 6, m.y) + g(m.x + m.size + 6, m.y)) / 2;
      return Math.abs(g(m.x, m.y) - screen) / screen;
    });
    const before = contrast();
    applyStep(state, steps[0]!, 0);
    const after = contrast();
    // The markers really stand out at first (the pink hue strongly, the yellow one less so in green).
    const meanOf = (xs: number[], hue: number) => {
      const sel = xs.filter((_, i) => inside[i]!.hue === hue);
      return sel.reduce((a, v) => a + v, 0) / sel.length;
    };
    expect(meanOf(before, 0)).toBeGreaterThan(0.3);
    expect(meanOf(before, 1)).toBeGreaterThan(0.03);
    expect(Math.max(...after)).toBeLessThan(0.01);
  });

  it("the full demo recipe removes the markers: output ≈ the clean truth where the markers were", async () => {
    const steps = recipeSchema.parse(demoCleanupRecipe({ denoisedStillId: "den", width: syn.width, screen: syn.screen, markerSamples: syn.markerSamples, screenSamples: syn.screenSamples, screenRect: syn.screenRect }));
    const res = await runRecipe({ still: syn.plate, steps, space: "linear", format: "png16", loadStill: () => syn.denoised });
    const [out, truth, plate] = await Promise.all([decodeStill(res.bytes), decodeStill(syn.cleanTruth), decodeStill(syn.plate)]);
    let errOut = 0, errPlate = 0, n = 0;
    for (const m of syn.markers) {
      const r = Math.ceil(m.size + 3);
      for (let y = Math.max(0, Math.round(m.y) - r); y <= Math.min(syn.height - 1, Math.round(m.y) + r); y++) {
        for (let x = Math.max(0, Math.round(m.x) - r); x <= Math.min(syn.width - 1, Math.round(m.x) + r); x++) {
          for (let c = 0; c < 3; c++) {
            const i = (y * syn.width + x) * 3 + c;
            errOut += Math.abs(out.codes[i]! - truth.codes[i]!) / 65535;
            errPlate += Math.abs(plate.codes[i]! - truth.codes[i]!) / 65535;
            n++;
          }
        }
      }
    }
    // Mean code error around the markers: before ~ marker contrast, after within the grain's reach.
    expect(errPlate / n).toBeGreaterThan(0.02);
    expect(errOut / n).toBeLessThan(0.002);
    const level = res.reports.find((r) => r.op === "level");
    expect(level && level.op === "level" && level.residual).toBeLessThan(1e-3);
  });

  it("works the same on a blue backing screen (hiding in the blue channel)", async () => {
    const blue = await generateSyntheticPlate({ width: 512, height: 270, seed: 5, screen: "blue", compressionLevel: 1 });
    const steps = recipeSchema.parse(demoCleanupRecipe({ denoisedStillId: "den", width: blue.width, screen: "blue", markerSamples: blue.markerSamples, screenSamples: blue.screenSamples, screenRect: blue.screenRect }));
    expect(steps[0]!.op === "matrix" && steps[0]!.m[0]).toEqual([1, 0, 0]);
    const res = await runRecipe({ still: blue.plate, steps, space: "linear", format: "png16", loadStill: () => blue.denoised });
    const [out, truth, plate] = await Promise.all([decodeStill(res.bytes), decodeStill(blue.cleanTruth), decodeStill(blue.plate)]);
    let errOut = 0, errPlate = 0;
    for (let i = 0; i < out.codes.length; i++) {
      errOut += Math.abs(out.codes[i]! - truth.codes[i]!);
      errPlate += Math.abs(plate.codes[i]! - truth.codes[i]!);
    }
    // Over the whole frame (foreground included): the recipe must leave it at least 10× closer to the truth.
    expect(errOut).toBeLessThan(errPlate / 10);
  });
});
