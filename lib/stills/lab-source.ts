import "server-only";
import sharp from "sharp";
import { conversionMatrix, linearOf, PRIMARIES, type ColourSpace, type LinearSpace, type Mat3 } from "@/lib/colour/spaces";
import { decodeExr } from "@/lib/exr/decode";
import { encodeExr, type ExrOutput } from "@/lib/exr/encode";
import { isExr } from "@/lib/exr/header";
import { srgbDecodeExt } from "@/lib/lab/srgb";
import { exrError } from "@/lib/stills/exr";
import { PIXEL_LIMIT } from "@/lib/stills/inspect";

/*
 * The still lab's way in and out for colour-managed stills. The engine (lib/lab/engine.ts)
 * decodes sRGB-encoded PNG/JPEG/TIFF/WebP itself, through code tables; everything else comes
 * through here as interleaved RGB float32 in the working space:
 *   - OpenEXR (the still's chosen layer, lib/exr/decode.ts), values as stored;
 *   - stills declared linear or as data: code / max, no transfer function;
 *   - any still when the reader works in another linear space than the still's own: converted
 *     with the 3×3 matrix of lib/colour/spaces.ts.
 * On the way out, 8- and 16-bit encodes of linear results are converted to linear Rec.709 before
 * the engine's sRGB encode, and OpenEXR output carries the working space's chromaticities.
 */

export type StillColour = { format: string; colourSpace: ColourSpace; exrLayer: string | null };

/** What the lab knows about colour for one run: the stills it reads and the space picked to work in. */
export type LabColour = {
  plate: StillColour;
  /** Other stills the recipe reads (the grain step's denoised plate), by id. */
  others?: Record<string, StillColour>;
  /** A linear space the reader picked; null works in the still's own. */
  working: LinearSpace | null;
};

type Space = "linear" | "stored";

/** The space the lab's numbers are in, for a still and a run ("data" or stored values: none). */
export function workingSpace(still: StillColour, space: Space, working: LinearSpace | null): LinearSpace | null {
  if (space === "stored") return null;
  const own = linearOf(still.colourSpace);
  if (!own) return null;
  return working ?? own;
}

/** True when this still must come through decodeLabFloat rather than the engine's code tables. */
export function needsFloatDecode(still: StillColour, space: Space, working: LinearSpace | null): boolean {
  if (still.format === "exr") return true;
  if (space === "stored") return false;
  if (still.colourSpace !== "srgb") return true;
  return working !== null && working !== "lin-rec709";
}

/** Key part that tells runs of the same bytes with different colour handling apart. */
export function colourKey(still: StillColour, space: Space, working: LinearSpace | null): string {
  return `${still.colourSpace}|${still.exrLayer ?? ""}|${workingSpace(still, space, working) ?? "none"}`;
}

export type FloatDecoded = { width: number; height: number; sourceWidth: number; sourceHeight: number; data: Float32Array };

/** A still as RGB float32 in the working space, at `width` pixels wide (area-averaged) when narrower. */
export async function decodeLabFloat(bytes: Uint8Array, width: number | undefined, space: Space, still: StillColour, working: LinearSpace | null): Promise<FloatDecoded> {
  const rgb = isExr(bytes) ? exrRgb(bytes, still) : await codedRgb(bytes, space, still);
  const target = workingSpace(still, space, working);
  const own = space === "linear" ? linearOf(still.colourSpace) : null;
  if (own && target && own !== target) convertInPlace(rgb.data, conversionMatrix(own, target));
  const out = width && width < rgb.width ? downsample(rgb.data, rgb.width, rgb.height, width) : { data: rgb.data, width: rgb.width, height: rgb.height };
  return { width: out.width, height: out.height, sourceWidth: rgb.width, sourceHeight: rgb.height, data: out.data };
}

function exrRgb(bytes: Uint8Array, still: StillColour): { width: number; height: number; data: Float32Array } {
  let d;
  try {
    d = decodeExr(bytes, { layer: still.exrLayer, maxPixels: PIXEL_LIMIT });
  } catch (error) {
    throw exrError(error);
  }
  const n = d.width * d.height;
  const rgb = new Float32Array(n * 3);
  const srgb = still.colourSpace === "srgb";
  for (let p = 0, i = 0; p < n; p++, i += d.channels) {
    const grey = d.channels === 1;
    for (let k = 0; k < 3; k++) {
      const v = d.data[grey ? i : i + k]!;
      rgb[p * 3 + k] = srgb ? srgbDecodeExt(v) : v;
    }
  }
  return { width: d.width, height: d.height, data: rgb };
}

async function codedRgb(bytes: Uint8Array, space: Space, still: StillColour): Promise<{ width: number; height: number; data: Float32Array }> {
  const meta = await sharp(bytes, { ignoreIcc: true }).metadata();
  const grey = (meta.channels ?? 3) <= 2;
  let pipe = sharp(bytes, { ignoreIcc: true, limitInputPixels: PIXEL_LIMIT });
  let depth: "uchar" | "ushort" | "float" = "uchar";
  if (meta.depth === "ushort") {
    pipe = pipe.toColourspace(grey ? "grey16" : "rgb16");
    depth = "ushort";
  } else if (meta.depth === "float") {
    pipe = pipe.toColourspace("scrgb");
    depth = "float";
  }
  const { data, info } = await pipe.raw({ depth }).toBuffer({ resolveWithObject: true });
  const n = info.width * info.height, ch = info.channels;
  const decode = space === "linear" && still.colourSpace === "srgb";
  const samples =
    depth === "ushort" ? new Uint16Array(data.buffer, data.byteOffset, n * ch) : depth === "float" ? new Float32Array(data.buffer, data.byteOffset, n * ch) : new Uint8Array(data.buffer, data.byteOffset, n * ch);
  const max = depth === "ushort" ? 65535 : depth === "float" ? 1 : 255;
  const rgb = new Float32Array(n * 3);
  for (let p = 0, i = 0; p < n; p++, i += ch) {
    for (let k = 0; k < 3; k++) {
      const v = samples[ch <= 2 ? i : i + k]! / max;
      rgb[p * 3 + k] = decode ? srgbDecodeExt(v) : v;
    }
  }
  return { width: info.width, height: info.height, data: rgb };
}

function convertInPlace(a: Float32Array, m: Mat3): void {
  const [[m00, m01, m02], [m10, m11, m12], [m20, m21, m22]] = m;
  for (let i = 0; i < a.length; i += 3) {
    const r = a[i]!, g = a[i + 1]!, b = a[i + 2]!;
    a[i] = m00 * r + m01 * g + m02 * b;
    a[i + 1] = m10 * r + m11 * g + m12 * b;
    a[i + 2] = m20 * r + m21 * g + m22 * b;
  }
}

/** Area-average downsampling of interleaved RGB: each output pixel is the mean of the input area it covers. */
function downsample(src: Float32Array, w: number, h: number, outW: number): { data: Float32Array; width: number; height: number } {
  const outH = Math.max(1, Math.round((h * outW) / w));
  const sx = w / outW, sy = h / outH;
  const weights = (n: number, s: number, size: number) =>
    Array.from({ length: n }, (_, o) => {
      const a = o * s, b = Math.min(size, (o + 1) * s);
      const taps: [number, number][] = [];
      for (let i = Math.floor(a); i < Math.ceil(b); i++) taps.push([i, (Math.min(b, i + 1) - Math.max(a, i)) / s]);
      return taps;
    });
  const wx = weights(outW, sx, w), wy = weights(outH, sy, h);
  const rows = new Float32Array(outW * h * 3);
  for (let y = 0; y < h; y++) {
    for (let ox = 0; ox < outW; ox++) {
      let r = 0, g = 0, b = 0;
      for (const [x, f] of wx[ox]!) {
        const i = (y * w + x) * 3;
        r += src[i]! * f;
        g += src[i + 1]! * f;
        b += src[i + 2]! * f;
      }
      const o = (y * outW + ox) * 3;
      rows[o] = r;
      rows[o + 1] = g;
      rows[o + 2] = b;
    }
  }
  const out = new Float32Array(outW * outH * 3);
  for (let oy = 0; oy < outH; oy++) {
    for (const [y, f] of wy[oy]!) {
      const s = y * outW * 3, o = oy * outW * 3;
      for (let k = 0; k < outW * 3; k++) out[o + k]! += rows[s + k]! * f;
    }
  }
  return { data: out, width: outW, height: outH };
}

/** Matrix turning working-space values into linear Rec.709 for an 8/16-bit sRGB encode; null when none is needed. */
export function displayMatrix(working: LinearSpace | null): Mat3 | null {
  return working && working !== "lin-rec709" ? conversionMatrix(working, "lin-rec709") : null;
}

/** The lab's float result as an OpenEXR file, described by the working space's chromaticities. */
export function encodeLabExr(rgb: Float32Array, width: number, height: number, output: ExrOutput, working: LinearSpace | null): Promise<Uint8Array> {
  const p = working ? PRIMARIES[working] : null;
  return encodeExr(rgb, width, height, output, p ? { red: [...p.red], green: [...p.green], blue: [...p.blue], white: [...p.white] } : null);
}
