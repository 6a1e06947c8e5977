/*
 * Pixel kernels of the still lab: tight loops over Float32Array buffers. No sharp here, so the
 * tests can check each kernel against a reference on its own. Interleaved RGB for images,
 * single planes (width × height) for mattes and single channels.
 */

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
export function rampPlane(v: Float32Array, black: number, white: number): void {
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

function vanHerkRow(src: Float32Array, srcOff: number, stride: number, len: number, r: number, isMax: boolean,
  pad: Float32Array, g: Float32Array, h: Float32Array, dst: Float32Array): void {
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

/**
 * Grows (px > 0, dilation) or shrinks (px < 0, erosion) a plane in place by a square of side 2|px|+1.
 * The vertical pass runs over whole rows at once (van Herk on row vectors) so memory is read in order.
 */
export function morphPlane(plane: Float32Array, width: number, height: number, px: number): void {
  const r = Math.abs(px);
  if (r === 0) return;
  const isMax = px > 0;
  const k = 2 * r + 1;
  const maxLen = Math.max(width, height) + 2 * r + k;
  const pad = new Float32Array(maxLen), g = new Float32Array(maxLen), h = new Float32Array(maxLen);
  for (let y = 0; y < height; y++) vanHerkRow(plane, y * width, 1, width, r, isMax, pad, g, h, plane);

  // Vertical: padded row index p = y + r; blocks of k rows; g/h hold one row per padded row.
  const fill = isMax ? -Infinity : Infinity;
  const P = Math.ceil((height + 2 * r) / k) * k;
  const G = new Float32Array(P * width), H = new Float32Array(P * width);
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
// Gaussian blur of a plane, edges extended by copying the border pixel (as libvips does).
// Up to FIR_MAX_RADIUS: an exact sampled kernel truncated where it falls below 1/1000 of its
// peak (libvips' min_ampl 0.001). Beyond: box-reduce by f, blur the small plane, bilinear
// back up — O(1) per full-size pixel; tolerance stated in the tests.

export const FIR_MAX_RADIUS = 24;

export function gaussianKernel(sigma: number): Float64Array {
  const r = Math.max(1, Math.floor(sigma * Math.sqrt(-2 * Math.log(0.001))));
  const k = new Float64Array(2 * r + 1);
  let s = 0;
  for (let i = -r; i <= r; i++) { const v = Math.exp(-(i * i) / (2 * sigma * sigma)); k[i + r] = v; s += v; }
  for (let i = 0; i < k.length; i++) k[i] = k[i]! / s;
  return k;
}

function firBlur(plane: Float32Array, width: number, height: number, sigma: number, tmp: Float32Array): void {
  const k = gaussianKernel(sigma);
  const r = (k.length - 1) >> 1;
  const row = new Float64Array(width + 2 * r);
  // Horizontal into tmp.
  for (let y = 0; y < height; y++) {
    const o = y * width;
    const first = plane[o]!, last = plane[o + width - 1]!;
    for (let i = 0; i < r; i++) { row[i] = first; row[r + width + i] = last; }
    for (let x = 0; x < width; x++) row[r + x] = plane[o + x]!;
    for (let x = 0; x < width; x++) {
      let acc = 0;
      for (let t = 0; t < k.length; t++) acc += k[t]! * row[x + t]!;
      tmp[o + x] = acc;
    }
  }
  // Vertical back into plane, whole rows at a time so memory is read in order.
  const acc = new Float64Array(width);
  for (let y = 0; y < height; y++) {
    acc.fill(0);
    for (let t = -r; t <= r; t++) {
      let yy = y + t;
      yy = yy < 0 ? 0 : yy >= height ? height - 1 : yy;
      const w = k[t + r]!, o = yy * width;
      for (let x = 0; x < width; x++) acc[x] = acc[x]! + w * tmp[o + x]!;
    }
    const o = y * width;
    for (let x = 0; x < width; x++) plane[o + x] = acc[x]!;
  }
}

/** Gaussian blur of a plane in place; `tmp` is a scratch plane of the same size. */
export function blurPlane(plane: Float32Array, width: number, height: number, sigma: number, tmp: Float32Array): void {
  const r = Math.floor(sigma * Math.sqrt(-2 * Math.log(0.001)));
  if (r <= FIR_MAX_RADIUS) {
    firBlur(plane, width, height, sigma, tmp);
    return;
  }
  // Reduce by f so the small blur stays within the FIR range; the box (variance (f²−1)/12)
  // and the bilinear enlargement (about (f²−1)/6) are taken out of the small blur's sigma.
  const f = Math.max(2, Math.ceil(sigma / 4));
  const sw = Math.ceil(width / f), sh = Math.ceil(height / f);
  const small = new Float32Array(sw * sh);
  for (let sy = 0; sy < sh; sy++) {
    const y0 = sy * f, y1 = Math.min(height, y0 + f);
    for (let sx = 0; sx < sw; sx++) {
      const x0 = sx * f, x1 = Math.min(width, x0 + f);
      let s = 0;
      for (let y = y0; y < y1; y++) for (let x = x0, o = y * width; x < x1; x++) s += plane[o + x]!;
      small[sy * sw + sx] = s / ((y1 - y0) * (x1 - x0));
    }
  }
  const residual = sigma * sigma - (f * f - 1) / 12 - (f * f - 1) / 6;
  const ss = Math.max(0.5, Math.sqrt(Math.max(residual, 0)) / f);
  blurPlane(small, sw, sh, ss, new Float32Array(sw * sh));
  // Bilinear back to full size; small pixel i is centred at full coordinate (i + 0.5)·f − 0.5.
  const xi0 = new Int32Array(width), xi1 = new Int32Array(width), xw = new Float32Array(width);
  for (let x = 0; x < width; x++) {
    let u = (x + 0.5) / f - 0.5;
    u = u < 0 ? 0 : u > sw - 1 ? sw - 1 : u;
    const i = Math.floor(u);
    xi0[x] = i; xi1[x] = Math.min(sw - 1, i + 1); xw[x] = u - i;
  }
  void tmp;
  for (let y = 0; y < height; y++) {
    let v = (y + 0.5) / f - 0.5;
    v = v < 0 ? 0 : v > sh - 1 ? sh - 1 : v;
    const j = Math.floor(v), j1 = Math.min(sh - 1, j + 1), wy = v - j;
    const r0 = j * sw, r1 = j1 * sw, o = y * width;
    for (let x = 0; x < width; x++) {
      const a = small[r0 + xi0[x]!]!, b = small[r0 + xi1[x]!]!, c = small[r1 + xi0[x]!]!, d = small[r1 + xi1[x]!]!;
      const wx = xw[x]!;
      const top = a + (b - a) * wx, bot = c + (d - c) * wx;
      plane[o + x] = top + (bot - top) * wy;
    }
  }
}
