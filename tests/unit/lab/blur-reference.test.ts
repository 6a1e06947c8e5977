import sharp from "sharp";
import { describe, expect, it } from "vitest";
import { exactBlurCounts } from "@/lib/lab/gaussian";
import { FLATTEN_MIN_SCREEN, runRecipe } from "@/lib/lab/engine";
import { recipeSchema, type RecipeStepInput } from "@/lib/lab/recipe";
import { scipyGate, scipyReference, type ReferenceJob } from "@/tests/unit/lab/scipy-reference";

/*
 * soften and flatten on exact renders against scipy.ndimage.gaussian_filter in float64 (Debian's
 * python3-scipy; mode="nearest", truncate=4.0 — the engine's documented kernel), through the whole
 * engine: 16-bit PNG in, png16 out, every pixel within ±1 code value, borders included.
 * The stills are random each run (the seed is in every failure message) with hard edges touching
 * the frame border; sigmas are the fixed set plus random ones.
 */

const gate = scipyGate();
const seed = Number(process.env.LAB_REFERENCE_SEED ?? Math.floor(Math.random() * 2 ** 31));

function rand(s: number): () => number {
  let a = s >>> 0;
  return () => ((a = (Math.imul(a, 1664525) + 1013904223) >>> 0) / 2 ** 32);
}
const r = rand(seed);

/** Noise, a near-black patch beside a bright one, and constant bands on all four frame edges. */
function randomStill(width: number, height: number): Uint16Array {
  const codes = new Uint16Array(width * height * 3);
  const band = () => 1 + Math.floor(r() * Math.max(1, Math.min(width, height) / 6));
  const left = band(), top = band(), right = band(), bottom = band();
  const edge = [0, 1, 2].map(() => [Math.floor(r() * 65536), Math.floor(r() * 65536), Math.floor(r() * 65536), Math.floor(r() * 65536)]);
  const px = Math.floor(r() * width * 0.6), py = Math.floor(r() * height * 0.6);
  for (let y = 0; y < height; y++) for (let x = 0; x < width; x++) {
    const i = (y * width + x) * 3;
    for (let c = 0; c < 3; c++) {
      let v = Math.floor(r() * 65536);
      if (x < left) v = edge[c]![0]!;
      else if (y < top) v = edge[c]![1]!;
      else if (x >= width - right) v = edge[c]![2]!;
      else if (y >= height - bottom) v = edge[c]![3]!;
      else if (x >= px && x < px + width / 5 && y >= py && y < py + height / 5) v = x < px + width / 10 ? Math.floor(r() * 300) : 65535;
      codes[i + c] = v;
    }
  }
  return codes;
}

/** A green screen that varies across the frame, with foreground shapes, some cut by the frame edge. */
function screenStill(width: number, height: number): Uint16Array {
  const codes = new Uint16Array(width * height * 3);
  const blobs = Array.from({ length: 4 }, (_, i) => ({
    x: i === 0 ? 0 : r() * width, y: i === 1 ? height - 1 : r() * height, rad: 4 + r() * Math.min(width, height) / 5,
  }));
  for (let y = 0; y < height; y++) for (let x = 0; x < width; x++) {
    const fg = blobs.some((b) => (x - b.x) ** 2 + (y - b.y) ** 2 < b.rad ** 2);
    const shade = 0.7 + 0.5 * (x / width) * (1 - 0.4 * (y / height));
    const noise = () => (r() - 0.5) * 0.04;
    const rgb = fg ? [0.55 + noise(), 0.2 + noise(), 0.15 + noise()] : [0.08 * shade + noise(), 0.5 * shade + noise(), 0.12 * shade + noise()];
    for (let c = 0; c < 3; c++) codes[(y * width + x) * 3 + c] = Math.round(Math.min(1, Math.max(0, rgb[c]!)) * 65535);
  }
  return codes;
}

/** Mostly zero green (a marker-matte-like plane): a few small spots, some on the frame edge. */
function sparseStill(width: number, height: number): Uint16Array {
  const codes = new Uint16Array(width * height * 3);
  for (let i = 0; i < codes.length; i += 3) { codes[i] = Math.floor(r() * 65536); codes[i + 2] = Math.floor(r() * 65536); }
  const spots = [[0, 3], [width - 2, height - 1], [Math.floor(width / 2), 0], ...Array.from({ length: 6 }, () => [Math.floor(r() * width), Math.floor(r() * height)])];
  for (const [cx, cy] of spots) {
    for (let y = cy! - 2; y <= cy! + 2; y++) for (let x = cx! - 2; x <= cx! + 2; x++) {
      if (x >= 0 && y >= 0 && x < width && y < height) codes[(y * width + x) * 3 + 1] = 20000 + Math.floor(r() * 45535);
    }
  }
  return codes;
}

async function engine(job: ReferenceJob, steps: RecipeStepInput[]): Promise<Uint16Array> {
  const png = await sharp(job.codes, { raw: { width: job.width, height: job.height, channels: 3 } }).toColourspace("rgb16").png().toBuffer();
  const out = await runRecipe({ still: png, steps: recipeSchema.parse(steps), space: job.space, format: "png16" });
  expect(out.approximate).toBe(false);
  const { data } = await sharp(out.bytes, { ignoreIcc: true }).toColourspace("rgb16").raw({ depth: "ushort" }).toBuffer({ resolveWithObject: true });
  return new Uint16Array(data.buffer, data.byteOffset, data.length / 2);
}

function stepsFor(job: ReferenceJob): RecipeStepInput[] {
  switch (job.kind) {
    case "soften":
      return [{ op: "soften", sigma: job.sigma, target: job.channel }];
    case "soften-matte":
      return [
        { op: "matte", channel: "g", source: "current", black: 0, white: 1 },
        { op: "soften", sigma: job.sigma, target: "matte" },
        { op: "matrix", m: [[0, 0, 0], [0, 0, 0], [0, 0, 0]], offset: [1, 1, 1] },
        { op: "mix" },
      ];
    case "flatten":
      return [
        { op: "matte", channel: job.weights, source: "plate", black: job.black, white: job.white },
        ...(job.matteSigma ? [{ op: "soften" as const, sigma: job.matteSigma, target: "matte" as const }] : []),
        { op: "flatten", sigma: job.sigma, color: job.color, weight: "outside" },
      ];
  }
}

/** Worst |ours − reference| in code values, and where, over the whole frame. */
function compare(job: ReferenceJob, ours: Uint16Array, ref: Uint16Array) {
  let worst = 0, at = -1, differing = 0;
  for (let i = 0; i < ref.length; i++) {
    const d = Math.abs(ours[i]! - ref[i]!);
    if (d > 0) differing++;
    if (d > worst) { worst = d; at = i; }
  }
  const p = Math.floor(at / 3);
  return { worst, differing, where: at < 0 ? "-" : `(${p % job.width}, ${Math.floor(p / job.width)}) channel ${at % 3}` };
}

function label(job: ReferenceJob): string {
  const extra = job.kind === "flatten" ? `, matte σ ${job.matteSigma}` : job.kind === "soften" ? `, channel ${job.channel}` : "";
  return `${job.kind} σ ${job.sigma.toFixed(3)} on ${job.width}×${job.height} (${job.space}${extra}; seed ${seed})`;
}

const fixedSigmas = [0.5, 3.49, 3.5, 12, 40, 200];
const randomSigma = (): number => Math.round(Math.exp(Math.log(0.3) + r() * Math.log(200 / 0.3)) * 1000) / 1000;
const size = (): [number, number] => [40 + Math.floor(r() * 320), 20 + Math.floor(r() * 200)];

function jobs(): ReferenceJob[] {
  const out: ReferenceJob[] = [];
  const space = (i: number): "stored" | "linear" => (i % 2 === 0 ? "stored" : "linear");
  fixedSigmas.forEach((sigma, i) => {
    const [width, height] = [301, 167];
    out.push({ kind: "soften", sigma, channel: (["r", "g", "b"] as const)[i % 3]!, width, height, space: space(i), codes: randomStill(width, height) });
    out.push({ kind: "soften-matte", sigma, width, height, space: "stored", codes: randomStill(width, height) });
  });
  // Mostly-zero mattes take the sparse path at small radii.
  for (const sigma of [0.6, 1.2, 3]) out.push({ kind: "soften-matte", sigma, width: 640, height: 360, space: "stored", codes: sparseStill(640, 360) });
  // Wide enough that the FFT runs each row in several segments.
  out.push({ kind: "soften", sigma: 40, channel: "g", width: 2100, height: 48, space: "linear", codes: randomStill(2100, 48) });
  for (let i = 0; i < 4; i++) {
    const [width, height] = size();
    out.push({ kind: "soften", sigma: randomSigma(), channel: "b", width, height, space: space(i), codes: randomStill(width, height) });
  }
  const flatten = (sigma: number, matteSigma: number, i: number, width: number, height: number): ReferenceJob => ({
    kind: "flatten", sigma, matteSigma, weights: [1, -1, 0], black: -0.25, white: 0.05, color: [0.1, 0.5, 0.15], tau: FLATTEN_MIN_SCREEN,
    width, height, space: space(i), codes: screenStill(width, height),
  });
  out.push(flatten(40, 1.5, 0, 320, 180), flatten(3.5, 0, 1, 200, 120), flatten(200, 2.5, 2, 260, 150));
  for (let i = 0; i < 2; i++) {
    const [width, height] = size();
    out.push(flatten(randomSigma(), Math.round(r() * 30) / 10, i, width, height));
  }
  return out;
}

describe.runIf(gate.run)(`exact soften and flatten against scipy.ndimage.gaussian_filter (float64)${gate.note}`, () => {
  it("agree within ±1 code value at every pixel, borders included, at σ 0.5 … 200 and random σ", async () => {
    const list = jobs();
    const before = exactBlurCounts();
    const refs = scipyReference(list);
    const failures: string[] = [];
    for (const [i, job] of list.entries()) {
      const ours = await engine(job, stepsFor(job));
      const { worst, differing, where } = compare(job, ours, refs[i]!);
      if (worst > 1) failures.push(`${label(job)}: worst ${worst} codes at ${where}, ${differing} values differ`);
    }
    expect(failures).toEqual([]);
    // Both exact methods served.
    const after = exactBlurCounts();
    expect(after.direct).toBeGreaterThan(before.direct);
    expect(after.fft).toBeGreaterThan(before.fft);
  }, 120_000);
});

describe.skipIf(gate.run)(`scipy reference${gate.note}`, () => {
  it("is not available here", () => undefined);
});
