import { solve, Matrix } from "ml-matrix";
import sharp from "sharp";
import { linearRegression } from "simple-statistics";
import { describe, expect, it } from "vitest";
import { applyStep, applyStepsAt, codesSource, createLabState, runRecipe, type PixelSource, type ProxyStill } from "@/lib/lab/engine";
import { recipeStepSchema, type RecipeStep } from "@/lib/lab/recipe";

function rand(seed: number): () => number {
  let a = seed >>> 0;
  return () => ((a = (Math.imul(a, 1664525) + 1013904223) >>> 0) / 2 ** 32);
}
const step = (s: unknown): RecipeStep => recipeStepSchema.parse(s);
const floatSource = (data: Float32Array): PixelSource => ({ kind: "float", data });

describe("level match", () => {
  function setup(seed: number) {
    const w = 37, h = 29, r = rand(seed);
    const plate = new Float32Array(w * h * 3);
    for (let i = 0; i < plate.length; i++) plate[i] = r();
    const state = createLabState({ width: w, height: h, plate: floatSource(plate) });
    // Working red = a noisy affine function of the plate's green.
    for (let p = 0; p < w * h; p++) state.cur[p * 3] = 0.3 * plate[p * 3 + 1]! + 0.1 + (r() - 0.5) * 0.05;
    return { w, h, plate, state };
  }

  it("gain + offset equal simple-statistics linearRegression (1e-9)", () => {
    const { w, h, plate, state } = setup(3);
    const pairs: [number, number][] = [];
    for (let p = 0; p < w * h; p++) pairs.push([state.cur[p * 3]!, plate[p * 3 + 1]!]);
    // simple-statistics (npm) least-squares line y = m·x + b
    const ref = linearRegression(pairs);
    const rep = applyStep(state, step({ op: "level", channel: "r", ref: "g", fit: "gain+offset" }), 4);
    if (rep.op !== "level") throw new Error("wrong report");
    expect(rep.index).toBe(4);
    expect(Math.abs(rep.gain - ref.m)).toBeLessThan(1e-9);
    expect(Math.abs(rep.offset - ref.b)).toBeLessThan(1e-9);
    const rms = Math.sqrt(pairs.reduce((a, [x, y]) => a + (ref.m * x + ref.b - y) ** 2, 0) / pairs.length);
    expect(Math.abs(rep.residual - rms)).toBeLessThan(1e-9);
    // The channel now carries the fit.
    expect(state.cur[0]).toBeCloseTo(Math.fround(ref.m * pairs[0]![0] + ref.b), 6);
  });

  it("gain only, over a rectangle, equals ml-matrix least squares through the origin (1e-9)", () => {
    const { w, plate, state } = setup(8);
    const rect = { x: 5, y: 3, w: 20, h: 11 };
    const xs: number[] = [], ys: number[] = [];
    for (let y = rect.y; y < rect.y + rect.h; y++) for (let x = rect.x; x < rect.x + rect.w; x++) {
      xs.push(state.cur[(y * w + x) * 3]!);
      ys.push(plate[(y * w + x) * 3 + 1]!);
    }
    // ml-matrix (npm) solve() of the overdetermined system X·g = y (least squares)
    const g = solve(Matrix.columnVector(xs), Matrix.columnVector(ys)).get(0, 0);
    const rep = applyStep(state, step({ op: "level", channel: "r", ref: "g", fit: "gain", rect }), 0);
    if (rep.op !== "level") throw new Error("wrong report");
    expect(Math.abs(rep.gain - g)).toBeLessThan(1e-9);
    expect(rep.offset).toBe(0);
    expect(rep.samples).toBe(rect.w * rect.h);
  });
});

describe("flatten screen (normalized convolution)", () => {
  it("recovers a constant screen with holes exactly away from the borders, whatever lies under the mask (Knutsson & Westin, CVPR 1993)", () => {
    const w = 120, h = 90, screen = [0.2, 0.55, 0.15], target = [0.1, 0.5, 0.2];
    const holesAt = (x: number, y: number): boolean => (x - 40) ** 2 + (y - 45) ** 2 < 64 || (Math.abs(x - 80) < 5 && Math.abs(y - 30) < 9);
    for (const [seed, sigma] of [[1, 6], [2, 6], [3, 20]] as const) {
      const r = rand(seed);
      const plate = new Float32Array(w * h * 3);
      const matte = new Float64Array(w * h);
      for (let y = 0; y < h; y++) for (let x = 0; x < w; x++) {
        const hole = holesAt(x, y), p = y * w + x;
        matte[p] = hole ? 1 : 0;
        for (let c = 0; c < 3; c++) plate[p * 3 + c] = hole ? r() * 3 - 1 : screen[c]!;
      }
      const state = createLabState({ width: w, height: h, plate: floatSource(plate) });
      state.matte = matte;
      applyStep(state, step({ op: "flatten", sigma, color: target, weight: "outside" }), 0);
      // Border margin; edges are extended by copying, so even the σ = 20 case is exact nearer in.
      const m = Math.min(3 * sigma, 20);
      let checked = 0;
      for (let y = m; y < h - m; y++) for (let x = m; x < w - m; x++) {
        const p = y * w + x;
        for (let c = 0; c < 3; c++) {
          // Screen pixels land on the target; hole pixels are divided by the recovered screen.
          const expected = holesAt(x, y) ? (plate[p * 3 + c]! / screen[c]!) * target[c]! : target[c]!;
          expect(Math.abs(state.cur[p * 3 + c]! - expected)).toBeLessThan(2e-6 * Math.max(1, Math.abs(expected)));
          checked++;
        }
      }
      expect(checked).toBeGreaterThan(10_000);
    }
  });
});

describe("mix and grain", () => {
  it("mix puts the cleaned image inside the matte and the plate outside (PRODUCT.md formula)", () => {
    const w = 8, h = 2, r = rand(4);
    const plate = Float32Array.from({ length: w * h * 3 }, () => r());
    const state = createLabState({ width: w, height: h, plate: floatSource(plate) });
    const cleaned = Float32Array.from({ length: w * h * 3 }, () => r());
    state.cur.set(cleaned);
    state.matte = Float64Array.from({ length: w * h }, (_, i) => (i % 4) / 3);
    applyStep(state, step({ op: "mix" }), 0);
    for (let p = 0; p < w * h; p++) for (let c = 0; c < 3; c++) {
      const m = (p % 4) / 3;
      expect(state.cur[p * 3 + c]).toBeCloseTo(cleaned[p * 3 + c]! * m + plate[p * 3 + c]! * (1 - m), 6);
    }
  });

  it("grain restore gives back the plate wherever nothing was cleaned (common practice, no published source)", async () => {
    const w = 64, h = 32, r = rand(77);
    const den = new Uint16Array(w * h * 3), plate = new Uint16Array(w * h * 3);
    for (let i = 0; i < den.length; i++) {
      den[i] = 8000 + Math.floor(r() * 40000);
      plate[i] = Math.min(65535, Math.max(0, den[i]! + Math.round((r() - 0.5) * 3000)));
    }
    const png = (a: Uint16Array) => sharp(a, { raw: { width: w, height: h, channels: 3 } }).toColourspace("rgb16").png().toBuffer();
    const [platePng, denPng] = await Promise.all([png(plate), png(den)]);
    const grain = step({ op: "grain", denoised: "den-id" });
    const seen: string[] = [];
    for (const space of ["linear", "stored"] as const) {
      // The recipe cleans nothing before regraining (it starts from the denoised plate), so the
      // output must be the plate, bit for bit.
      const untouched = await runRecipe({
        still: platePng, steps: [grain], space, format: "png16",
        loadStill: (id) => { seen.push(id); return denPng; },
      });
      const { data } = await sharp(untouched.bytes).toColourspace("rgb16").raw({ depth: "ushort" }).toBuffer({ resolveWithObject: true });
      const out = new Uint16Array(data.buffer, data.byteOffset, data.length / 2);
      let diff = 0;
      for (let i = 0; i < out.length; i++) if (out[i] !== plate[i]) diff++;
      expect(diff).toBe(0);
    }
    expect(seen).toEqual(["den-id", "den-id"]);
  });

  it("grain restore adds exactly plate − denoised on top of a cleaned region", () => {
    const w = 6, h = 1;
    const plate = Float32Array.from({ length: 18 }, (_, i) => 0.5 + 0.01 * Math.sin(i));
    const den = new Float32Array(18).fill(0.5);
    const state = createLabState({ width: w, height: h, plate: floatSource(plate), base: floatSource(den) });
    state.cur.fill(0.3); // a cleaned value
    applyStep(state, step({ op: "grain", denoised: "x" }), 0);
    for (let i = 0; i < 18; i++) expect(state.cur[i]).toBeCloseTo(0.3 + (plate[i]! - 0.5), 6);
  });
});

describe("one-pass paths the engine takes", () => {
  // Stored 16-bit codes (what decoded stills are), so the engine's code-table paths run.
  function codeState(seed: number) {
    const w = 41, h = 23, r = rand(seed);
    const den = new Uint16Array(w * h * 3), plate = new Uint16Array(w * h * 3);
    for (let i = 0; i < den.length; i++) {
      den[i] = 5000 + Math.floor(r() * 50000);
      plate[i] = Math.min(65535, Math.max(0, den[i]! + Math.round((r() - 0.5) * 4000)));
    }
    const still = (codes: Uint16Array) => ({ width: w, height: h, bits: 16 as const, codes });
    const make = () => createLabState({ width: w, height: h, plate: codesSource(still(plate), "linear"), base: codesSource(still(den), "linear") });
    return { w, h, r, make };
  }

  it("mix then grain in one pass equals the two steps run apart, and gives the plate bit-exact outside the matte", () => {
    // PRODUCT.md: mix = cleaned × matte + original × (1 − matte); grain = clean + (plate − denoised).
    for (const invert of [false, true]) {
      const { w, h, r, make } = codeState(invert ? 12 : 11);
      const a = make(), b = make();
      const cleaned = Float32Array.from({ length: w * h * 3 }, () => r() * 1.2 - 0.1);
      const matte = Float64Array.from({ length: w * h }, (_, p) => (p % 3 === 0 ? (invert ? 1 : 0) : r()));
      for (const s of [a, b]) { s.cur.set(cleaned); s.matte = new Float64Array(matte); }
      const steps = [step({ op: "mix", invert }), step({ op: "grain", denoised: "d" })];
      const reports = applyStepsAt(a, steps, 0);
      expect(reports.map((x) => x.op)).toEqual(["mix", "grain"]);
      applyStep(b, steps[0]!, 0);
      applyStep(b, steps[1]!, 1);
      const plateLin = a.plate.kind === "codes" ? a.plate : null;
      for (let p = 0; p < w * h; p++) for (let c = 0; c < 3; c++) {
        const i = p * 3 + c;
        expect(a.cur[i]).toBeCloseTo(b.cur[i]!, 6);
        if (p % 3 === 0) expect(a.cur[i]).toBe(plateLin!.lut[plateLin!.codes[i]!]);
      }
    }
  });

  it("a matte from the plate in one pass equals weights, then the ramp, then the mean", () => {
    const { w, h, make } = codeState(13);
    const s = make();
    const weights: [number, number, number] = [-0.8, 1.9, -0.4];
    const rep = applyStep(s, step({ op: "matte", channel: weights, source: "plate", black: 0.05, white: 0.3 }), 0);
    const base = s.base as Extract<PixelSource, { kind: "codes" }>;
    let sum = 0;
    for (let p = 0; p < w * h; p++) {
      const v = weights[0] * base.lut[base.codes[p * 3]!]! + weights[1] * base.lut[base.codes[p * 3 + 1]!]! + weights[2] * base.lut[base.codes[p * 3 + 2]!]!;
      const want = Math.min(1, Math.max(0, (v - 0.05) / 0.25));
      expect(s.matte![p]).toBeCloseTo(want, 6);
      sum += want;
    }
    expect(rep.op === "matte" && rep.coverage).toBeCloseTo(sum / (w * h), 6);
  });
});

describe("proxy paths (decoded proxy kept as working-space floats)", () => {
  it("mix then grain over float sources equals the two steps apart, plate bit-exact where the matte is 0", () => {
    // PRODUCT.md: mix = cleaned × matte + original × (1 − matte); grain = clean + (plate − denoised).
    for (const invert of [false, true]) {
      const w = 29, h = 13, r = rand(invert ? 22 : 21);
      const den = Float32Array.from({ length: w * h * 3 }, () => 0.1 + r() * 0.8);
      const plate = den.map((v) => v + (r() - 0.5) * 0.05);
      const make = () => createLabState({ width: w, height: h, plate: floatSource(plate), base: floatSource(den) });
      const a = make(), b = make();
      const cleaned = Float32Array.from({ length: w * h * 3 }, () => r() * 1.2 - 0.1);
      // Whole zero rows, zero margins and zeros inside a span: every branch of the span copy.
      const zero = invert ? 1 : 0;
      const matte = Float64Array.from({ length: w * h }, (_, p) => {
        const x = p % w, y = Math.floor(p / w);
        return y % 4 === 0 || x < 5 || x > 20 || x === 11 ? zero : r();
      });
      for (const s of [a, b]) { s.cur.set(cleaned); s.matte = new Float64Array(matte); }
      const steps = [step({ op: "mix", invert }), step({ op: "grain", denoised: "d" })];
      expect(applyStepsAt(a, steps, 0).map((x) => x.op)).toEqual(["mix", "grain"]);
      applyStep(b, steps[0]!, 0);
      applyStep(b, steps[1]!, 1);
      for (let p = 0; p < w * h; p++) for (let c = 0; c < 3; c++) {
        const i = p * 3 + c;
        expect(a.cur[i]).toBeCloseTo(b.cur[i]!, 6);
        if (matte[p] === zero) expect(a.cur[i]).toBe(plate[i]);
      }
    }
  });

  it("a copy directly followed by a level of the copied channel runs as one pass with the same values and reports", () => {
    const w = 31, h = 17, r = rand(31);
    const plate = Float32Array.from({ length: w * h * 3 }, () => r());
    const steps = [step({ op: "copy", from: "g", to: "r" }), step({ op: "level", channel: "r", ref: "r", fit: "gain+offset", rect: { x: 3, y: 2, w: 11, h: 7 } })];
    const a = createLabState({ width: w, height: h, plate: floatSource(plate) });
    const b = createLabState({ width: w, height: h, plate: floatSource(plate) });
    const fused = applyStepsAt(a, steps, 0);
    const apart = [applyStep(b, steps[0]!, 0), applyStep(b, steps[1]!, 1)];
    expect(fused).toEqual(apart);
    expect(Array.from(a.cur)).toEqual(Array.from(b.cur));
    expect(a.cur[0]).not.toBe(plate[0]); // the level changed red
  });

  it("two copy+level pairs from one source (a solved hide spreads its channel) run as one pass with the same values", () => {
    const w = 31, h = 17, r = rand(32);
    const plate = Float32Array.from({ length: w * h * 3 }, () => r());
    const rect = { x: 2, y: 1, w: 13, h: 9 };
    const steps = [
      step({ op: "copy", from: "g", to: "r" }), step({ op: "level", channel: "r", ref: "r", fit: "gain", rect }),
      step({ op: "copy", from: "g", to: "b" }), step({ op: "level", channel: "b", ref: "b", fit: "gain+offset" }),
    ];
    const a = createLabState({ width: w, height: h, plate: floatSource(plate) });
    const b = createLabState({ width: w, height: h, plate: floatSource(plate) });
    const fused = applyStepsAt(a, steps, 0);
    const apart = steps.map((st, i) => applyStep(b, st, i));
    expect(fused).toEqual(apart);
    expect(Array.from(a.cur)).toEqual(Array.from(b.cur));
    expect(a.cur[2]).not.toBe(plate[2]); // the second level changed blue
  });

  it("a proxy re-rendered from the decode cache is bit-identical to one decoded afresh (demo recipe)", async () => {
    const { generateSyntheticPlate, demoCleanupRecipe } = await import("@/lib/lab/synthetic");
    const { recipeSchema } = await import("@/lib/lab/recipe");
    const W = 320, H = 170;
    const syn = await generateSyntheticPlate({ width: W, height: H, compressionLevel: 1 });
    const steps = recipeSchema.parse(demoCleanupRecipe({ denoisedStillId: "den", width: W, screen: syn.screen, markerSamples: syn.markerSamples, screenSamples: syn.screenSamples, screenRect: syn.screenRect }));
    const kept = new Map<string, ProxyStill>();
    const decodeCache = { get: (k: string) => kept.get(k), set: (k: string, v: ProxyStill) => void kept.set(k, v) };
    const loadStill = () => syn.denoised;
    // png16 runs the float steps; png (8-bit, lossless) also the encode that copies the plate's
    // codes outside the matte instead of quantising there.
    // A step after the grain step: the working image must then be whole outside the matte too.
    const after = [...steps, step({ op: "matrix", m: [[0.9, 0.1, 0], [0, 1, 0], [0, 0, 1]] })];
    for (const [space, format, recipe] of [["linear", "png16", steps], ["stored", "png16", steps], ["linear", "png", steps], ["stored", "png", steps], ["linear", "png", after]] as const) {
      const opts = { still: syn.plate, steps: recipe, space, format, width: 160, loadStill };
      const fresh = await runRecipe(opts);
      await runRecipe({ ...opts, decodeCache, plateKey: "p" });
      const again = await runRecipe({ ...opts, decodeCache, plateKey: "p" });
      expect(fresh.width).toBe(160);
      expect(Buffer.compare(again.bytes, fresh.bytes)).toBe(0);
      expect(again.reports).toEqual(fresh.reports);
    }
    expect([...kept.keys()].sort()).toEqual(["den:den@160:linear", "den:den@160:stored", "p@160:linear", "p@160:stored"]);
  });
});

describe("float result", () => {
  it("runRecipeToFloat keeps values outside 0..1 that the encoded result clips", async () => {
    const { runRecipeToFloat } = await import("@/lib/lab/engine");
    const u = new Uint16Array(4 * 2 * 3).fill(65535);
    const png = await sharp(u, { raw: { width: 4, height: 2, channels: 3 } }).toColourspace("rgb16").png().toBuffer();
    const r = await runRecipeToFloat({ still: png, steps: [step({ op: "matrix", m: [[2, 0, 0], [0, 1, 0], [0, 0, -1]] })], space: "stored", withBefore: true });
    expect(r.before!.data[0]).toBe(1);
    expect(r.after.data[0]).toBe(2);
    expect(r.after.data[2]).toBe(-1);
  });
});

describe("values beyond the float range", () => {
  async function still16(w: number, h: number, seed: number): Promise<{ png: Buffer; codes: Uint16Array }> {
    const r = rand(seed);
    const codes = Uint16Array.from({ length: w * h * 3 }, () => 1000 + Math.floor(r() * 60000));
    const png = await sharp(codes, { raw: { width: w, height: h, channels: 3 } }).toColourspace("rgb16").png().toBuffer();
    return { png, codes };
  }
  const gains = (k: number, times: number) => Array.from({ length: times }, () => step({ op: "matrix", m: [[k, 0, 0], [0, k, 0], [0, 0, k]] }));

  it("twenty gains of 100 then twenty of 0.01 fail the run at the step that overflowed, never as black pixels", async () => {
    // 100^20 = 1e40 exceeds float32's largest value (about 3.4e38, IEEE 754 binary32): step 20.
    const { png } = await still16(16, 8, 5);
    const { LabOverflowError } = await import("@/lib/lab/engine");
    for (const space of ["stored", "linear"] as const) {
      const run = runRecipe({ still: png, steps: [...gains(100, 20), ...gains(0.01, 20)], space, format: "png16" });
      await expect(run).rejects.toBeInstanceOf(LabOverflowError);
      await expect(run).rejects.toMatchObject({ stepIndex: 19, op: "matrix" });
    }
  });

  it("ten gains of 100 then ten of 0.01 stay finite and give the still back (within a code)", async () => {
    const { png, codes } = await still16(16, 8, 6);
    const out = await runRecipe({ still: png, steps: [...gains(100, 10), ...gains(0.01, 10)], space: "stored", format: "png16" });
    const { data } = await sharp(out.bytes).toColourspace("rgb16").raw({ depth: "ushort" }).toBuffer({ resolveWithObject: true });
    const back = new Uint16Array(data.buffer, data.byteOffset, data.length / 2);
    for (let i = 0; i < codes.length; i++) expect(Math.abs(back[i]! - codes[i]!)).toBeLessThanOrEqual(1);
  });
});

describe("flatten's fill where too little screen is within reach", () => {
  it("a constant screen with a hole wider than the kernel's reach is recovered everywhere, hole centre included (Knutsson & Westin, CVPR 1993)", () => {
    // Deep in the hole blur(w) → 0, where the estimate is the frame's mean screen colour; on a
    // constant screen that is the screen itself, so the result is the same as near the edges.
    const w = 160, h = 120, screen = [0.12, 0.5, 0.2], target = [0.1, 0.45, 0.15], sigma = 6;
    const r = rand(41);
    const inHole = (x: number, y: number) => (x - 80) ** 2 + (y - 60) ** 2 < 45 ** 2;
    const plate = new Float32Array(w * h * 3), matte = new Float64Array(w * h);
    for (let y = 0; y < h; y++) for (let x = 0; x < w; x++) {
      const p = y * w + x, hole = inHole(x, y);
      matte[p] = hole ? 1 : 0;
      for (let c = 0; c < 3; c++) plate[p * 3 + c] = hole ? 0.05 + r() : screen[c]!;
    }
    const state = createLabState({ width: w, height: h, plate: floatSource(plate) });
    state.matte = matte;
    const rep = applyStep(state, step({ op: "flatten", sigma, color: target, weight: "outside" }), 3);
    if (rep.op !== "flatten") throw new Error("wrong report");
    // The hole's middle (radius 45 − 4σ = 21) sees no screen at all; its rim some.
    expect(rep.thin).toBeGreaterThan(Math.PI * 21 ** 2);
    expect(rep.thin).toBeLessThan(Math.PI * 45 ** 2);
    expect(rep.leftAsIs).toBe(0);
    for (let c = 0; c < 3; c++) expect(rep.screenMean[c]).toBeCloseTo(screen[c]!, 6);
    let worst = 0;
    for (let p = 0; p < w * h; p++) for (let c = 0; c < 3; c++) {
      const expected = (plate[p * 3 + c]! / screen[c]!) * target[c]!;
      worst = Math.max(worst, Math.abs(state.cur[p * 3 + c]! - expected) / Math.max(1, expected));
    }
    expect(worst).toBeLessThan(2e-6);
  });
});

describe("flatten on a proxy (the approximate blur's reduced path)", () => {
  it("the fused pass equals blurring w and value·w plane by plane with the same approximation", async () => {
    const { blurPlaneApprox } = await import("@/lib/lab/kernels");
    const { FLATTEN_MIN_SCREEN } = await import("@/lib/lab/engine");
    const w = 97, h = 61, r = rand(52), sigma = 40, target = [0.1, 0.45, 0.15] as const;
    const plate = Float32Array.from({ length: w * h * 3 }, (_, i) => 0.05 + r() * (i % 3 === 1 ? 0.6 : 0.2));
    const matte = Float64Array.from({ length: w * h }, (_, p) => ((p % w) - 40) ** 2 + (Math.floor(p / w) - 30) ** 2 < 400 ? 1 : r() * 0.1);
    const state = createLabState({ width: w, height: h, plate: floatSource(plate), scale: 2 });
    expect(state.exact).toBe(false);
    state.matte = new Float64Array(matte);
    const rep = applyStep(state, step({ op: "flatten", sigma: sigma * 2, color: [...target], weight: "outside" }), 0);
    if (rep.op !== "flatten") throw new Error("wrong report");
    // Plane by plane: D = G̃(w), N_c = G̃(value_c·w), the same fill rule.
    const wt = Float64Array.from(matte, (m) => 1 - Math.min(1, Math.max(0, m)));
    const D = new Float64Array(wt);
    blurPlaneApprox(D, w, h, sigma, new Float64Array(w * h));
    let sumW = 0;
    const sums: number[] = [0, 0, 0];
    for (let p = 0; p < w * h; p++) { sumW += wt[p]!; for (let c = 0; c < 3; c++) sums[c] = sums[c]! + wt[p]! * plate[p * 3 + c]!; }
    let worst = 0, thin = 0;
    for (let p = 0; p < w * h; p++) if (D[p]! < FLATTEN_MIN_SCREEN) thin++;
    for (let c = 0; c < 3; c++) {
      const N = Float64Array.from({ length: w * h }, (_, p) => plate[p * 3 + c]! * wt[p]!);
      blurPlaneApprox(N, w, h, sigma, new Float64Array(w * h));
      for (let p = 0; p < w * h; p++) {
        const d = D[p]!, tau = FLATTEN_MIN_SCREEN;
        const est = d >= tau ? N[p]! / d : (N[p]! + (tau - d) * (sums[c]! / sumW)) / tau;
        const want = (plate[p * 3 + c]! / est) * target[c]!;
        worst = Math.max(worst, Math.abs(state.cur[p * 3 + c]! - want) / Math.max(1, Math.abs(want)));
      }
    }
    expect(worst).toBeLessThan(1e-6);
    expect(rep.thin).toBe(thin);
  });
});
