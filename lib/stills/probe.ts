/** Client-safe helpers of the pixel probe (pure, unit-tested). */

export type ProbePoint = { u: number; v: number };

/** Channel names for a still's channel count (grey, grey+alpha, RGB, RGBA). */
export function channelLabels(channels: number): string[] {
  if (channels === 1) return ["Grey"];
  if (channels === 2) return ["Grey", "A"];
  if (channels === 3) return ["R", "G", "B"];
  return ["R", "G", "B", "A"];
}

/** The pixel under a relative position (0..1 across the image), clamped to the image. */
export function pixelAt(point: ProbePoint, width: number, height: number): { x: number; y: number } {
  const clamp = (v: number, n: number) => Math.min(n - 1, Math.max(0, Math.floor(v * n)));
  return { x: clamp(point.u, width), y: clamp(point.v, height) };
}

/** The centre of a pixel as a relative position, for typed coordinates. */
export function pointOf(x: number, y: number, width: number, height: number): ProbePoint {
  return { u: (x + 0.5) / width, v: (y + 0.5) / height };
}

/**
 * A canvas gives RGBA for every image; keep only the still's own channels (a grey still
 * decodes to R = G = B, so its grey value is R).
 */
export function valuesFromRgba(rgba: ArrayLike<number>, index: number, channels: number): number[] {
  const r = rgba[index] ?? 0;
  const g = rgba[index + 1] ?? 0;
  const b = rgba[index + 2] ?? 0;
  const a = rgba[index + 3] ?? 0;
  if (channels === 1) return [r];
  if (channels === 2) return [r, a];
  if (channels === 3) return [r, g, b];
  return [r, g, b, a];
}

/** A code value as a 0..1 float, printed with enough digits to tell 16-bit steps apart. */
export function formatFloat(value: number, max: number): string {
  return (value / max).toFixed(max > 255 ? 6 : 4);
}

/**
 * A float sample with the digits that matter: up to 7 significant digits (float32 holds about
 * 7.2), exponent form for very large or very small magnitudes, so values above 1 and below 0
 * read as they are.
 */
export function formatSample(value: number): string {
  if (!Number.isFinite(value)) return String(value);
  if (value === 0) return Object.is(value, -0) ? "-0" : "0";
  const a = Math.abs(value);
  if (a >= 1e6 || a < 1e-4) return value.toExponential(5);
  return String(Number(value.toPrecision(7)));
}
