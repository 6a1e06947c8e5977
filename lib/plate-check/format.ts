import { linearToSrgb } from "@/lib/plate-check/image";
import type { Rgb } from "@/lib/plate-check/schemas";

/*
 * Plain words and numbers for the plate check's page. Client-safe.
 */

/** How sure a finding is, in words (own bands). */
export function confidenceWord(c: number): string {
  return c >= 0.85 ? "sure" : c >= 0.6 ? "likely" : c >= 0.35 ? "unsure" : "a guess";
}

export function percent(v: number, digits = 1): string {
  return `${(v * 100).toFixed(digits)} %`;
}

/** A linear colour as a display hex (sRGB encoded, clipped). */
export function displayHex(rgb: Rgb): string {
  return `#${rgb.map((v) => Math.round(Math.min(1, Math.max(0, linearToSrgb(v))) * 255).toString(16).padStart(2, "0")).join("")}`;
}

export function fixed(v: number | null | undefined, digits = 4): string {
  return v === null || v === undefined || !Number.isFinite(v) ? "—" : v.toFixed(digits);
}

/** Decodes an overlay grid's base64 bytes. */
export function gridBytes(data: string): Uint8Array {
  const s = atob(data);
  const out = new Uint8Array(s.length);
  for (let i = 0; i < s.length; i++) out[i] = s.charCodeAt(i);
  return out;
}

/** A time the same on the server and in the browser (no locale or zone of either): "2026-03-04 10:28 UTC". */
export function utcTime(iso: string): string {
  return `${iso.slice(0, 10)} ${iso.slice(11, 16)} UTC`;
}
