import "server-only";
import sharp from "sharp";
import type { Still } from "@/db/schema";
import { linearOf, type ColourSpace, type LinearSpace } from "@/lib/colour/spaces";
import { srgbDecodeExt } from "@/lib/lab/srgb";
import { readExrStill } from "@/lib/stills/exr";
import { PIXEL_LIMIT } from "@/lib/stills/inspect";
import { variantPath } from "@/lib/stills/storage";

/*
 * A still's samples as floats, whatever its format: the one place that knows how each stored
 * format and declared colour space turns into numbers.
 */

export type StillSource = Pick<Still, "sha256" | "format" | "bitDepth" | "channels" | "colourSpace" | "exr">;

export type StillValues = {
  width: number;
  height: number;
  /** 1 grey, 2 grey + alpha, 3 RGB, 4 RGBA. */
  channels: number;
  /**
   * Interleaved, top row first. Colour spaces: linear light of that space (sRGB-encoded values
   * decoded by IEC 61966-2-1, sign kept); "data": stored values scaled to 0..1 (float kept).
   * Alpha is always as stored. Never clipped.
   */
  data: Float32Array;
  space: ColourSpace;
};

/** Decoded samples of a stored still (OpenEXR through lib/stills/exr.ts, the rest through sharp). */
export async function stillValues(still: StillSource, options: { root?: string } = {}): Promise<StillValues> {
  const decodeColour = still.colourSpace === "srgb";
  if (still.format === "exr") {
    const d = await readExrStill(still, { maxPixels: PIXEL_LIMIT, root: options.root });
    let data = d.data;
    if (decodeColour) {
      // An OpenEXR declared sRGB-encoded (display-referred): decode its colour channels, not the cached samples.
      data = Float32Array.from(d.data);
      const colour = d.channels === 4 ? 3 : d.channels;
      for (let i = 0; i < data.length; i++) if (i % d.channels < colour) data[i] = srgbDecodeExt(data[i]!);
    }
    return { width: d.width, height: d.height, channels: d.channels, data, space: still.colourSpace };
  }
  const grey = still.channels <= 2;
  let pipeline = sharp(variantPath(still.sha256, "original", options.root), { ignoreIcc: true, limitInputPixels: PIXEL_LIMIT });
  let depth: "uchar" | "ushort" | "float" = "uchar";
  if (still.bitDepth === 16) {
    pipeline = pipeline.toColourspace(grey ? "grey16" : "rgb16");
    depth = "ushort";
  } else if (still.bitDepth === 32) {
    pipeline = pipeline.toColourspace("scrgb");
    depth = "float";
  } else if (grey) pipeline = pipeline.toColourspace("b-w");
  const { data, info } = await pipeline.raw({ depth }).toBuffer({ resolveWithObject: true });
  const channels = info.channels;
  const n = info.width * info.height * channels;
  const out = new Float32Array(n);
  const alphaAt = channels === 2 || channels === 4 ? channels - 1 : -1;
  if (depth === "float") {
    out.set(new Float32Array(data.buffer, data.byteOffset, n));
    if (decodeColour) for (let i = 0; i < n; i++) if (i % channels !== alphaAt) out[i] = srgbDecodeExt(out[i]!);
  } else {
    const max = depth === "ushort" ? 65535 : 255;
    const codes = depth === "ushort" ? new Uint16Array(data.buffer, data.byteOffset, n) : new Uint8Array(data.buffer, data.byteOffset, n);
    const lut = new Float32Array(max + 1);
    for (let k = 0; k <= max; k++) lut[k] = decodeColour ? srgbDecodeExt(k / max) : k / max;
    for (let i = 0; i < n; i++) out[i] = i % channels === alphaAt ? codes[i]! / max : lut[codes[i]!]!;
  }
  return { width: info.width, height: info.height, channels, data: out, space: still.colourSpace };
}

export type LinearStill = {
  width: number;
  height: number;
  /** Interleaved RGB (grey repeated, alpha dropped), top row first, linear light, never clipped. */
  data: Float32Array;
  /** The linear space of `data`; "data" when the still was declared not to hold colour (then: stored values / max). */
  space: LinearSpace | "data";
};

/**
 * A still's pixels as linear float RGB plus the space they are in — for anything that measures
 * plates (sRGB-encoded stills come back decoded to linear Rec.709).
 */
export async function readStillLinear(still: StillSource, options: { root?: string } = {}): Promise<LinearStill> {
  const v = await stillValues(still, options);
  const n = v.width * v.height;
  const rgb = new Float32Array(n * 3);
  for (let p = 0, i = 0; p < n; p++, i += v.channels) {
    const grey = v.channels <= 2;
    rgb[p * 3] = v.data[i]!;
    rgb[p * 3 + 1] = grey ? v.data[i]! : v.data[i + 1]!;
    rgb[p * 3 + 2] = grey ? v.data[i]! : v.data[i + 2]!;
  }
  return { width: v.width, height: v.height, data: rgb, space: linearOf(v.space) ?? "data" };
}
