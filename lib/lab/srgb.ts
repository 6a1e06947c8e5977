/*
 * sRGB transfer function, IEC 61966-2-1:1999. Client-safe.
 * Decode of stored 8/16-bit codes goes through exact lookup tables; encode uses the formula,
 * or (for quantising to a code) a threshold search that gives the same code as rounding it.
 */
import { quantise8InPlace } from "@/lib/lab/simd";

export function srgbDecode(v: number): number {
  return v <= 0.04045 ? v / 12.92 : ((v + 0.055) / 1.055) ** 2.4;
}

export function srgbEncode(l: number): number {
  return l <= 0.0031308 ? l * 12.92 : 1.055 * l ** (1 / 2.4) - 0.055;
}

/** Sign-symmetric variants so out-of-range float values survive a round trip. */
export function srgbDecodeExt(v: number): number {
  return v < 0 ? -srgbDecode(-v) : srgbDecode(v);
}
export function srgbEncodeExt(l: number): number {
  return l < 0 ? -srgbEncode(-l) : srgbEncode(l);
}

const lutCache = new Map<string, Float32Array>();

/** code → float value for `bits`-bit stored codes, linear (sRGB-decoded) or stored/max. */
export function codeLut(bits: 8 | 16, linear: boolean): Float32Array {
  const key = `${bits}:${linear}`;
  let lut = lutCache.get(key);
  if (!lut) {
    const max = bits === 8 ? 255 : 65535;
    lut = new Float32Array(max + 1);
    for (let k = 0; k <= max; k++) lut[k] = linear ? srgbDecode(k / max) : k / max;
    lutCache.set(key, lut);
  }
  return lut;
}

/*
 * Quantiser float → code: code k is chosen where t[k-1] ≤ x < t[k], t[k] being the value
 * whose encoding is exactly (k + 0.5)/max — the same code as round(encode(x)·max).
 * Thresholds are stored as the smallest float32 ≥ t[k]: for a float32 x, x ≥ t ⇔ x ≥ that
 * value, so the compare stays exact while the table halves (256 KB at 16 bits).
 * Linear space: the encode is interpolated along its chord over cells of equal relative width
 * (indexed by the float's own exponent and top mantissa bits; 1024 cells per octave keep the
 * chord within ~0.01 code of the curve) and rounded. Only when the interpolated value lies
 * within `guard` of a rounding edge (a few per cent of pixels) are the exact thresholds read:
 * reading them for every pixel, or walking a table of start codes, cost 40–50 ms for a 2K
 * frame against ~12 ms now.
 * Stored space: the code is round(x·max) give or take one, settled by the same thresholds.
 */
type Quantiser = {
  bits: 8 | 16;
  max: number;
  linear: boolean;
  thresholds: Float32Array;
  /** Linear only: per cell, encode(cell start)·max and its slope per unit of the low float bits. */
  chord: Float64Array;
  shift: number;
  /** Float bits >> shift of the lowest cell; below it every value quantises to 0. */
  low: number;
  /** Distance from a rounding edge beyond which the chord's rounding is certain. */
  guard: number;
  /**
   * 8-bit linear only: the code of each cell's first float, cells (256 per octave) being narrow
   * enough that at most one rounding edge falls inside one, so one compare settles the code.
   */
  cells: Uint8Array | null;
};

const quantCache = new Map<string, Quantiser>();

const f32 = new Float32Array(1);
const u32 = new Uint32Array(f32.buffer);

/** Smallest float32 ≥ t, for t > 0. */
function ceil32(t: number): number {
  f32[0] = t;
  if (f32[0] >= t || !Number.isFinite(t)) return f32[0];
  u32[0] = u32[0]! + 1;
  return f32[0];
}

function floatBits(x: number): number {
  f32[0] = x;
  return u32[0]!;
}

function bitsFloat(b: number): number {
  u32[0] = b;
  return f32[0]!;
}

const CELL_BITS = 10;

export function quantiser(bits: 8 | 16, linear: boolean): Quantiser {
  const key = `${bits}:${linear}`;
  const hit = quantCache.get(key);
  if (hit) return hit;
  const max = bits === 8 ? 255 : 65535;
  const thresholds = new Float32Array(max + 1);
  for (let k = 0; k < max; k++) thresholds[k] = ceil32(linear ? srgbDecode((k + 0.5) / max) : (k + 0.5) / max);
  thresholds[max] = Infinity;
  let chord = new Float64Array(0), shift = 0, low = 0, guard = 0.5;
  if (linear) {
    shift = 23 - CELL_BITS;
    // Lowest octave: 2^-e ≤ t[0], so anything below it is code 0.
    const e = Math.ceil(-Math.log2(thresholds[0]!));
    low = floatBits(2 ** -e) >>> shift;
    const cells = (floatBits(1) >>> shift) - low;
    chord = new Float64Array(cells * 2);
    for (let j = 0; j < cells; j++) {
      const y0 = srgbEncode(bitsFloat((low + j) << shift)) * max;
      const y1 = srgbEncode(bitsFloat((low + j + 1) << shift)) * max;
      chord[2 * j] = y0;
      chord[2 * j + 1] = (y1 - y0) / 2 ** shift;
    }
    // The chord's largest miss, sampled inside every cell (the curve is linear then concave, so
    // the miss peaks inside a cell, at the kink or near the middle); the guard keeps 4× that.
    let miss = 0;
    const kink = 0.0031308;
    for (let j = 0; j < cells; j++) {
      const b0 = (low + j) << shift;
      const x0 = bitsFloat(b0), x1 = bitsFloat(b0 + (1 << shift));
      const offs = [0.25, 0.5, 0.75].map((t) => Math.floor(t * 2 ** shift));
      if (x0 <= kink && kink < x1) offs.push(Math.floor(((kink - x0) / (x1 - x0)) * 2 ** shift));
      for (const off of offs) {
        const x = bitsFloat(b0 + off);
        const d = Math.abs(chord[2 * j]! + chord[2 * j + 1]! * off - srgbEncode(x) * max);
        if (d > miss) miss = d;
      }
    }
    guard = Math.min(0.5, Math.max(4 * miss, 1e-3));
  }
  const cells = bits === 8 && linear ? edgeCells(thresholds) : null;
  const q = { bits, max, linear, thresholds, chord, shift, low, guard, cells };
  quantCache.set(key, q);
  return q;
}

const ONE_BITS = 0x3f800000, INF_BITS = 0x7f800000;
const EDGE_CELL_BITS = 8;

/*
 * Per cell of the float bits (exponent and top 8 mantissa bits, from the octave holding
 * thresholds[0] up to 1): the code of the cell's first float. Null if some cell held two edges
 * (it cannot for 8-bit sRGB: the narrowest code step is ~3e-4 wide against cells ≤ 2e-3 of
 * a step ~9e-3 near 1, and ≤ 8e-6 in the linear segment, but the build checks rather than trusts).
 */
function edgeCells(thresholds: Float32Array): Uint8Array | null {
  const shift = 23 - EDGE_CELL_BITS;
  const e = Math.ceil(-Math.log2(thresholds[0]!));
  const low = floatBits(2 ** -e) >>> shift;
  const count = (ONE_BITS >>> shift) - low;
  const cells = new Uint8Array(count);
  let k = 0;
  for (let j = 0; j < count; j++) {
    const first = bitsFloat((low + j) << shift), last = bitsFloat(((low + j + 1) << shift) - 1);
    k = settle(thresholds, k, first);
    const kLast = settle(thresholds, k, last);
    if (kLast > k + 1) return null;
    cells[j] = k;
  }
  return cells;
}

/** Writes codes for an interleaved float buffer, clipping to 0..1 (the only clip in a run). */
export function quantise(src: Float32Array, dst: Uint16Array | Uint8Array, q: Quantiser): void {
  if (q.cells && dst instanceof Uint8Array) quantiseCells(new Int32Array(src.buffer, src.byteOffset, src.length), dst, q, q.cells);
  else if (q.linear) quantiseLinear(src, new Int32Array(src.buffer, src.byteOffset, src.length), dst, q);
  else quantiseStored(src, dst, q);
}


function quantiseLinear(src: Float32Array, bitsOf: Int32Array, dst: Uint16Array | Uint8Array, q: Quantiser): void {
  const { thresholds, chord, shift, max, guard } = q;
  // Integer compares on the float's bits: negatives (sign bit set) and values below the lowest
  // cell are code 0, 1 and above is max, NaN (bits above +∞'s) is 0.
  const lowBits = q.low << shift;
  const mask = (1 << shift) - 1;
  const hi = 1 - guard;
  const n = src.length;
  for (let i = 0; i < n; i++) {
    const b = bitsOf[i]!;
    if (b < lowBits) {
      dst[i] = 0;
      continue;
    }
    if (b >= ONE_BITS) {
      dst[i] = b > INF_BITS ? 0 : max;
      continue;
    }
    const j = (b - lowBits) >> shift;
    const y = chord[2 * j]! + chord[2 * j + 1]! * (b & mask) + 0.5;
    const k = y | 0;
    const f = y - k;
    dst[i] = f > guard && f < hi ? k : settle(thresholds, k, src[i]!);
  }
}

/**
 * 8-bit linear codes for a working buffer from takeSimdRgb, computed in place in WebAssembly
 * (the floats are consumed); null when that path is not available.
 */
export function quantise8Consuming(src: Float32Array, q: Quantiser): Uint8Array | null {
  if (!q.cells) return null;
  const { thresholds } = q;
  const shift = 23 - EDGE_CELL_BITS;
  const lowBits = (floatBits(2 ** -Math.ceil(-Math.log2(thresholds[0]!))) >>> shift) << shift;
  return quantise8InPlace(src, q.cells, new Int32Array(thresholds.buffer, thresholds.byteOffset, thresholds.length), lowBits);
}

/** 8-bit linear: the cell's first code, plus one if x is past the one edge the cell may hold. */
function quantiseCells(bitsOf: Int32Array, dst: Uint8Array, q: Quantiser, cells: Uint8Array): void {
  const { thresholds, max } = q;
  const edgeBits = new Int32Array(thresholds.buffer, thresholds.byteOffset, thresholds.length);
  const shift = 23 - EDGE_CELL_BITS;
  const lowBits = (floatBits(2 ** -Math.ceil(-Math.log2(thresholds[0]!))) >>> shift) << shift;
  const n = bitsOf.length;
  for (let i = 0; i < n; i++) {
    const b = bitsOf[i]!;
    if (b < lowBits) {
      dst[i] = 0;
      continue;
    }
    if (b >= ONE_BITS) {
      dst[i] = b > INF_BITS ? 0 : max;
      continue;
    }
    // x ≥ t as integers on the bits (both positive): branch-free, as the compare is a coin toss.
    const k = cells[(b - lowBits) >> shift]!;
    dst[i] = k + ((edgeBits[k]! - b - 1) >>> 31);
  }
}

/** The code for x near a rounding edge, from a first guess at most a code or two off. */
function settle(thresholds: Float32Array, k: number, x: number): number {
  while (thresholds[k]! <= x) k++;
  while (k > 0 && thresholds[k - 1]! > x) k--;
  return k;
}

function quantiseStored(src: Float32Array, dst: Uint16Array | Uint8Array, q: Quantiser): void {
  const { thresholds, max } = q;
  const n = src.length;
  for (let i = 0; i < n; i++) {
    const x = src[i]!;
    if (!(x > 0)) {
      dst[i] = 0;
      continue;
    }
    if (x >= 1) {
      dst[i] = max;
      continue;
    }
    let k = (x * max + 0.5) | 0;
    while (thresholds[k]! <= x) k++;
    while (k > 0 && thresholds[k - 1]! > x) k--;
    dst[i] = k;
  }
}
