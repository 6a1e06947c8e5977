import "server-only";
import sharp, { type OutputInfo } from "sharp";
import {
  CHANNEL_INDEX,
  type LabFormat,
  type LabSpace,
  type RecipeStep,
  type StepReport,
} from "@/lib/lab/recipe";
import { codeLut, quantise, quantise8Consuming, quantiser } from "@/lib/lab/srgb";
import type { ExrOutput } from "@/lib/exr/encode";
import {
  colourKey,
  decodeLabFloat,
  displayMatrix,
  encodeLabExr,
  needsFloatDecode,
  workingSpace,
  type LabColour,
  type StillColour,
} from "@/lib/stills/lab-source";
import { releaseSimdRgb, takeSimdRgb } from "@/lib/lab/simd";
import { blurExact, exactBlurWith, releaseExactBlurMemory } from "@/lib/lab/gaussian";
import { megapixels, STILL_PIXEL_LIMIT } from "@/lib/stills/limits";
import {
  approxReduction,
  bilinearUp,
  blurPlaneApprox,
  blurSampledSparse,
  reducedSize,
  copyChannel,
  extractChannel,
  insertChannel,
  matrixInPlace,
  morphPlane,
  rampPlane,
} from "@/lib/lab/kernels";
import { MEMORY_BUDGET } from "@/lib/memory/budget";

/*
 * The still lab engine: decode with sharp (stored values, ICC ignored), run the recipe in
 * float32 on reused buffers with no clipping between steps (the matte and flatten's weights in
 * float64), quantise once at encoding. LAB-NOTES.md explains why per-pixel work is JS loops and
 * WebAssembly rather than libvips operations.
 *
 * Exact renders (full resolution) blur with the exact Gaussian of lib/lab/gaussian.ts; proxy
 * renders (resized) with the fast approximation of kernels.ts, and say so (`approximate`).
 * Every step's result stays finite: a step whose values could have left the float range is
 * checked, and one that did fails the run with LabOverflowError naming it.
 */

/** Decoded stored codes, always RGB interleaved. */
type StillCodes = { width: number; height: number; bits: 8 | 16; codes: Uint8Array | Uint16Array };

/** A read-only image the steps refer to: stored codes through a LUT, or plain floats (tests). */
export type PixelSource =
  | { kind: "codes"; codes: Uint8Array | Uint16Array; lut: Float32Array }
  | { kind: "float"; data: Float32Array; codes8?: Uint8Array; /** Largest |value| of data, when known. */ maxAbs?: number };

type LabState = {
  width: number;
  height: number;
  /** Working image, interleaved RGB float. */
  cur: Float32Array;
  /** What the steps clean: the denoised plate when the recipe regrains, else the plate. */
  base: PixelSource;
  /** The plate as shot (with grain). */
  plate: PixelSource;
  /** The matte in float64: 1 − m keeps its digits where m is near 1 (flatten's weights). */
  matte: Float64Array | null;
  /** Full-resolution pixels per working pixel (rects in steps are in full-res pixels). */
  scale: number;
  /** Full resolution: blurs are the exact Gaussian (else the proxy's approximation). */
  exact: boolean;
  scratch: Float32Array[];
  /** Upper bounds of |value| in cur, base and plate, to know when a step needs an overflow check. */
  bound: { cur: number; base: number; plate: number };
  /**
   * Set when the last step run was a mix + grain over a float plate that carries its 8-bit codes:
   * per row y the pixels [spans[2y], spans[2y+1]) (indices in the frame) outside which the result is the plate itself,
   * so an 8-bit encode copies the plate's codes there instead of quantising.
   */
  tail?: { spans: Int32Array; plate8: Uint8Array } | null;
  /**
   * The result goes to an 8-bit encode that honours `tail`: a final mix + grain may then leave
   * the working image outside its spans unwritten (the encode never reads it there).
   */
  encode8?: boolean;
};

export type DenoisedLoader = (stillId: string) => Uint8Array | Promise<Uint8Array>;

export class LabInputError extends Error {
  constructor(message: string, readonly stepIndex?: number) {
    super(message);
    this.name = "LabInputError";
  }
}

/** A step's result left the float range (an infinite or not-a-number value): the run fails. */
export class LabOverflowError extends Error {
  constructor(readonly stepIndex: number, readonly op: RecipeStep["op"]) {
    super(`this ${op} step's result left the floating-point range (a value became infinite or not a number); lower its gains`);
    this.name = "LabOverflowError";
  }
}

export class LabAbortedError extends Error {
  constructor() {
    super("lab run aborted");
    this.name = "LabAbortedError";
  }
}

const CHUNK = 4096;

/** Fills `out` (3 × count floats) with a source's RGB floats for pixels [start, start+count). */
function readChunk(src: PixelSource, start: number, count: number, out: Float32Array): void {
  const a = start * 3, b = a + count * 3;
  if (src.kind === "float") {
    out.set(src.data.subarray(a, b));
    return;
  }
  const { codes, lut } = src;
  for (let i = a, j = 0; i < b; i++, j++) out[j] = lut[codes[i]!]!;
}

/** Decodes stored codes as RGB; 16-bit stays 16-bit (sharp's own 8 → 16 scaling is not ×257). */
export async function decodeStill(bytes: Uint8Array, width?: number): Promise<StillCodes & { sourceWidth: number; sourceHeight: number }> {
  const meta = await sharp(bytes, { ignoreIcc: true }).metadata();
  if (!meta.width || !meta.height) throw new LabInputError("not a decodable still");
  // Stills stored before the one limit existed may exceed it: a clear 400, never a 500.
  if (meta.width * meta.height > STILL_PIXEL_LIMIT) {
    throw new LabInputError(`the still is ${meta.width} × ${meta.height} pixels; the lab opens at most ${megapixels(STILL_PIXEL_LIMIT)}`);
  }
  const is16 = meta.depth === "ushort";
  const grey = (meta.channels ?? 3) <= 2;
  let pipe = sharp(bytes, { ignoreIcc: true, limitInputPixels: STILL_PIXEL_LIMIT });
  if (width && width < meta.width) pipe = pipe.resize({ width });
  let data: Buffer;
  let info: OutputInfo;
  if (is16) {
    ({ data, info } = await pipe
      .toColourspace(grey ? "grey16" : "rgb16")
      .raw({ depth: "ushort" })
      .toBuffer({ resolveWithObject: true }));
  } else {
    ({ data, info } = await pipe.raw().toBuffer({ resolveWithObject: true }));
  }
  const n = info.width * info.height;
  const ch = info.channels;
  const src: Uint8Array | Uint16Array = is16
    ? new Uint16Array(data.buffer, data.byteOffset, data.length >> 1)
    : new Uint8Array(data.buffer, data.byteOffset, data.length);
  let codes: Uint8Array | Uint16Array = src;
  if (ch !== 3) {
    codes = is16 ? new Uint16Array(n * 3) : new Uint8Array(n * 3);
    for (let p = 0, i = 0; p < n; p++, i += ch) {
      const o = p * 3;
      if (ch <= 2) {
        const v = src[i]!;
        codes[o] = v; codes[o + 1] = v; codes[o + 2] = v;
      } else {
        codes[o] = src[i]!; codes[o + 1] = src[i + 1]!; codes[o + 2] = src[i + 2]!;
      }
    }
  }
  return { width: info.width, height: info.height, bits: is16 ? 16 : 8, codes, sourceWidth: meta.width, sourceHeight: meta.height };
}

export function codesSource(still: StillCodes, space: LabSpace): PixelSource {
  return { kind: "codes", codes: still.codes, lut: codeLut(still.bits, space === "linear") };
}

/** Largest |value| in an array; a non-finite value is refused (a still must hold numbers). */
function maxAbsOf(values: Float32Array): number {
  let m = 0;
  for (let i = 0; i < values.length; i++) {
    const a = Math.abs(values[i]!);
    if (!(a <= FLOAT32_MAX)) throw new LabInputError("the still holds values that are not finite numbers");
    if (a > m) m = a;
  }
  return m;
}

const lutBounds = new WeakMap<Float32Array, number>();

/** Largest |value| a source holds (a table's is computed once; a float source's kept with it). */
function sourceBound(src: PixelSource): number {
  if (src.kind === "float") return (src.maxAbs ??= maxAbsOf(src.data));
  let m = lutBounds.get(src.lut);
  if (m === undefined) lutBounds.set(src.lut, (m = maxAbsOf(src.lut)));
  return m;
}

export function createLabState(opts: { width: number; height: number; plate: PixelSource; base?: PixelSource; scale?: number }): LabState {
  const { width, height, plate } = opts;
  const base = opts.base ?? plate;
  const cur = takeSimdRgb(width * height * 3);
  if (base.kind === "float") cur.set(base.data);
  else {
    const { codes, lut } = base;
    for (let i = 0; i < cur.length; i++) cur[i] = lut[codes[i]!]!;
  }
  const scale = opts.scale ?? 1;
  const baseBound = sourceBound(base);
  const bound = { cur: baseBound, base: baseBound, plate: base === plate ? baseBound : sourceBound(plate) };
  return { width, height, cur, base, plate, matte: null, scale, exact: scale === 1, scratch: [], bound };
}

/*
 * Planes (matte, scratch) are pooled like the RGB buffers: two fresh 2 MB planes per proxy render
 * are ~4 ms of page faults and collector work. Every user overwrites the whole plane first.
 */
const PLANE_POOL_BYTES = MEMORY_BUDGET.labPlanePool;
const idlePlanes: (Float32Array | Float64Array)[] = [];

function takePlane(n: number): Float32Array {
  const i = idlePlanes.findIndex((a) => a.length === n && a instanceof Float32Array);
  return i >= 0 ? (idlePlanes.splice(i, 1)[0] as Float32Array) : new Float32Array(n);
}

function takePlane64(n: number): Float64Array {
  const i = idlePlanes.findIndex((a) => a.length === n && a instanceof Float64Array);
  return i >= 0 ? (idlePlanes.splice(i, 1)[0] as Float64Array) : new Float64Array(n);
}

function poolPlanes(planes: (Float32Array | Float64Array)[]): void {
  for (const a of planes) if (!idlePlanes.includes(a)) idlePlanes.push(a);
  let bytes = idlePlanes.reduce((t, a) => t + a.byteLength, 0);
  while (bytes > PLANE_POOL_BYTES && idlePlanes.length) bytes -= idlePlanes.shift()!.byteLength;
}

/** Gives the state's matte and scratch planes back to the pool; the state must not use them again. */
function releasePlanes(state: LabState): void {
  poolPlanes([...state.scratch, ...(state.matte ? [state.matte] : [])]);
  state.scratch = [];
  state.matte = null;
}

function scratch(state: LabState, i: number): Float32Array {
  while (state.scratch.length <= i) state.scratch.push(takePlane(state.width * state.height));
  return state.scratch[i]!;
}

// ---------------------------------------------------------------------------------------
// Overflow: float32 holds magnitudes up to ~3.4e38. Each step's effect on the largest |value| is
// bounded from its parameters; only when that bound passes SCAN_ABOVE is the working image read
// to find the true largest value, and an infinite or not-a-number value fails the run.

const FLOAT32_MAX = 3.4028234663852886e38;
const SCAN_ABOVE = 1e30;

function maxAbsChecked(cur: Float32Array, index: number, op: RecipeStep["op"]): number {
  let m = 0;
  for (let i = 0; i < cur.length; i++) {
    const a = Math.abs(cur[i]!);
    if (!(a <= FLOAT32_MAX)) throw new LabOverflowError(index, op);
    if (a > m) m = a;
  }
  return m;
}

/** The bound on |cur| after `step` ran (its report in hand); a scan where the bound says it could have overflowed. */
function updateBound(state: LabState, step: RecipeStep, report: StepReport): void {
  const b = state.bound;
  let next = b.cur;
  switch (step.op) {
    case "matrix": {
      const rowSum = Math.max(...step.m.map((row) => Math.abs(row[0]) + Math.abs(row[1]) + Math.abs(row[2])));
      next = rowSum * b.cur + Math.max(...(step.offset ?? [0, 0, 0]).map(Math.abs));
      break;
    }
    case "level":
      if (report.op === "level") next = Math.abs(report.gain) * b.cur + Math.abs(report.offset);
      if (!Number.isFinite(next)) next = Infinity;
      break;
    case "mix":
      next = Math.max(b.cur, b.base); // matte in 0..1: a blend of the two
      break;
    case "grain":
      next = b.cur + b.base + b.plate; // mix + grain fused: m·(cur − base) + plate
      break;
    case "flatten":
      break; // divides by a screen estimate: flattenStep checks every value it writes and sets the bound
    default:
      break; // copy, matte, grow, soften: no value leaves the range it had
  }
  b.cur = next > SCAN_ABOVE ? maxAbsChecked(state.cur, report.index, step.op) : next;
}

/**
 * `from`: the channel the level reads its x values from — the level's own channel, or the
 * source of a copy into it directly before (fused: same values, one pass fewer).
 */
function levelStep(state: LabState, step: Extract<RecipeStep, { op: "level" }>, index: number, from?: number): StepReport {
  const rep = levelFit(state, step, index, from);
  const { cur } = state;
  const cx = from ?? CHANNEL_INDEX[step.channel], cto = CHANNEL_INDEX[step.channel];
  const { gain, offset } = rep;
  const n3 = cur.length;
  for (let i = 0; i < n3; i += 3) cur[i + cto] = gain * cur[i + cx]! + offset;
  return rep;
}

type LevelReport = Extract<StepReport, { op: "level" }>;

/** The level's fit (gain, offset, residual) over its rect, reading x from channel `from`; changes nothing. */
function levelFit(state: LabState, step: Extract<RecipeStep, { op: "level" }>, index: number, from?: number): LevelReport {
  const { width, height, cur } = state;
  const cy = CHANNEL_INDEX[step.ref], cto = CHANNEL_INDEX[step.channel];
  const cx = from ?? cto;
  let x0 = 0, y0 = 0, x1 = width, y1 = height;
  if (step.rect) {
    const s = state.scale;
    x0 = Math.max(0, Math.floor(step.rect.x / s));
    y0 = Math.max(0, Math.floor(step.rect.y / s));
    x1 = Math.min(width, Math.max(x0 + 1, Math.ceil((step.rect.x + step.rect.w) / s)));
    y1 = Math.min(height, Math.max(y0 + 1, Math.ceil((step.rect.y + step.rect.h) / s)));
    if (x0 >= width || y0 >= height) throw new LabInputError(`step ${index}: rect lies outside the still`, index);
  }
  const count = (x1 - x0) * (y1 - y0);
  // One pass of sums shifted by the first sample (the shifted-data algorithm), in float64, so
  // large frames with small spread do not cancel.
  const base = state.base;
  const at = (i: number): number => (base.kind === "float" ? base.data[i]! : base.lut[base.codes[i]!]!);
  const kx = cur[(y0 * width + x0) * 3 + cx]!, ky = at((y0 * width + x0) * 3 + cy);
  let sx = 0, sy = 0, sxx0 = 0, sxy0 = 0, syy0 = 0, rxx = 0, rxy = 0, ryy = 0;
  for (let y = y0; y < y1; y++) {
    const a = (y * width + x0) * 3, b = (y * width + x1) * 3;
    if (base.kind === "float") {
      const d = base.data;
      for (let i = a; i < b; i += 3) {
        const xv = cur[i + cx]!, yv = d[i + cy]!, dx = xv - kx, dy = yv - ky;
        sx += dx; sy += dy; sxx0 += dx * dx; sxy0 += dx * dy; syy0 += dy * dy;
        rxx += xv * xv; rxy += xv * yv; ryy += yv * yv;
      }
    } else {
      const { codes, lut } = base;
      for (let i = a; i < b; i += 3) {
        const xv = cur[i + cx]!, yv = lut[codes[i + cy]!]!, dx = xv - kx, dy = yv - ky;
        sx += dx; sy += dy; sxx0 += dx * dx; sxy0 += dx * dy; syy0 += dy * dy;
        rxx += xv * xv; rxy += xv * yv; ryy += yv * yv;
      }
    }
  }
  const mx = kx + sx / count, my = ky + sy / count;
  const sxx = sxx0 - (sx * sx) / count, sxy = sxy0 - (sx * sy) / count, syy = syy0 - (sy * sy) / count;
  let gain: number, offset: number, sse: number;
  if (step.fit === "gain+offset") {
    gain = sxx > 0 ? sxy / sxx : 0;
    offset = my - gain * mx;
    sse = syy - gain * sxy;
  } else {
    gain = rxx > 0 ? rxy / rxx : 0;
    offset = 0;
    sse = ryy - gain * rxy;
  }
  return { index, op: "level", gain, offset, residual: Math.sqrt(Math.max(0, sse) / count), samples: count };
}

function matteStep(state: LabState, step: Extract<RecipeStep, { op: "matte" }>, index: number): StepReport {
  const n = state.width * state.height;
  const matte = state.matte ?? takePlane64(n);
  const w = typeof step.channel === "string"
    ? ([0, 0, 0].map((_, i) => (i === CHANNEL_INDEX[step.channel as "r"] ? 1 : 0)) as number[])
    : step.channel;
  const w0 = w[0]!, w1 = w[1]!, w2 = w[2]!;
  const base = state.base;
  if (step.source === "plate" && step.white !== step.black) {
    // Weights, ramp and coverage in one pass (three passes cost ~3×).
    const black = step.black, k = 1 / (step.white - step.black);
    let s = 0;
    if (base.kind === "codes") {
      const { codes, lut } = base;
      for (let p = 0, i = 0; p < n; p++, i += 3) {
        const t = (w0 * lut[codes[i]!]! + w1 * lut[codes[i + 1]!]! + w2 * lut[codes[i + 2]!]! - black) * k;
        const v = t < 0 ? 0 : t > 1 ? 1 : t;
        matte[p] = v;
        s += v;
      }
    } else {
      const d = base.data;
      for (let p = 0, i = 0; p < n; p++, i += 3) {
        const t = (w0 * d[i]! + w1 * d[i + 1]! + w2 * d[i + 2]! - black) * k;
        const v = t < 0 ? 0 : t > 1 ? 1 : t;
        matte[p] = v;
        s += v;
      }
    }
    state.matte = matte;
    return { index, op: "matte", coverage: s / n };
  }
  if (step.source === "current") {
    const cur = state.cur;
    for (let p = 0, i = 0; p < n; p++, i += 3) matte[p] = w0 * cur[i]! + w1 * cur[i + 1]! + w2 * cur[i + 2]!;
  } else {
    if (base.kind === "float") {
      const d = base.data;
      for (let p = 0, i = 0; p < n; p++, i += 3) matte[p] = w0 * d[i]! + w1 * d[i + 1]! + w2 * d[i + 2]!;
    } else {
      const { codes, lut } = base;
      for (let p = 0, i = 0; p < n; p++, i += 3) {
        matte[p] = w0 * lut[codes[i]!]! + w1 * lut[codes[i + 1]!]! + w2 * lut[codes[i + 2]!]!;
      }
    }
  }
  rampPlane(matte, step.black, step.white);
  state.matte = matte;
  let s = 0;
  for (let p = 0; p < n; p++) s += matte[p]!;
  return { index, op: "matte", coverage: s / n };
}

function mixStep(state: LabState, invert: boolean): void {
  const { cur } = state;
  const matte = state.matte!;
  const n3 = cur.length;
  const base = state.base;
  const codes = base.kind === "codes" ? base.codes : null;
  const lut = base.kind === "codes" ? base.lut : null;
  const data = base.kind === "float" ? base.data : null;
  for (let i = 0, p = 0; i < n3; i += 3, p++) {
    let m = matte[p]!;
    if (invert) m = 1 - m;
    if (m === 0) {
      // Outside the matte the plate comes back untouched (the common case: skip the blend).
      if (codes) { cur[i] = lut![codes[i]!]!; cur[i + 1] = lut![codes[i + 1]!]!; cur[i + 2] = lut![codes[i + 2]!]!; }
      else { cur[i] = data![i]!; cur[i + 1] = data![i + 1]!; cur[i + 2] = data![i + 2]!; }
      continue;
    }
    const k = 1 - m;
    const b0 = codes ? lut![codes[i]!]! : data![i]!, b1 = codes ? lut![codes[i + 1]!]! : data![i + 1]!, b2 = codes ? lut![codes[i + 2]!]! : data![i + 2]!;
    cur[i] = cur[i]! * m + b0 * k;
    cur[i + 1] = cur[i + 1]! * m + b1 * k;
    cur[i + 2] = cur[i + 2]! * m + b2 * k;
  }
}

function grainStep(state: LabState): void {
  const { cur } = state;
  const { plate, base } = state;
  if (base === plate) return;
  const n3 = cur.length;
  if (plate.kind === "float" && base.kind === "float") {
    const pd = plate.data, bd = base.data;
    for (let i = 0; i < n3; i++) cur[i] = cur[i]! + (pd[i]! - bd[i]!);
    return;
  }
  if (plate.kind === "codes" && base.kind === "codes" && plate.lut === base.lut) {
    const pc = plate.codes, bc = base.codes, lut = plate.lut;
    for (let i = 0; i < n3; i++) cur[i] = cur[i]! + (lut[pc[i]!]! - lut[bc[i]!]!);
    return;
  }
  const a = new Float32Array(CHUNK * 3), b = new Float32Array(CHUNK * 3);
  const n = n3 / 3;
  for (let p = 0; p < n; p += CHUNK) {
    const count = Math.min(CHUNK, n - p);
    readChunk(plate, p, count, a);
    readChunk(base, p, count, b);
    for (let j = 0, i = p * 3; j < count * 3; j++, i++) cur[i] = cur[i]! + (a[j]! - b[j]!);
  }
}

/*
 * mix followed by grain, in one pass: cur·m + base·(1−m) + (plate − base) = m·(cur − base) + plate.
 * Where the matte is 0 the plate comes back bit-exact, and a 2K frame is read once instead of
 * twice (~45 → ~20 ms). Only for stored codes through one table (the engine's own runs).
 */
function mixGrainStep(state: LabState, invert: boolean, final = false): boolean {
  const { cur, plate, base } = state;
  const matte = state.matte;
  if (!matte || base === plate) return false;
  if (plate.kind === "float" && base.kind === "float") {
    const skipPlate = final && state.encode8 === true && plate.codes8 !== undefined;
    const spans = mixGrainFloat(cur, matte, plate.data, base.data, invert, state.width, skipPlate);
    state.tail = spans && plate.codes8 ? { spans, plate8: plate.codes8 } : null;
    return true;
  }
  if (plate.kind !== "codes" || base.kind !== "codes" || plate.lut !== base.lut) return false;
  const pc = plate.codes, bc = base.codes, lut = plate.lut;
  const n3 = cur.length;
  for (let i = 0, p = 0; i < n3; i += 3, p++) {
    const m = invert ? 1 - matte[p]! : matte[p]!;
    if (m === 0) {
      cur[i] = lut[pc[i]!]!; cur[i + 1] = lut[pc[i + 1]!]!; cur[i + 2] = lut[pc[i + 2]!]!;
      continue;
    }
    cur[i] = m * (cur[i]! - lut[bc[i]!]!) + lut[pc[i]!]!;
    cur[i + 1] = m * (cur[i + 1]! - lut[bc[i + 1]!]!) + lut[pc[i + 1]!]!;
    cur[i + 2] = m * (cur[i + 2]! - lut[bc[i + 2]!]!) + lut[pc[i + 2]!]!;
  }
  return true;
}

/**
 * mixGrainStep over working-space floats (cached proxies): the same arithmetic, no table. Where
 * a row's matte is 0 the plate is copied as a block (a marker matte is ~1 % of the frame).
 */
function mixGrainFloat(cur: Float32Array, matte: Float64Array, pd: Float32Array, bd: Float32Array, invert: boolean, width: number,
  skipPlate: boolean): Int32Array | null {
  if (!invert) {
    const height = matte.length / width;
    const spans = new Int32Array(2 * height);
    for (let y = 0; y < height; y++) {
      const o = y * width;
      let a = o, b = o + width;
      while (a < b && matte[a] === 0) a++;
      while (b > a && matte[b - 1] === 0) b--;
      if (!skipPlate) {
        cur.set(pd.subarray(3 * o, 3 * a), 3 * o);
        cur.set(pd.subarray(3 * b, 3 * (o + width)), 3 * b);
      }
      mixGrainRange(cur, matte, pd, bd, a, b);
      spans[2 * y] = a;
      spans[2 * y + 1] = b;
    }
    return spans;
  }
  const n3 = cur.length;
  for (let i = 0, p = 0; i < n3; i += 3, p++) {
    const m = invert ? 1 - matte[p]! : matte[p]!;
    if (m === 0) {
      cur[i] = pd[i]!; cur[i + 1] = pd[i + 1]!; cur[i + 2] = pd[i + 2]!;
      continue;
    }
    cur[i] = m * (cur[i]! - bd[i]!) + pd[i]!;
    cur[i + 1] = m * (cur[i + 1]! - bd[i + 1]!) + pd[i + 1]!;
    cur[i + 2] = m * (cur[i + 2]! - bd[i + 2]!) + pd[i + 2]!;
  }
  return null;
}

function mixGrainRange(cur: Float32Array, matte: Float64Array, pd: Float32Array, bd: Float32Array, p0: number, p1: number): void {
  for (let p = p0, i = 3 * p0; p < p1; p++, i += 3) {
    const m = matte[p]!;
    if (m === 0) {
      cur[i] = pd[i]!; cur[i + 1] = pd[i + 1]!; cur[i + 2] = pd[i + 2]!;
      continue;
    }
    cur[i] = m * (cur[i]! - bd[i]!) + pd[i]!;
    cur[i + 1] = m * (cur[i + 1]! - bd[i + 1]!) + pd[i + 1]!;
    cur[i + 2] = m * (cur[i + 2]! - bd[i + 2]!) + pd[i + 2]!;
  }
}

/**
 * Runs the step at `i` — or, for a mix directly followed by the grain step, or a copy followed by
 * a level of the copied channel (once or twice), those together in one pass — and answers the
 * reports of the steps it ran (one to four).
 */
export function applyStepsAt(state: LabState, steps: readonly RecipeStep[], i: number): StepReport[] {
  const step = steps[i]!, next = steps[i + 1];
  if (step.op === "mix" && next?.op === "grain" && mixGrainStep(state, step.invert, i + 2 === steps.length)) {
    return [{ index: i, op: "mix" }, { index: i + 1, op: "grain" }];
  }
  if (step.op === "copy" && next?.op === "level" && next.channel === step.to) {
    // The level reads the copy's source instead of waiting for the copy: one pass, same values.
    const from = CHANNEL_INDEX[step.from], c1 = CHANNEL_INDEX[step.to];
    const copy2 = steps[i + 2], level2 = steps[i + 3];
    if (copy2?.op === "copy" && level2?.op === "level" && level2.channel === copy2.to && copy2.from === step.from
      && c1 !== from && CHANNEL_INDEX[copy2.to] !== from && CHANNEL_INDEX[copy2.to] !== c1) {
      // Two such pairs from one source (how a solved "hide" spreads the cleaned channel): the
      // first pair leaves the source alone, so both fits read it as it is and one pass writes both.
      const r1 = levelFit(state, next, i + 1, from), r2 = levelFit(state, level2, i + 3, from);
      const c2 = CHANNEL_INDEX[copy2.to];
      const { cur } = state, n3 = cur.length;
      const g1 = r1.gain, o1 = r1.offset, g2 = r2.gain, o2 = r2.offset;
      for (let j = 0; j < n3; j += 3) {
        const x = cur[j + from]!;
        cur[j + c1] = g1 * x + o1;
        cur[j + c2] = g2 * x + o2;
      }
      return [{ index: i, op: "copy" }, r1, { index: i + 2, op: "copy" }, r2];
    }
    return [{ index: i, op: "copy" }, levelStep(state, next, i + 1, from)];
  }
  return [applyStep(state, step, i)];
}

/**
 * Below this share of the kernel's weight on clean screen within reach, a pixel's local screen
 * estimate is topped up with the frame's mean screen colour (see flattenStep).
 */
export const FLATTEN_MIN_SCREEN = 0.01;

/*
 * flatten: divide the image by a smooth estimate of the screen and multiply by the target colour
 * (Knutsson & Westin's normalized convolution, CVPR 1993). With w the screen weight of each pixel
 * (outside the matte: 1 − m; inside: m; everywhere: 1; m clamped to 0..1, in float64) and G the
 * Gaussian of the step's sigma:
 *   D = G(w), N_c = G(value_c · w)                       (float64 blurs)
 *   estimate_c = N_c / D                        where D ≥ τ = FLATTEN_MIN_SCREEN
 *              = (N_c + (τ − D) · mean_c) / τ   where D < τ ("thin": too little screen within reach)
 *   mean_c = Σ value_c · w / Σ w over the whole frame
 *   value_c ← value_c / estimate_c · target_c, left as it is where estimate_c ≤ 0
 * The fill is continuous at D = τ, so no pixel jumps between "estimated" and "filled"; a pixel
 * with no screen at all within reach takes the frame's mean screen colour.
 */
function flattenStep(state: LabState, step: Extract<RecipeStep, { op: "flatten" }>, index: number): StepReport {
  const { cur, width, height } = state;
  const n = width * height;
  const matte = state.matte;
  // 0: every pixel is screen; 1: the matte is the screen weight; 2: 1 − matte is.
  const mode = !matte || step.weight === "all" ? 0 : step.weight === "inside" ? 1 : 2;
  const reduced = state.exact ? null : approxReduction(step.sigma);
  if (reduced) return flattenReduced(state, step, index, mode, reduced);
  const den = takePlane64(n);
  // w into den first (loops per mode, no call per pixel): the frame's weighted mean, then its blur.
  if (mode === 0) den.fill(1);
  else for (let p = 0; p < n; p++) {
    const v = matte![p]!, m = v < 0 ? 0 : v > 1 ? 1 : v;
    den[p] = mode === 1 ? m : 1 - m;
  }
  let s0 = 0, s1 = 0, s2 = 0, sumW = 0;
  for (let p = 0, i = 0; p < n; p++, i += 3) {
    const w = den[p]!;
    sumW += w;
    s0 += w * cur[i]!; s1 += w * cur[i + 1]!; s2 += w * cur[i + 2]!;
  }
  const mean: [number, number, number] = sumW > 0 ? [s0 / sumW, s1 / sumW, s2 / sumW] : [0, 0, 0];
  const tau = FLATTEN_MIN_SCREEN;
  const left = new Uint8Array(n);
  let thin = 0;
  // Largest |value| written: the division can leave the float range (checked after the step).
  let most = state.bound.cur;
  const blur = (fill: (a: Float32Array | Float64Array) => void, read: (b: Float32Array | Float64Array) => void): void => {
    if (state.exact) {
      exactBlurWith(width, height, step.sigma, "f64", fill, read);
      return;
    }
    const plane = takePlane64(n), tmp = takePlane64(n);
    fill(plane);
    blurPlaneApprox(plane, width, height, step.sigma, tmp);
    read(plane);
    poolPlanes([plane, tmp]);
  };
  /** a[p] = value_c · w, w recomputed from the matte as above. */
  const weighted = (a: Float32Array | Float64Array, c: number): void => {
    if (mode === 0) for (let p = 0, i = c; p < n; p++, i += 3) a[p] = cur[i]!;
    else if (mode === 1) for (let p = 0, i = c; p < n; p++, i += 3) {
      const v = matte![p]!;
      a[p] = cur[i]! * (v < 0 ? 0 : v > 1 ? 1 : v);
    } else for (let p = 0, i = c; p < n; p++, i += 3) {
      const v = matte![p]!;
      a[p] = cur[i]! * (1 - (v < 0 ? 0 : v > 1 ? 1 : v));
    }
  };
  try {
    blur((a) => a.set(den), (b) => den.set(b));
    for (let p = 0; p < n; p++) if (den[p]! < tau) thin++;
    for (let c = 0; c < 3; c++) {
      const target = step.color[c]!, g = mean[c]!;
      blur(
        (a) => weighted(a, c),
        (num) => {
          for (let p = 0, i = c; p < n; p++, i += 3) {
            // value / estimate · target with estimate = N / D, or (N + (τ − D)·mean) / τ below τ:
            // as value · target · D' / N', one division.
            const d = den[p]!, full = d >= tau;
            const nn = full ? num[p]! : num[p]! + (tau - d) * g;
            if (nn > 0) {
              const v = (cur[i] = (cur[i]! * target * (full ? d : tau)) / nn);
              const a = v < 0 ? -v : v;
              if (!(a <= most)) {
                if (!(a <= FLOAT32_MAX)) throw new LabOverflowError(index, "flatten"); // infinite or not a number
                most = a;
              }
            } else left[p] = 1;
          }
        },
      );
    }
  } finally {
    poolPlanes([den]);
  }
  if (!(most <= FLOAT32_MAX)) throw new LabOverflowError(index, "flatten");
  state.bound.cur = most;
  let leftAsIs = 0;
  for (let p = 0; p < n; p++) leftAsIs += left[p]!;
  return { index, op: "flatten", thin, leftAsIs, screenMean: mean };
}

/**
 * flatten on a proxy whose sigma takes the approximate blur's reduced path: the same result as
 * blurring w and value·w one plane at a time (box reduce, blur small, enlarge bilinearly: all
 * linear), but the four reductions are one pass over the image and the estimate is interpolated
 * straight into the division, instead of sixteen full-size passes.
 */
function flattenReduced(state: LabState, step: Extract<RecipeStep, { op: "flatten" }>, index: number, mode: number,
  red: { f: number; smallSigma: number }): StepReport {
  const { cur, width, height } = state;
  const matte = state.matte;
  const { f } = red;
  const { sw, sh } = reducedSize(width, height, f);
  const m = sw * sh;
  const sW = new Float64Array(m), s0 = new Float64Array(m), s1 = new Float64Array(m), s2 = new Float64Array(m);
  const blockOf = Int32Array.from({ length: width }, (_, x) => Math.floor(x / f));
  for (let y = 0; y < height; y++) {
    const row = Math.floor(y / f) * sw;
    for (let x = 0, p = y * width, i = 3 * p; x < width; x++, p++, i += 3) {
      let w = 1;
      if (mode !== 0) {
        const v = matte![p]!, mm = v < 0 ? 0 : v > 1 ? 1 : v;
        w = mode === 1 ? mm : 1 - mm;
      }
      const b = row + blockOf[x]!;
      sW[b] = sW[b]! + w; s0[b] = s0[b]! + w * cur[i]!; s1[b] = s1[b]! + w * cur[i + 1]!; s2[b] = s2[b]! + w * cur[i + 2]!;
    }
  }
  // The frame's weighted mean screen colour from the block sums, before they become means.
  let sumW = 0, m0 = 0, m1 = 0, m2 = 0;
  for (let b = 0; b < m; b++) { sumW += sW[b]!; m0 += s0[b]!; m1 += s1[b]!; m2 += s2[b]!; }
  const mean: [number, number, number] = sumW > 0 ? [m0 / sumW, m1 / sumW, m2 / sumW] : [0, 0, 0];
  for (let sy = 0; sy < sh; sy++) for (let sx = 0; sx < sw; sx++) {
    const area = (Math.min(height, sy * f + f) - sy * f) * (Math.min(width, sx * f + f) - sx * f), b = sy * sw + sx;
    sW[b] = sW[b]! / area; s0[b] = s0[b]! / area; s1[b] = s1[b]! / area; s2[b] = s2[b]! / area;
  }
  const tmp = new Float64Array(m);
  for (const small of [sW, s0, s1, s2]) blurPlaneApprox(small, sw, sh, red.smallSigma, tmp);
  // Enlarge bilinearly: each small row pair once per output row, then across the row.
  const { xi0, xi1, xw, row } = bilinearUp(width, height, f, sw, sh);
  const rW = new Float64Array(sw), r0 = new Float64Array(sw), r1 = new Float64Array(sw), r2 = new Float64Array(sw);
  const tau = FLATTEN_MIN_SCREEN, t0 = step.color[0], t1 = step.color[1], t2 = step.color[2];
  const g0 = mean[0], g1 = mean[1], g2 = mean[2];
  let thin = 0, leftAsIs = 0, most = state.bound.cur;
  for (let y = 0; y < height; y++) {
    const { r0: a, r1: b, wy } = row(y);
    for (let sx = 0; sx < sw; sx++) {
      rW[sx] = sW[a + sx]! + (sW[b + sx]! - sW[a + sx]!) * wy;
      r0[sx] = s0[a + sx]! + (s0[b + sx]! - s0[a + sx]!) * wy;
      r1[sx] = s1[a + sx]! + (s1[b + sx]! - s1[a + sx]!) * wy;
      r2[sx] = s2[a + sx]! + (s2[b + sx]! - s2[a + sx]!) * wy;
    }
    for (let x = 0, i = 3 * y * width; x < width; x++, i += 3) {
      const j0 = xi0[x]!, j1 = xi1[x]!, wx = xw[x]!;
      const d = rW[j0]! + (rW[j1]! - rW[j0]!) * wx;
      // value / (N / D) · target as value · target · D / N: one division per channel. Below τ the
      // estimate is (N + (τ − D)·mean) / τ, so D becomes τ and N gains the mean's share.
      const full = d >= tau;
      if (!full) thin++;
      const scale = full ? d : tau, fill = full ? 0 : tau - d;
      const n0 = r0[j0]! + (r0[j1]! - r0[j0]!) * wx + fill * g0;
      const n1 = r1[j0]! + (r1[j1]! - r1[j0]!) * wx + fill * g1;
      const n2 = r2[j0]! + (r2[j1]! - r2[j0]!) * wx + fill * g2;
      if (n0 > 0) cur[i] = (cur[i]! * t0 * scale) / n0;
      if (n1 > 0) cur[i + 1] = (cur[i + 1]! * t1 * scale) / n1;
      if (n2 > 0) cur[i + 2] = (cur[i + 2]! * t2 * scale) / n2;
      if (!(n0 > 0 && n1 > 0 && n2 > 0)) leftAsIs++;
      const a0 = Math.abs(cur[i]!), a1 = Math.abs(cur[i + 1]!), a2 = Math.abs(cur[i + 2]!);
      if (!(a0 <= most && a1 <= most && a2 <= most)) {
        most = Math.max(a0, a1, a2);
        if (!(most <= FLOAT32_MAX)) throw new LabOverflowError(index, "flatten");
      }
    }
  }
  if (!(most <= FLOAT32_MAX)) throw new LabOverflowError(index, "flatten");
  state.bound.cur = most;
  return { index, op: "flatten", thin, leftAsIs, screenMean: mean };
}

/** Runs one validated step on the state. */
export function applyStep(state: LabState, step: RecipeStep, index: number): StepReport {
  const { width, height, cur } = state;
  switch (step.op) {
    case "matrix":
      matrixInPlace(cur, step.m, step.offset);
      return { index, op: "matrix" };
    case "copy":
      copyChannel(cur, CHANNEL_INDEX[step.from], CHANNEL_INDEX[step.to]);
      return { index, op: "copy" };
    case "level":
      return levelStep(state, step, index);
    case "matte":
      return matteStep(state, step, index);
    case "grow":
      if (!state.matte) throw new LabInputError(`step ${index}: grow needs a matte`, index);
      morphPlane(state.matte, width, height, Math.round(step.px / state.scale));
      return { index, op: "grow" };
    case "soften": {
      const sigma = step.sigma / state.scale;
      if (step.target === "matte") {
        if (!state.matte) throw new LabInputError(`step ${index}: soften needs a matte`, index);
        // A marker matte is mostly zero: the sampled kernel over only its non-zero blocks (exact,
        // float64 arithmetic) beats the full-frame passes while the radius is small.
        if (state.exact) {
          const tmp = takePlane64(width * height);
          if (!blurSampledSparse(state.matte, width, height, sigma, tmp)) blurExact(state.matte, width, height, sigma);
          poolPlanes([tmp]);
        }
        else {
          const tmp = takePlane64(width * height);
          blurPlaneApprox(state.matte, width, height, sigma, tmp);
          poolPlanes([tmp]);
        }
      } else if (state.exact) {
        const c = CHANNEL_INDEX[step.target], n = width * height;
        exactBlurWith(width, height, sigma, "f32",
          (a) => { for (let p = 0, i = c; p < n; p++, i += 3) a[p] = cur[i]!; },
          (b) => { for (let p = 0, i = c; p < n; p++, i += 3) cur[i] = b[p]!; });
      } else {
        const plane = scratch(state, 1);
        extractChannel(cur, CHANNEL_INDEX[step.target], plane);
        blurPlaneApprox(plane, width, height, sigma, scratch(state, 0));
        insertChannel(cur, CHANNEL_INDEX[step.target], plane);
      }
      return { index, op: "soften" };
    }
    case "mix":
      if (!state.matte) throw new LabInputError(`step ${index}: mix needs a matte`, index);
      mixStep(state, step.invert);
      return { index, op: "mix" };
    case "flatten":
      return flattenStep(state, { ...step, sigma: step.sigma / state.scale }, index);
    case "grain":
      grainStep(state);
      return { index, op: "grain" };
  }
}

const CONTENT_TYPES: Record<LabFormat, string> = { png16: "image/png", png: "image/png", webp: "image/webp", exr: "image/x-exr" };

/**
 * Encodes the working image. `reuse` may be handed a 16-bit code buffer of the right size that
 * is no longer needed (the plate's), so a 4K png16 render does not allocate another 53 MB.
 * `consume`: `cur` is not needed afterwards, so 8-bit codes may be written over it in place.
 */
async function encodeImage(cur: Float32Array, width: number, height: number, space: LabSpace, format: LabFormat,
  reuse?: Uint16Array, consume = false, tail?: LabState["tail"]): Promise<Buffer> {
  const linear = space === "linear";
  const raw = { width, height, channels: 3 as const };
  if (format === "png16") {
    const out = reuse && reuse.length === cur.length ? reuse : new Uint16Array(cur.length);
    quantise(cur, out, quantiser(16, linear));
    // Stored (level 0) deflate: the low byte of a grained 16-bit plate is noise, so level 1 came out
    // no smaller (14 MB vs 13 MB at 2K) and took 5–7× longer (~250 ms vs ~50 ms).
    return sharp(out, { raw }).toColourspace("rgb16").png({ compressionLevel: 0 }).toBuffer();
  }
  const q8 = quantiser(8, linear);
  let out = tail ? quantiseTail(cur, width, tail, q8, consume) : consume ? quantise8Consuming(cur, q8) : null;
  if (!out) {
    out = new Uint8Array(cur.length);
    quantise(cur, out, q8);
  }
  const img = sharp(out, { raw });
  return format === "png"
    ? img.png({ compressionLevel: 3 }).toBuffer()
    // Previews: quality 85 at the fastest method encodes a 1024-px frame in ~7.5 ms against ~14 ms
    // at quality 90 (method 2), most of a proxy render's budget; a preview is not for checking.
    : img.webp({ quality: 85, effort: 0 }).toBuffer();
}

/**
 * 8-bit codes of a result that is the plate outside per-row spans: the plate's codes there,
 * quantised inside. `inPlace`: written over `cur`'s own bytes (no 1.6 MB allocation per proxy
 * render): code i lands inside float i/4 or earlier, which has been read by then (row 0 included;
 * for later rows the codes lie wholly before the row's floats).
 */
function quantiseTail(cur: Float32Array, width: number, tail: NonNullable<LabState["tail"]>, q: ReturnType<typeof quantiser>,
  inPlace: boolean): Uint8Array | null {
  const { spans, plate8 } = tail;
  if (plate8.length !== cur.length) return null;
  const out = inPlace ? new Uint8Array(cur.buffer, cur.byteOffset, cur.length) : new Uint8Array(cur.length);
  const height = spans.length / 2;
  for (let y = 0; y < height; y++) {
    const o = 3 * y * width, a = 3 * spans[2 * y]!, b = 3 * spans[2 * y + 1]!, e = o + 3 * width;
    out.set(plate8.subarray(o, a), o);
    if (b > a) quantise(cur.subarray(a, b), out.subarray(a, b), q);
    out.set(plate8.subarray(b, e), b);
  }
  return out;
}

export type LabProgress = { done: number; total: number; label: string };

type RunRecipeOptions = {
  /** Encoded still (PNG, TIFF, JPEG, WebP …). */
  still: Uint8Array;
  steps: RecipeStep[];
  space: LabSpace;
  format: LabFormat;
  /** Proxy render width; absent or ≥ the still's width = exact full resolution. */
  width?: number;
  /** Loads another still by id (the grain step's denoised plate). */
  loadStill?: DenoisedLoader;
  signal?: AbortSignal;
  onProgress?: (p: LabProgress) => void;
  /**
   * Decoded proxies kept between runs (interaction re-renders the same still at the same width).
   * Keys: `plateKey` for the plate, `den:<still id>` for the denoised still, each with the width.
   */
  decodeCache?: DecodeCache;
  plateKey?: string;
  /** Colour spaces of the stills and the space picked to work in (lib/stills/lab-source.ts); absent: sRGB-encoded stills. */
  colour?: LabColour;
  /** format "exr": sample type and compression. */
  exr?: ExrOutput;
};

/**
 * A decoded proxy as kept between runs: already in the working space as floats, so a re-render
 * starts with a copy instead of a table lookup per value (~11 ms of a 1024-px render), and the
 * steps that read the plate run their float paths. Bit-identical to the codes through the table.
 */
export type ProxyStill = {
  width: number; height: number; bits: 8 | 16; sourceWidth: number; sourceHeight: number; space: LabSpace;
  data: Float32Array;
  /** Largest |value| of data. */
  maxAbs: number;
  /** `data` quantised for an 8-bit encode (png, webp) in the same space. */
  codes8?: Uint8Array;
};
export type DecodeCache = { get(key: string): ProxyStill | undefined; set(key: string, value: ProxyStill): void };

type Decoded = {
  width: number;
  height: number;
  bits: 8 | 16;
  sourceWidth: number;
  sourceHeight: number;
  source: PixelSource;
  /** Fresh 16-bit codes no one else holds, which the png16 encode may reuse. */
  spare16: Uint16Array | null;
};

function toFloats(still: StillCodes, space: LabSpace): Float32Array {
  const lut = codeLut(still.bits, space === "linear");
  const { codes } = still;
  const data = new Float32Array(codes.length);
  for (let i = 0; i < data.length; i++) data[i] = lut[codes[i]!]!;
  return data;
}

async function decodeCached(bytes: () => Uint8Array | Promise<Uint8Array>, width: number | undefined, space: LabSpace, key: string | undefined,
  cache: DecodeCache | undefined, colour?: { still: StillColour; working: LabColour["working"] }): Promise<Decoded> {
  const float = colour && needsFloatDecode(colour.still, space, colour.working);
  // Only proxies are kept: a full-resolution decode is as large as the render it feeds.
  const k = cache && key && width ? `${key}@${width}:${space}${colour ? `:${colourKey(colour.still, space, colour.working)}` : ""}` : null;
  const hit = k ? cache!.get(k) : undefined;
  if (hit) return { ...hit, source: { kind: "float", data: hit.data, codes8: hit.codes8, maxAbs: hit.maxAbs }, spare16: null };
  if (float) {
    // OpenEXR and colour-converted stills arrive as working-space floats (no 8-bit codes to reuse).
    const f = await decodeLabFloat(await bytes(), width, space, colour.still, colour.working);
    const maxAbs = maxAbsOf(f.data);
    if (k) cache!.set(k, { ...f, bits: 16, space, maxAbs });
    return { ...f, bits: 16, source: { kind: "float", data: f.data, maxAbs }, spare16: null };
  }
  const still = await decodeStill(await bytes(), width);
  const { sourceWidth, sourceHeight, bits } = still;
  if (k) {
    const data = toFloats(still, space);
    // Its 8-bit codes too: a re-render's result is the plate outside the matte, whose codes then
    // need no quantising (a third of a 1024-px render's encode).
    const codes8 = new Uint8Array(data.length);
    quantise(data, codes8, quantiser(8, space === "linear"));
    const maxAbs = maxAbsOf(data);
    cache!.set(k, { width: still.width, height: still.height, bits, sourceWidth, sourceHeight, space, data, codes8, maxAbs });
    return { width: still.width, height: still.height, bits, sourceWidth, sourceHeight, source: { kind: "float", data, codes8, maxAbs }, spare16: null };
  }
  return {
    width: still.width, height: still.height, bits, sourceWidth, sourceHeight,
    source: codesSource(still, space),
    spare16: bits === 16 ? (still.codes as Uint16Array) : null,
  };
}

export type RunRecipeResult = {
  bytes: Buffer;
  contentType: string;
  width: number;
  height: number;
  sourceWidth: number;
  sourceHeight: number;
  reports: StepReport[];
  /** A proxy render: resized, and blurred with the fast approximation, not the exact Gaussian. */
  approximate: boolean;
  timings: { decodeMs: number; stepsMs: number; encodeMs: number };
};

function checkAbort(signal?: AbortSignal): void {
  if (signal?.aborted) throw new LabAbortedError();
}

const YIELD_AFTER_MS = 5;

type PreparedRun = { state: LabState; plateCodes: Decoded; reports: StepReport[]; decodeMs: number; stepsMs: number };

async function decodeAndRun(opts: Omit<RunRecipeOptions, "format"> & { encode8?: boolean }): Promise<PreparedRun> {
  const { steps, space, signal, onProgress } = opts;
  const total = steps.length + 2;
  const t0 = performance.now();
  onProgress?.({ done: 0, total, label: "decode" });
  const grainIndex = steps.findIndex((s) => s.op === "grain");
  const grainStepOf = grainIndex >= 0 ? (steps[grainIndex] as Extract<RecipeStep, { op: "grain" }>) : null;
  if (grainStepOf && !opts.loadStill) throw new LabInputError(`step ${grainIndex}: no loader for the denoised still`, grainIndex);
  // Both decodes at once: libvips decodes on its own threads.
  const [plateCodes, den] = await Promise.all([
    decodeCached(() => opts.still, opts.width, space, opts.plateKey, opts.decodeCache, colourOf(opts.colour, null)),
    grainStepOf
      ? decodeCached(() => opts.loadStill!(grainStepOf.denoised), opts.width, space, `den:${grainStepOf.denoised}`, opts.decodeCache,
        colourOf(opts.colour, grainStepOf.denoised))
      : null,
  ]);
  checkAbort(signal);
  const plate = plateCodes.source;
  let base: PixelSource = plate;
  if (den) {
    if (den.width !== plateCodes.width || den.height !== plateCodes.height) {
      throw new LabInputError(`step ${grainIndex}: the denoised still is not the plate's size`, grainIndex);
    }
    base = den.source;
  }
  const state = createLabState({
    width: plateCodes.width,
    height: plateCodes.height,
    plate,
    base,
    scale: plateCodes.sourceWidth / plateCodes.width,
  });
  state.encode8 = opts.encode8 === true;
  const t1 = performance.now();
  const reports: StepReport[] = [];
  let lastYield = t1;
  try {
    for (let i = 0; i < steps.length; ) {
      onProgress?.({ done: i + 1, total, label: steps[i]!.op });
      state.tail = null; // only the last step's result may be marked
      const ran = applyStepsAt(state, steps, i);
      for (const r of ran) updateBound(state, steps[r.index]!, r);
      reports.push(...ran);
      i += ran.length;
      checkAbort(signal);
      // Let the event loop breathe between steps so timeouts and other requests get a turn — once
      // some milliseconds of work have gone by, not after every ~1 ms step of a proxy render.
      if (performance.now() - lastYield >= YIELD_AFTER_MS) {
        await new Promise<void>((resolve) => setImmediate(resolve));
        lastYield = performance.now();
      }
    }
  } catch (error) {
    releaseSimdRgb(state.cur);
    throw error;
  } finally {
    releasePlanes(state);
    releaseExactBlurMemory();
  }
  const t2 = performance.now();
  return { state, plateCodes, reports, decodeMs: t1 - t0, stepsMs: t2 - t1 };
}


function colourOf(colour: LabColour | undefined, id: string | null): { still: StillColour; working: LabColour["working"] } | undefined {
  if (!colour) return undefined;
  return { still: (id && colour.others?.[id]) || colour.plate, working: colour.working };
}

/** Decodes, runs every step in float32, and encodes. Never writes to the still it was given. */
export async function runRecipe(opts: RunRecipeOptions): Promise<RunRecipeResult> {
  const { space, format, onProgress } = opts;
  const total = opts.steps.length + 2;
  const { state, plateCodes, reports, decodeMs, stepsMs } = await decodeAndRun({ ...opts, encode8: format !== "png16" });
  const t2 = performance.now();
  onProgress?.({ done: total - 1, total, label: "encode" });
  const ws = opts.colour ? workingSpace(opts.colour.plate, space, opts.colour.working) : null;
  let bytes: Buffer;
  if (format === "exr") {
    bytes = Buffer.from(await encodeLabExr(state.cur, state.width, state.height, opts.exr ?? { pixelType: "half", compression: "zip" }, space === "linear" ? (ws ?? "lin-rec709") : null));
  } else {
    // 8/16-bit encodes show linear results as sRGB: working spaces other than linear Rec.709 are converted first.
    const toDisplay = displayMatrix(ws);
    if (toDisplay) matrixInPlace(state.cur, toDisplay);
    bytes = await encodeImage(state.cur, state.width, state.height, space, format, plateCodes.spare16 ?? undefined, true, state.tail);
  }
  releaseSimdRgb(state.cur);
  const t3 = performance.now();
  onProgress?.({ done: total, total, label: "done" });
  return {
    bytes,
    contentType: CONTENT_TYPES[format],
    width: state.width,
    height: state.height,
    sourceWidth: plateCodes.sourceWidth,
    sourceHeight: plateCodes.sourceHeight,
    reports,
    approximate: !state.exact,
    timings: { decodeMs, stepsMs, encodeMs: t3 - t2 },
  };
}

type FloatRunResult = {
  /** The plate in the working space, before any step (only when asked for). */
  before: { width: number; height: number; data: Float32Array } | null;
  /** The float result, unclipped (values outside 0..1 kept). */
  after: { width: number; height: number; data: Float32Array };
  reports: StepReport[];
  sourceWidth: number;
  sourceHeight: number;
  approximate: boolean;
};

/** As runRecipe, but answers the float result instead of encoded bytes (for plots and samples). */
export async function runRecipeToFloat(opts: Omit<RunRecipeOptions, "format"> & { withBefore?: boolean }): Promise<FloatRunResult> {
  const { state, plateCodes, reports } = await decodeAndRun(opts);
  let before: FloatRunResult["before"] = null;
  if (opts.withBefore) {
    const data = new Float32Array(state.cur.length);
    const src = state.plate;
    if (src.kind === "float") data.set(src.data);
    else for (let i = 0; i < data.length; i++) data[i] = src.lut[src.codes[i]!]!;
    before = { width: state.width, height: state.height, data };
  }
  return {
    before,
    after: { width: state.width, height: state.height, data: state.cur },
    reports,
    sourceWidth: plateCodes.sourceWidth,
    sourceHeight: plateCodes.sourceHeight,
    approximate: !state.exact,
  };
}
