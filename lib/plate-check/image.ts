/*
 * The frame as the plate check's detectors see it. Client-safe and pure: no decoding here
 * (lib/plate-check/pixels.ts reads a still into this shape).
 *
 * Two views of the same pixels, RGB interleaved:
 * - `linear`: scene-linear light (colour statistics, screen colour, marker shades, the solver);
 * - `code`: the stored code values on a 0..1 scale (8/16-bit codes ÷ their maximum; for float
 *   stills in a linear colour space, the linear values themselves). Grain, dead pixels and
 *   clipping are properties of the stored values, so those detectors read this view.
 */

export type Channel = "r" | "g" | "b";
export const CHANNELS: readonly Channel[] = ["r", "g", "b"];

export type PlateFrame = {
  width: number;
  height: number;
  linear: Float32Array;
  code: Float32Array;
  /** Codes per unit of `code` (255, 65535; 1 for float stills): sigma × codeMax = sigma in code values. */
  codeMax: number;
  /** True when codes are integers with a hard ceiling (clipping is a stored code at the maximum). */
  hasCodeCeiling: boolean;
  /** Linear → code transfer for values that are not stored codes (block means, interpolated screens). */
  colourSpace: "srgb" | "linear";
};

/** A rectangle in full-resolution pixels. */
export type Box = { x: number; y: number; w: number; h: number };

/** HSV (hexcone) hue in degrees, A. R. Smith, "Color Gamut Transform Pairs", SIGGRAPH 1978. */
export function hueDegrees(r: number, g: number, b: number): number {
  const max = Math.max(r, g, b), min = Math.min(r, g, b), d = max - min;
  if (d <= 0) return 0;
  let h = max === r ? ((g - b) / d) % 6 : max === g ? (b - r) / d + 2 : (r - g) / d + 4;
  h *= 60;
  return h < 0 ? h + 360 : h;
}

/** HSV saturation (max − min) / max; 0 for black. */
export function saturation(r: number, g: number, b: number): number {
  const max = Math.max(r, g, b);
  return max > 0 ? (max - Math.min(r, g, b)) / max : 0;
}

/** Smallest signed difference between two hues, degrees in (−180, 180]. */
export function hueDelta(a: number, b: number): number {
  let d = (a - b) % 360;
  if (d > 180) d -= 360;
  if (d <= -180) d += 360;
  return d;
}

/** Relative luminance from linear RGB, ITU-R BT.709-6 item 3.2 weights. */
export function luminance709(r: number, g: number, b: number): number {
  return 0.2126 * r + 0.7152 * g + 0.0722 * b;
}

/** Angle in degrees between two RGB vectors (0 when one is zero). */
export function angleBetween(a: readonly number[], b: readonly number[]): number {
  const na = Math.hypot(a[0]!, a[1]!, a[2]!), nb = Math.hypot(b[0]!, b[1]!, b[2]!);
  if (na === 0 || nb === 0) return 0;
  const c = (a[0]! * b[0]! + a[1]! * b[1]! + a[2]! * b[2]!) / (na * nb);
  return (Math.acos(Math.max(-1, Math.min(1, c))) * 180) / Math.PI;
}

/** sRGB decode, IEC 61966-2-1:1999, extended to negative values by symmetry. */
export function srgbToLinear(v: number): number {
  const a = Math.abs(v);
  const l = a <= 0.04045 ? a / 12.92 : ((a + 0.055) / 1.055) ** 2.4;
  return v < 0 ? -l : l;
}

/** sRGB encode, IEC 61966-2-1:1999, extended to negative values by symmetry. */
export function linearToSrgb(l: number): number {
  const a = Math.abs(l);
  const v = a <= 0.0031308 ? a * 12.92 : 1.055 * a ** (1 / 2.4) - 0.055;
  return l < 0 ? -v : v;
}

/** code → linear for any value (not only stored codes), in the frame's colour space. */
export function codeToLinear(frame: Pick<PlateFrame, "colourSpace">, v: number): number {
  return frame.colourSpace === "srgb" ? srgbToLinear(v) : v;
}

export function linearToCode(frame: Pick<PlateFrame, "colourSpace">, l: number): number {
  return frame.colourSpace === "srgb" ? linearToSrgb(l) : l;
}

export const round = (v: number, digits = 4): number => {
  const k = 10 ** digits;
  return Math.round(v * k) / k;
};
