import "server-only";
import fs from "node:fs/promises";
import { LRUCache } from "lru-cache";
import { AppError } from "@/lib/api/errors";
import { decodeExr, type DecodedExr } from "@/lib/exr/decode";
import { ExrFormatError } from "@/lib/exr/header";
import { spaceOfChromaticities } from "@/lib/colour/spaces";
import { MEMORY_BUDGET } from "@/lib/memory/budget";
import type { StillExrInfo } from "@/lib/stills/schemas";
import { variantPath } from "@/lib/stills/storage";

/*
 * OpenEXR stills: decoding an upload or a stored original with its chosen layer, the errors
 * in the API's words, and a byte-capped cache of decoded samples (the pixel probe and the
 * display renders read the same still again and again).
 */

const cache = new LRUCache<string, DecodedExr>({
  maxSize: MEMORY_BUDGET.decodedExr,
  sizeCalculation: (d) => Math.max(1, d.data.byteLength),
});

function cacheKey(root: string | undefined, sha: string, layer: string | null | undefined): string {
  return `${root ?? ""}:${sha}:${layer ?? ""}`;
}

/** ExrFormatError → the API's 400 / 413 / 415. */
export function exrError(error: unknown): unknown {
  if (!(error instanceof ExrFormatError)) return error;
  if (error.problem === "too_large") return new AppError("too_large", error.message, { cause: error });
  if (error.problem === "unsupported") return new AppError("unsupported_type", error.message, { cause: error });
  return new AppError("validation_failed", `The OpenEXR file is damaged or incomplete: ${error.message}`, { cause: error, fields: { file: error.message } });
}

/** The facts kept about an OpenEXR still; its own colour space is what its chromaticities name (none: Rec.709, the OpenEXR default). */
export function toExrInfo(d: DecodedExr): StillExrInfo {
  const { compression, tiled, parts, dataWindow, displayWindow, layers, layer, defaultLayer, pixelType, chromaticities } = d.info;
  const defaultColourSpace = spaceOfChromaticities(chromaticities) ?? "lin-rec709";
  return { compression, tiled, parts, dataWindow, displayWindow, layers, layer, defaultLayer, defaultColourSpace, pixelType };
}

/**
 * Decodes every sample of an uploaded OpenEXR file (so a damaged file is refused now, not at
 * first view) and keeps the result for the derived images about to be made from it.
 */
export function decodeExrUpload(bytes: Uint8Array, options: { sha256?: string; layer?: string; maxPixels: number; root?: string }): DecodedExr {
  let decoded: DecodedExr;
  try {
    decoded = decodeExr(bytes, { layer: options.layer, maxPixels: options.maxPixels });
  } catch (error) {
    throw exrError(error);
  }
  if (options.sha256) cache.set(cacheKey(options.root, options.sha256, decoded.info.layer), decoded);
  return decoded;
}

/** The decoded samples of a stored OpenEXR still (its chosen layer), from the cache or the file. */
export async function readExrStill(still: { sha256: string; exr: { layer: string } | null }, options: { maxPixels: number; root?: string }): Promise<DecodedExr> {
  const layer = still.exr?.layer ?? null;
  const key = cacheKey(options.root, still.sha256, layer);
  const hit = cache.get(key);
  if (hit) return hit;
  let bytes: Buffer;
  try {
    bytes = await fs.readFile(variantPath(still.sha256, "original", options.root));
  } catch (cause) {
    throw new AppError("not_found", "The file of this still is missing.", { cause });
  }
  try {
    const decoded = decodeExr(bytes, { layer, maxPixels: options.maxPixels });
    cache.set(key, decoded);
    return decoded;
  } catch (error) {
    throw exrError(error);
  }
}
