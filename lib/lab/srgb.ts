/*
 * sRGB transfer function, IEC 61966-2-1:1999. Client-safe.
 * Decode of stored 8/16-bit codes goes through exact lookup tables; encode uses the formula,
 * or (for quantising to a code) a threshold search that gives the same code as rounding it.
 */

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

export function srgbDecodeArray(a: Float32Array): Float32Array {
  for (let i = 0; i < a.length; i++) a[i] = srgbDecodeExt(a[i]!);
  return a;
}
export function srgbEncodeArray(a: Float32Array): Float32Array {
  for (let i = 0; i < a.length; i++) a[i] = srgbEncodeExt(a[i]!);
  return a;
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
 * A uniform grid over [0, 1] gives the starting code; the encode slope is at most 12.92,
 * so a grid of 2^20 cells is at most one code off and one or two compares settle it.
 */
export type Quantiser = { bits: 8 | 16; max: number; thresholds: Float64Array; start: Uint16Array; cells: number };

const quantCache = new Map<string, Quantiser>();

export function quantiser(bits: 8 | 16, linear: boolean): Quantiser {
  const key = `${bits}:${linear}`;
  const hit = quantCache.get(key);
  if (hit) return hit;
  const max = bits === 8 ? 255 : 65535;
  const thresholds = new Float64Array(max + 1);
  for (let k = 0; k < max; k++) thresholds[k] = linear ? srgbDecode((k + 0.5) / max) : (k + 0.5) / max;
  thresholds[max] = Infinity;
  const cells = bits === 8 ? 1 << 14 : 1 << 20;
  const start = new Uint16Array(cells + 1);
  let k = 0;
  for (let j = 0; j <= cells; j++) {
    const x = j / cells;
    while (thresholds[k]! <= x) k++;
    start[j] = k;
  }
  const q = { bits, max, thresholds, start, cells };
  quantCache.set(key, q);
  return q;
}

/** Writes codes for an interleaved float buffer, clipping to 0..1 (the only clip in a run). */
export function quantise(src: Float32Array, dst: Uint16Array | Uint8Array, q: Quantiser): void {
  const { thresholds, start, cells, max } = q;
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
    let k = start[(x * cells) | 0]!;
    // Cell start codes can only be too low (grid cells start at or below x).
    while (thresholds[k]! <= x) k++;
    dst[i] = k;
  }
}
