import "server-only";
import { LRUCache } from "lru-cache";
import sharp from "sharp";
import { AppError } from "@/lib/api/errors";
import type { Still } from "@/db/schema";
import { PIXEL_LIMIT } from "@/lib/stills/inspect";
import type { PixelResponse } from "@/lib/stills/schemas";
import { variantPath } from "@/lib/stills/storage";
import { MEMORY_BUDGET } from "@/lib/memory/budget";

type Decoded = { data: Uint8Array | Uint16Array | Float32Array; width: number; height: number; channels: number; max: number };

/** Decoded originals kept for the pixel probe, bounded by bytes (a 4K 16-bit RGB frame is ~53 MB). */
const cache = new LRUCache<string, Decoded>({
  maxSize: MEMORY_BUDGET.stillPixels,
  sizeCalculation: (v) => Math.max(1, v.data.byteLength),
});

/**
 * Stored code values exactly: `ignoreIcc` so an embedded profile does not change them, and
 * the 16-bit / grey spaces kept (sharp otherwise converts to 8-bit sRGB; shared/LAB-NOTES.md).
 */
async function decode(still: Pick<Still, "sha256" | "bitDepth" | "channels">, root?: string): Promise<Decoded> {
  const key = `${root ?? ""}:${still.sha256}`;
  const hit = cache.get(key);
  if (hit) return hit;
  const grey = still.channels <= 2;
  let pipeline = sharp(variantPath(still.sha256, "original", root), { ignoreIcc: true, limitInputPixels: PIXEL_LIMIT });
  let depth: "uchar" | "ushort" | "float" = "uchar";
  if (still.bitDepth === 16) {
    pipeline = pipeline.toColourspace(grey ? "grey16" : "rgb16");
    depth = "ushort";
  } else if (still.bitDepth === 32) {
    pipeline = pipeline.toColourspace("scrgb");
    depth = "float";
  } else if (grey) {
    pipeline = pipeline.toColourspace("b-w");
  }
  const { data, info } = await pipeline.raw({ depth }).toBuffer({ resolveWithObject: true });
  const view =
    depth === "ushort"
      ? new Uint16Array(data.buffer, data.byteOffset, data.byteLength / 2)
      : depth === "float"
        ? new Float32Array(data.buffer, data.byteOffset, data.byteLength / 4)
        : new Uint8Array(data.buffer, data.byteOffset, data.byteLength);
  const decoded: Decoded = { data: view, width: info.width, height: info.height, channels: info.channels, max: depth === "ushort" ? 65535 : depth === "float" ? 1 : 255 };
  cache.set(key, decoded);
  return decoded;
}

/** The stored value of every channel at (x, y), as code values and as 0..1. */
export async function readPixel(still: Still, x: number, y: number, options: { root?: string } = {}): Promise<PixelResponse> {
  if (x >= still.width || y >= still.height) throw new AppError("validation_failed", `The still is ${still.width}×${still.height}; (${x}, ${y}) is outside it.`);
  const d = await decode(still, options.root);
  const start = (y * d.width + x) * d.channels;
  const values = Array.from(d.data.subarray(start, start + d.channels));
  return { x, y, bitDepth: still.bitDepth, max: d.max, values, floats: values.map((v) => v / d.max) };
}
