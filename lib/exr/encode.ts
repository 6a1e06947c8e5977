import "server-only";
import { DataTexture, FloatType, HalfFloatType, RGBAFormat } from "three";
import { EXRExporter, NO_COMPRESSION, PIZ_COMPRESSION, ZIP_COMPRESSION } from "three/examples/jsm/exporters/EXRExporter.js";
import type { Chromaticities } from "@/lib/exr/header";
import { rewriteAttributes } from "@/lib/exr/rewrite";
import { attr } from "@/lib/exr/write";

/*
 * OpenEXR writing with the `three` package's EXRExporter (examples/jsm/exporters): scan lines,
 * R, G, B and A (A = 1), half or float, ZIP or no compression. Two things are done around it:
 *   - its float → half conversion truncates; values are rounded to the nearest half here
 *     first (round half to even, IEEE 754-2008 §4.3.1, as OpenEXR's own half(float) does), so
 *     its conversion is exact; beyond ±65504 (the largest half) values are clamped;
 *   - it writes no colour description: a chromaticities attribute is added to the header
 *     (lib/exr/rewrite.ts), so readers know the primaries and white of the values.
 * The exporter stores its input's rows bottom-up, so rows are given to it bottom row first.
 */

/** PIZ is there for benchmarks and tests; the lab offers ZIP or none. */
export type ExrOutput = { pixelType: "half" | "float"; compression: "zip" | "none" | "piz" };

const f32 = new Float32Array(1);
const u32 = new Uint32Array(f32.buffer);

/** float32 → binary16 bits, round to nearest, ties to even; clamped to ±65504. */
export function halfBits(value: number): number {
  f32[0] = Math.max(-65504, Math.min(65504, value));
  const x = u32[0]!;
  const sign = (x >>> 16) & 0x8000;
  const exp = (x >>> 23) & 0xff;
  let mant = x & 0x7fffff;
  if (exp === 0xff) return sign | 0x7c00 | (mant ? 0x200 : 0);
  const e = exp - 112; // rebias 127 → 15
  if (e <= 0) {
    if (e < -10) return sign;
    mant |= 0x800000;
    const shift = 14 - e;
    let h = mant >>> shift;
    const rem = mant & ((1 << shift) - 1), half = 1 << (shift - 1);
    if (rem > half || (rem === half && h & 1)) h++;
    return sign | h;
  }
  let h = (e << 10) | (mant >>> 13);
  const rem = mant & 0x1fff;
  if (rem > 0x1000 || (rem === 0x1000 && h & 1)) h++;
  return sign | h;
}

let halfValues: Float32Array | null = null;

/** The float32 value of every binary16 bit pattern (IEEE 754-2008 §3.4), made once. */
function halfTable(): Float32Array {
  if (!halfValues) {
    halfValues = new Float32Array(65536);
    for (let h = 0; h < 65536; h++) {
      const e = (h >> 10) & 0x1f, m = h & 0x3ff, sign = h & 0x8000 ? -1 : 1;
      halfValues[h] = sign * (e === 0 ? m * 2 ** -24 : e === 31 ? (m ? NaN : Infinity) : (1 + m / 1024) * 2 ** (e - 15));
    }
  }
  return halfValues;
}

/** Interleaved RGB floats (top row first) → an OpenEXR file. `chromaticities`: null for values that are not colour. */
export async function encodeExr(rgb: Float32Array, width: number, height: number, output: ExrOutput, chromaticities: Chromaticities | null): Promise<Uint8Array> {
  const n = width * height;
  const half = output.pixelType === "half";
  // Float input either way: for half output each value is already the nearest half, which the
  // exporter's own (truncating) conversion then keeps exactly.
  const data = new Float32Array(n * 4);
  const table = half ? halfTable() : null;
  for (let y = 0; y < height; y++) {
    const src = y * width * 3, dst = (height - 1 - y) * width * 4;
    for (let x = 0; x < width; x++) {
      const s = src + x * 3, d = dst + x * 4;
      if (table) {
        data[d] = table[halfBits(rgb[s]!)]!;
        data[d + 1] = table[halfBits(rgb[s + 1]!)]!;
        data[d + 2] = table[halfBits(rgb[s + 2]!)]!;
      } else {
        data[d] = rgb[s]!;
        data[d + 1] = rgb[s + 1]!;
        data[d + 2] = rgb[s + 2]!;
      }
      data[d + 3] = 1;
    }
  }
  const texture = new DataTexture(data, width, height, RGBAFormat, FloatType);
  const bytes = await new EXRExporter().parse(texture, {
    type: half ? HalfFloatType : FloatType,
    compression: output.compression === "zip" ? ZIP_COMPRESSION : output.compression === "piz" ? PIZ_COMPRESSION : NO_COMPRESSION,
  });
  if (!chromaticities) return bytes;
  return rewriteAttributes(bytes, (_part, attrs) => [...attrs.map((a) => a.bytes), attr.chromaticities(chromaticities)]);
}
