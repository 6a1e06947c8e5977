/*
 * Pixel kernels of the still lab: tight loops over typed-array planes. No sharp here, so the
 * tests can check each kernel against a reference on its own. Interleaved RGB for images,
 * single planes (width × height) for mattes and single channels.
 */

import { gaussianHalfKernel } from "@/lib/lab/gaussian";
import { matrixSimd } from "@/lib/lab/simd";

/** A single plane: float32 for image channels, float64 for mattes and flatten weights. */
export type Plane = Float32Array | Float64Array;

/** A zeroed plane of the same element type as `p`. */
const like = (p: Plane, n: number): Plane => (p instanceof Float64Array ? new Float64Array(n) : new Float32Array(n));

/** out = M · rgb + offset per pixel, in place. Rows equal to the identity with no offset are skipped. */
export function matrixInPlace(a: Float32Array, m: readonly (readonly number[])[], offset?: readonly number[]): void {
  const m00 = m[0]![0]!, m01 = m[0]![1]!, m02 = m[0]![2]!;
  const m10 = m[1]![0]!, m11 = m[1]![1]!, m12 = m[1]![2]!;
  const m20 = m[2]![0]!, m21 = m[2]![1]!, m22 = m[2]![2]!;
  const o0 = offset?.[0] ?? 0, o1 = offset?.[1] ?? 0, o2 = offset?.[2] ?? 0;
  const keep0 = m00 === 1 && m01 === 0 && m02 === 0 && o0 === 0;
  const keep1 = m10 === 0 && m11 === 1 && m12 === 0 && o1 === 0;
  const keep2 = m20 === 0 && m21 === 0 && m22 === 1 && o2 === 0;
  const n = a.length;
  // A solved "hide" matrix changes one row: one write per pixel instead of three.
  const changed = (keep0 ? 0 : 1) + (keep1 ? 0 : 1) + (keep2 ? 0 : 1);
  if (changed === 0) return;
  if (matrixSimd(a, m, [o0, o1, o2], [keep0, keep1, keep2])) return;
  if (changed === 1) {
    const c = keep0 ? (keep1 ? 2 : 1) : 0;
    const row = m[c]!;
    const a0 = row[0]!, a1 = row[1]!, a2 = row[2]!, o = [o0, o1, o2][c]!;
    for (let i = 0; i < n; i += 3) a[i + c] = a0 * a[i]! + a1 * a[i + 1]! + a2 * a[i + 2]! + o;
    return;
  }
  for (let i = 0; i < n; i += 3) {
    const r = a[i]!, g = a[i + 1]!, b = a[i + 2]!;
    a[i] = m00 * r + m01 * g + m02 * b + o0;
    a[i + 1] = m10 * r + m11 * g + m12 * b + o1;
    a[i + 2] = m20 * r + m21 * g + m22 * b + o2;
  }
}

export function copyChannel(a: Float32Array, from: number, to: number): void {
  if (from === to) return;
  const n = a.length;
  for (let i = 0; i < n; i += 3) a[i + to] = a[i + from]!;
}

export function extractChannel(a: Float32Array, c: number, out: Float32Array): void {
  const n = out.length;
  for (let i = 0, j = c; i < n; i++, j += 3) out[i] = a[j]!;
}

export function insertChannel(a: Float32Array, c: number, plane: Float32Array): void {
  const n = plane.length;
  for (let i = 0, j = c; i < n; i++, j += 3) a[j] = plane[i]!;
}

/** Linear ramp black → 0, white → 1, clamped: a matte lives in 0..1. */
export function rampPlane(v: Plane, black: number, white: number): void {
  const n = v.length;
  if (white === black) {
    for (let i = 0; i < n; i++) v[i] = v[i]! >= white ? 1 : 0;
    return;
  }
  const k = 1 / (white - black);
  for (let i = 0; i < n; i++) {
    const t = (v[i]! - black) * k;
    v[i] = t < 0 ? 0 : t > 1 ? 1 : t;
  }
}

// ---------------------------------------------------------------------------------------
// Grey-level morphology: dilation/erosion by a (2r+1)² square, separable, each 1-D pass a
// van Herk / Gil–Werman running max (3 compares per pixel whatever r). Outside the frame
// counts as absent (−∞ for dilation, +∞ for erosion), as in the running min/max definition.

function vanHerkRow(src: Plane, srcOff: number, stride: number, len: number, r: number, isMax: boolean,
  pad: Plane, g: Plane, h: Plane, dst: Plane): void {
  const k = 2 * r + 1;
  const fill = isMax ? -Infinity : Infinity;
  const L = Math.ceil((len + 2 * r) / k) * k;
  for (let i = 0; i < r; i++) pad[i] = fill;
  for (let i = 0, j = srcOff; i < len; i++, j += stride) pad[r + i] = src[j]!;
  for (let i = r + len; i < L; i++) pad[i] = fill;
  if (isMax) {
    for (let b = 0; b < L; b += k) {
      let acc = pad[b]!;
      g[b] = acc;
      for (let i = b + 1; i < b + k; i++) { const v = pad[i]!; acc = v > acc ? v : acc; g[i] = acc; }
      acc = pad[b + k - 1]!;
      h[b + k - 1] = acc;
      for (let i = b + k - 2; i >= b; i--) { const v = pad[i]!; acc = v > acc ? v : acc; h[i] = acc; }
    }
    for (let x = 0, j = srcOff; x < len; x++, j += stride) { const a = h[x]!, b = g[x + k - 1]!; dst[j] = a > b ? a : b; }
  } else {
    for (let b = 0; b < L; b += k) {
      let acc = pad[b]!;
      g[b] = acc;
      for (let i = b + 1; i < b + k; i++) { const v = pad[i]!; acc = v < acc ? v : acc; g[i] = acc; }
      acc = pad[b + k - 1]!;
      h[b + k - 1] = acc;
      for (let i = b + k - 2; i >= b; i--) { const v = pad[i]!; acc = v < acc ? v : acc; h[i] = acc; }
    }
    for (let x = 0, j = srcOff; x < len; x++, j += stride) { const a = h[x]!, b = g[x + k - 1]!; dst[j] = a < b ? a : b; }
  }
}

/*
 * Marker mattes are mostly zero. A row of zeros stays zero under blur, dilation and erosion, and
 * an output row whose whole window of input rows is zero is zero: such rows are skipped. This
 * is exact for any plane, not only mattes.
 */
function zeroRowPrefix(plane: Plane, width: number, height: number): Int32Array {
  // prefix[y] = number of non-zero rows among rows 0..y-1
  const prefix = new Int32Array(height + 1);
  for (let y = 0; y < height; y++) {
    let nz = 0;
    for (let x = y * width, e = x + width; x < e; x++) if (plane[x] !== 0) { nz = 1; break; }
    prefix[y + 1] = prefix[y]! + nz;
  }
  return prefix;
}

const windowIsZero = (prefix: Int32Array, y0: number, y1: number, height: number): boolean =>
  prefix[Math.min(height, y1 + 1)]! - prefix[Math.max(0, y0)]! === 0;

/*
 * The same within a row, by blocks: each row is cut into 32 blocks of ceil(width/32) columns and
 * a 32-bit mask marks the blocks holding a non-zero value. Outside the marked blocks grown by the
 * radius every window lies in zeros, so the kernels below compute only there. Marker mattes
 * cover ~1 % of a frame in small spots spread along a row (so a first-to-last span would still
 * hold ~half of the row), which leaves a few blocks per row.
 */
type Blocks = { bw: number; masks: Int32Array; prefix: Int32Array };

function rowBlocks(plane: Plane, width: number, height: number): Blocks {
  const bw = Math.ceil(width / 32);
  const masks = new Int32Array(height), prefix = new Int32Array(height + 1);
  // OR of the bits, no branch per value (−0 counts as non-zero: only more work, never wrong).
  const words = plane.BYTES_PER_ELEMENT >> 2;
  const bits = new Int32Array(plane.buffer, plane.byteOffset, plane.length * words);
  for (let y = 0; y < height; y++) {
    const o = y * width;
    let m = 0;
    for (let b = 0, x0 = 0; x0 < width; b++, x0 += bw) {
      let any = 0;
      for (let x = (o + x0) * words, e = (o + Math.min(width, x0 + bw)) * words; x < e; x++) any |= bits[x]!;
      if (any !== 0) m |= 1 << b;
    }
    masks[y] = m;
    prefix[y + 1] = prefix[y]! + (m !== 0 ? 1 : 0);
  }
  return { bw, masks, prefix };
}

/** The masks after a horizontal pass of radius r: every marked block's neighbours within r columns. */
function growBlocks(s: Blocks, width: number, r: number): Blocks {
  const g = Math.ceil(r / s.bw), nb = Math.ceil(width / s.bw);
  const all = nb >= 32 ? -1 : (1 << nb) - 1;
  const masks = s.masks.map((m) => {
    let out = m;
    for (let t = 1; t <= g; t++) out |= (m << t) | (m >>> t);
    return out & all;
  });
  return { bw: s.bw, masks, prefix: s.prefix };
}

/** OR of the masks of rows y0..y1, clipped to the frame. */
function windowMask(s: Blocks, y0: number, y1: number): number {
  let m = 0;
  for (let y = Math.max(0, y0), e = Math.min(s.masks.length - 1, y1); y <= e; y++) m |= s.masks[y]!;
  return m;
}

/** Calls fn(xa, xb) for each run of marked blocks of `mask`, as a column range [xa, xb). */
function forRuns(mask: number, bw: number, width: number, fn: (xa: number, xb: number) => void): void {
  let m = mask;
  while (m !== 0) {
    const lo = 31 - Math.clz32(m & -m);
    const rest = ~(m >>> lo);
    const len = rest === 0 ? 32 - lo : 31 - Math.clz32(rest & -rest);
    fn(lo * bw, Math.min(width, (lo + len) * bw));
    m = len + lo >= 32 ? 0 : m & ~(((1 << len) - 1) << lo);
  }
}

// Below this radius a plain running max over 2r+1 values is cheaper than van Herk's bookkeeping.
const DIRECT_MORPH_RADIUS = 3;

function directMorph(plane: Plane, width: number, height: number, r: number, isMax: boolean): void {
  const fill = isMax ? -Infinity : Infinity;
  const blocks = rowBlocks(plane, width, height);
  const hb = growBlocks(blocks, width, r);
  const { prefix } = blocks;
  const row = like(plane, width + 2 * r).fill(fill);
  let o = 0;
  const horizontal = isMax
    ? (xa: number, xb: number): void => {
      for (let x = xa; x < xb; x++) {
        let m = row[x]!;
        for (let t = 1; t <= 2 * r; t++) { const v = row[x + t]!; if (v > m) m = v; }
        plane[o + x] = m;
      }
    }
    : (xa: number, xb: number): void => {
      for (let x = xa; x < xb; x++) {
        let m = row[x]!;
        for (let t = 1; t <= 2 * r; t++) { const v = row[x + t]!; if (v < m) m = v; }
        plane[o + x] = m;
      }
    };
  for (let y = 0; y < height; y++) {
    if (prefix[y + 1] === prefix[y]) continue;
    o = y * width;
    row.set(plane.subarray(o, o + width), r);
    forRuns(hb.masks[y]!, hb.bw, width, horizontal);
  }
  // Vertical: keep the last r+1 source rows in a ring so the pass can write in place.
  const ring = like(plane, (2 * r + 1) * width);
  const acc = like(plane, width);
  const slot = (y: number): number => (y % (2 * r + 1)) * width;
  for (let y = 0; y < Math.min(r, height); y++) ring.set(plane.subarray(y * width, y * width + width), slot(y));
  let y0 = 0, y1 = 0;
  const vertical = (xa: number, xb: number): void => {
    acc.set(ring.subarray(slot(y0) + xa, slot(y0) + xb), xa);
    for (let yy = y0 + 1; yy <= y1; yy++) {
      const s = slot(yy);
      if (isMax) for (let x = xa; x < xb; x++) { const v = ring[s + x]!; if (v > acc[x]!) acc[x] = v; }
      else for (let x = xa; x < xb; x++) { const v = ring[s + x]!; if (v < acc[x]!) acc[x] = v; }
    }
    plane.set(acc.subarray(xa, xb), o + xa);
  };
  for (let y = 0; y < height; y++) {
    const ahead = y + r;
    if (ahead < height) ring.set(plane.subarray(ahead * width, ahead * width + width), slot(ahead));
    y0 = Math.max(0, y - r);
    y1 = Math.min(height - 1, y + r);
    if (windowIsZero(prefix, y0, y1, height)) continue; // row y is zero and stays zero
    // Outside the window's blocks every input is zero, and so is row y there already.
    o = y * width;
    forRuns(windowMask(hb, y0, y1), hb.bw, width, vertical);
  }
}

/**
 * Grows (px > 0, dilation) or shrinks (px < 0, erosion) a plane in place by a square of side 2|px|+1.
 * The vertical pass runs over whole rows at once (van Herk on row vectors) so memory is read in order.
 */
export function morphPlane(plane: Plane, width: number, height: number, px: number): void {
  const r = Math.abs(px);
  if (r === 0) return;
  const isMax = px > 0;
  if (r <= DIRECT_MORPH_RADIUS) {
    directMorph(plane, width, height, r, isMax);
    return;
  }
  const k = 2 * r + 1;
  const maxLen = Math.max(width, height) + 2 * r + k;
  const pad = like(plane, maxLen), g = like(plane, maxLen), h = like(plane, maxLen);
  const prefix = zeroRowPrefix(plane, width, height);
  for (let y = 0; y < height; y++) if (prefix[y + 1] !== prefix[y]) vanHerkRow(plane, y * width, 1, width, r, isMax, pad, g, h, plane);

  // Vertical: padded row index p = y + r; blocks of k rows; g/h hold one row per padded row.
  const fill = isMax ? -Infinity : Infinity;
  const P = Math.ceil((height + 2 * r) / k) * k;
  const G = like(plane, P * width), H = like(plane, P * width);
  const rowOf = (p: number): number => p - r; // image row, or out of range for pads
  for (let b = 0; b < P; b += k) {
    for (let p = b; p < b + k; p++) {
      const y = rowOf(p), o = p * width;
      if (y < 0 || y >= height) { G.fill(fill, o, o + width); } else { G.set(plane.subarray(y * width, y * width + width), o); }
      if (p > b) {
        const q = o - width;
        if (isMax) for (let x = 0; x < width; x++) { const a = G[q + x]!, c = G[o + x]!; G[o + x] = a > c ? a : c; }
        else for (let x = 0; x < width; x++) { const a = G[q + x]!, c = G[o + x]!; G[o + x] = a < c ? a : c; }
      }
    }
    for (let p = b + k - 1; p >= b; p--) {
      const y = rowOf(p), o = p * width;
      if (y < 0 || y >= height) { H.fill(fill, o, o + width); } else { H.set(plane.subarray(y * width, y * width + width), o); }
      if (p < b + k - 1) {
        const q = o + width;
        if (isMax) for (let x = 0; x < width; x++) { const a = H[q + x]!, c = H[o + x]!; H[o + x] = a > c ? a : c; }
        else for (let x = 0; x < width; x++) { const a = H[q + x]!, c = H[o + x]!; H[o + x] = a < c ? a : c; }
      }
    }
  }
  for (let y = 0; y < height; y++) {
    const ho = y * width, go = (y + 2 * r) * width, o = y * width;
    if (isMax) for (let x = 0; x < width; x++) { const a = H[ho + x]!, c = G[go + x]!; plane[o + x] = a > c ? a : c; }
    else for (let x = 0; x < width; x++) { const a = H[ho + x]!, c = G[go + x]!; plane[o + x] = a < c ? a : c; }
  }
}

// ---------------------------------------------------------------------------------------
// The proxy renders' Gaussian: APPROXIMATE, for quick previews only (exact renders use
// lib/lab/gaussian.ts). Up to FIR_MAX_RADIUS it is the sampled kernel of gaussian.ts (cut at
// round(4σ), edge pixels repeated), computed only where the plane is non-zero; beyond, the plane
// is box-reduced by f, blurred small and enlarged bilinearly — O(1) per full-size pixel, within
// ~1e-3 of the exact result on unit-contrast edges (tested) but not the Gaussian.

const FIR_MAX_RADIUS = 12;

type HPass = (plane: Plane, tmp: Plane, row: Plane, o: number, width: number, xa: number, xb: number, k: Float64Array) => void;
type VPass = (plane: Plane, tmp: Plane, offs: Int32Array, o: number, xa: number, xb: number, k: Float64Array) => void;
const firCache = new Map<number, { h: HPass; v: VPass }>();

/*
 * The kernel is unrolled into generated straight-line code (symmetric taps paired, weights held in
 * locals): a loop over taps costs ~5× more per pixel in V8. The code is made per radius, not per
 * sigma, so dragging a sigma slider does not compile (and run unoptimised) a new function for
 * every render. Only numbers go into the source.
 */
function firPasses(r: number): { h: HPass; v: VPass } {
  const hit = firCache.get(r);
  if (hit) return hit;
  const weights = Array.from({ length: r + 1 }, (_, t) => `k${t} = k[${t}]`).join(", ");
  let hs = `k0 * row[x + ${r}]`;
  for (let t = 1; t <= r; t++) hs += ` + k${t} * (row[x + ${r - t}] + row[x + ${r + t}])`;
  // Columns [xa, xb) of the row at o, through a padded copy of the row (edges repeated).
  const h = new Function("plane", "tmp", "row", "o", "width", "xa", "xb", "k", `
    const ${weights};
    const first = plane[o], last = plane[o + width - 1];
    for (let i = 0; i < ${r}; i++) { row[i] = first; row[${r} + width + i] = last; }
    const a = xa < ${r} ? 0 : xa - ${r}, b = xb + ${r} > width ? width : xb + ${r};
    row.set(plane.subarray(o + a, o + b), ${r} + a);
    for (let x = xa; x < xb; x++) tmp[o + x] = ${hs};`) as HPass;
  let vs = `k0 * tmp[o${r} + x]`;
  for (let t = 1; t <= r; t++) vs += ` + k${t} * (tmp[o${r - t} + x] + tmp[o${r + t} + x])`;
  const decl = Array.from({ length: 2 * r + 1 }, (_, i) => `o${i} = offs[${i}]`).join(", ");
  const v = new Function("plane", "tmp", "offs", "o", "xa", "xb", "k", `
    const ${decl}, ${weights};
    for (let x = xa; x < xb; x++) plane[o + x] = ${vs};`) as VPass;
  const passes = { h, v };
  firCache.set(r, passes);
  return passes;
}

function firBlur(plane: Plane, width: number, height: number, k: Float64Array, tmp: Plane): void {
  const r = k.length - 1;
  const { h, v } = firPasses(r);
  const blocks = rowBlocks(plane, width, height);
  const hb = growBlocks(blocks, width, r);
  const row = like(plane, width + 2 * r);
  for (let y = 0; y < height; y++) {
    const o = y * width;
    if (hb.masks[y] === 0) { tmp.fill(0, o, o + width); continue; }
    let done = 0;
    forRuns(hb.masks[y]!, hb.bw, width, (xa, xb) => {
      tmp.fill(0, o + done, o + xa);
      h(plane, tmp, row, o, width, xa, xb, k);
      done = xb;
    });
    tmp.fill(0, o + done, o + width);
  }
  const offs = new Int32Array(2 * r + 1);
  let o = 0;
  const vertical = (xa: number, xb: number): void => v(plane, tmp, offs, o, xa, xb, k);
  for (let y = 0; y < height; y++) {
    if (windowIsZero(blocks.prefix, y - r, y + r, height)) continue; // row y is zero and stays zero
    for (let t = -r; t <= r; t++) {
      const yy = y + t;
      offs[t + r] = (yy < 0 ? 0 : yy >= height ? height - 1 : yy) * width;
    }
    // Edge rows repeat (clamped), so the clamped window's blocks cover every row read.
    o = y * width;
    forRuns(windowMask(hb, y - r, y + r), hb.bw, width, vertical);
  }
}

/** Above this share of a plane's column blocks (grown by the radius) the sparse path stops paying. */
const SPARSE_MAX_SHARE = 0.25;

/**
 * The exact sampled Gaussian of gaussian.ts (same kernel, edges repeated), computed only over the
 * column blocks and rows that hold non-zero values grown by the radius — for mostly-zero planes
 * such as marker mattes, with R ≤ FIR_MAX_RADIUS. Answers false (plane untouched) when the plane
 * is not sparse enough or the radius too large; the caller then runs the full-frame passes.
 */
export function blurSampledSparse(plane: Plane, width: number, height: number, sigma: number, tmp: Plane): boolean {
  const k = gaussianHalfKernel(sigma);
  const r = k.length - 1;
  if (r === 0) return true;
  if (r > FIR_MAX_RADIUS) return false;
  const hb = growBlocks(rowBlocks(plane, width, height), width, r);
  let marked = 0;
  for (let y = 0; y < height; y++) {
    let m = hb.masks[y]!;
    while (m !== 0) { m &= m - 1; marked++; }
  }
  // Rows within r of a marked row are computed too.
  if ((marked * (2 * r + 1)) / (32 * height) > SPARSE_MAX_SHARE) return false;
  firBlur(plane, width, height, k, tmp);
  return true;
}

/**
 * Approximate Gaussian blur of a plane in place (proxy renders); `tmp` is a scratch plane of the
 * same size and type.
 */
export function blurPlaneApprox(plane: Plane, width: number, height: number, sigma: number, tmp: Plane): void {
  const k = gaussianHalfKernel(sigma);
  if (k.length - 1 <= FIR_MAX_RADIUS) {
    if (k.length > 1) firBlur(plane, width, height, k, tmp);
    return;
  }
  const red = approxReduction(sigma)!;
  const { sw, sh } = reducedSize(width, height, red.f);
  const small = like(plane, sw * sh);
  boxReduce(plane, width, height, red.f, small);
  blurPlaneApprox(small, sw, sh, red.smallSigma, like(plane, sw * sh));
  const up = bilinearUp(width, height, red.f, sw, sh);
  for (let y = 0; y < height; y++) {
    const { r0, r1, wy } = up.row(y), o = y * width;
    for (let x = 0; x < width; x++) plane[o + x] = up.at(small, r0, r1, wy, x);
  }
}

/**
 * The proxy blur's reduced path, for a sigma beyond the FIR range (else null): reduce by f so the
 * small blur stays within the FIR range; the box (variance (f²−1)/12) and the bilinear enlargement
 * (about (f²−1)/6) are taken out of the small blur's sigma.
 */
export function approxReduction(sigma: number): { f: number; smallSigma: number } | null {
  if (gaussianHalfKernel(sigma).length - 1 <= FIR_MAX_RADIUS) return null;
  const f = Math.max(2, Math.ceil(sigma / 3));
  const residual = sigma * sigma - (f * f - 1) / 12 - (f * f - 1) / 6;
  return { f, smallSigma: Math.max(0.5, Math.sqrt(Math.max(residual, 0)) / f) };
}

export const reducedSize = (width: number, height: number, f: number) => ({ sw: Math.ceil(width / f), sh: Math.ceil(height / f) });

/** Mean of each f × f block (the last row and column of blocks may be smaller). */
function boxReduce(plane: Plane, width: number, height: number, f: number, small: Plane): void {
  const { sw, sh } = reducedSize(width, height, f);
  for (let sy = 0; sy < sh; sy++) {
    const y0 = sy * f, y1 = Math.min(height, y0 + f);
    for (let sx = 0; sx < sw; sx++) {
      const x0 = sx * f, x1 = Math.min(width, x0 + f);
      let s = 0;
      for (let y = y0; y < y1; y++) for (let x = x0, o = y * width; x < x1; x++) s += plane[o + x]!;
      small[sy * sw + sx] = s / ((y1 - y0) * (x1 - x0));
    }
  }
}

/** Bilinear enlargement of a reduced plane: small pixel i is centred at full coordinate (i + 0.5)·f − 0.5. */
export function bilinearUp(width: number, height: number, f: number, sw: number, sh: number) {
  const xi0 = new Int32Array(width), xi1 = new Int32Array(width), xw = new Float64Array(width);
  for (let x = 0; x < width; x++) {
    let u = (x + 0.5) / f - 0.5;
    u = u < 0 ? 0 : u > sw - 1 ? sw - 1 : u;
    const i = Math.floor(u);
    xi0[x] = i; xi1[x] = Math.min(sw - 1, i + 1); xw[x] = u - i;
  }
  return {
    xi0, xi1, xw,
    row(y: number): { r0: number; r1: number; wy: number } {
      let v = (y + 0.5) / f - 0.5;
      v = v < 0 ? 0 : v > sh - 1 ? sh - 1 : v;
      const j = Math.floor(v);
      return { r0: j * sw, r1: Math.min(sh - 1, j + 1) * sw, wy: v - j };
    },
    at(small: Plane, r0: number, r1: number, wy: number, x: number): number {
      const a = small[r0 + xi0[x]!]!, b = small[r0 + xi1[x]!]!, c = small[r1 + xi0[x]!]!, d = small[r1 + xi1[x]!]!;
      const wx = xw[x]!;
      const top = a + (b - a) * wx, bot = c + (d - c) * wx;
      return top + (bot - top) * wy;
    },
  };
}
