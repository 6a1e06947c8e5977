import "server-only";
import crypto from "node:crypto";
import sharp from "sharp";
import type { Still } from "@/db/schema";
import { DEFAULT_DISPLAY, displayCodes, type DisplayOptions } from "@/lib/colour/display";
import { defaultColourSpace } from "@/lib/stills/colour-default";
import { PIXEL_LIMIT } from "@/lib/stills/inspect";
import type { StillVariant } from "@/lib/stills/schemas";
import { exists, PREVIEW_MAX, THUMB_MAX, variantPath, writeFileAtomic } from "@/lib/stills/storage";
import { stillValues, type StillSource } from "@/lib/stills/values";

/*
 * What people see of a still. Stills a browser shows as stored (sRGB-encoded PNG, JPEG, WebP)
 * get sharp-made previews as before. Everything else — OpenEXR, TIFF, and any still declared
 * linear or as data — goes through the display transform (lib/colour/display.ts): previews,
 * thumbnails and a full-resolution `display` image at exposure 0 are made once and stored;
 * other exposures and the range view are rendered on request and not stored.
 */

type DerivedSource = Pick<Still, "sha256" | "format" | "bitDepth" | "colourSpace" | "exr"> & Partial<Pick<Still, "channels">>;

/** True when a browser draws the stored file as it should look (so "100 %" can load the original). */
export function browserShowsOriginal(still: Pick<Still, "format" | "colourSpace">): boolean {
  return still.colourSpace === "srgb" && (still.format === "png" || still.format === "jpeg" || still.format === "webp");
}

/**
 * The look of a still's derived files: "" when it is shown as its file implies (the format's
 * default colour space and, for OpenEXR, the default layer) — so derived files keep plain names —
 * else the declared space and a hash of the layer, so one original shown two ways has two sets.
 */
export function lookOf(still: Pick<Still, "format" | "bitDepth" | "colourSpace" | "exr">): string {
  const asFileImplies = still.colourSpace === defaultColourSpace(still) && (!still.exr || still.exr.layer === still.exr.defaultLayer);
  if (asFileImplies) return "";
  const layer = still.exr?.layer ? `-${crypto.createHash("sha256").update(still.exr.layer).digest("hex").slice(0, 10)}` : "";
  return `${still.colourSpace}${layer}`;
}

/** Stills whose previews go through the display transform (everything but sRGB-encoded PNG/JPEG/TIFF/WebP). */
function usesTransform(still: Pick<Still, "format" | "colourSpace">): boolean {
  return still.colourSpace !== "srgb" || still.format === "exr";
}

const SIZES: Record<Exclude<StillVariant, "original">, number> = { preview: PREVIEW_MAX, thumb: THUMB_MAX, display: 0 };

/** Encodes 8-bit RGB display codes at the variant's size: webp previews, PNG at full size. */
async function encodeDisplay(codes: Uint8Array, width: number, height: number, variant: Exclude<StillVariant, "original">): Promise<Buffer> {
  let img = sharp(codes, { raw: { width, height, channels: 3 } });
  if (variant === "display") return img.png({ compressionLevel: 3 }).toBuffer();
  const max = SIZES[variant];
  img = img.resize({ width: max, height: max, fit: "inside", withoutEnlargement: true });
  return img.webp({ quality: variant === "thumb" ? 80 : 90 }).toBuffer();
}

/** A derived image through the display transform with these options (nothing stored). */
export async function renderDisplay(still: StillSource, variant: Exclude<StillVariant, "original">, options: DisplayOptions, root?: string): Promise<Buffer> {
  if (!usesTransform(still) && options.exposure === 0 && options.view === "image") return sharpDerived(still, variant, root);
  const v = await stillValues(still, { root });
  const codes = displayCodes(v.data, v.channels, v.width * v.height, v.space, options);
  return encodeDisplay(codes, v.width, v.height, variant);
}

/** sharp's own preview of a still shown as stored (profile applied, 16 bits reduced to 8). */
async function sharpDerived(still: Pick<Still, "sha256">, variant: Exclude<StillVariant, "original">, root?: string): Promise<Buffer> {
  const img = sharp(variantPath(still.sha256, "original", root), { limitInputPixels: PIXEL_LIMIT });
  if (variant === "display") return img.toColourspace("srgb").png({ compressionLevel: 3 }).toBuffer();
  const max = SIZES[variant];
  return img.resize({ width: max, height: max, fit: "inside", withoutEnlargement: true }).webp({ quality: variant === "thumb" ? 80 : 90 }).toBuffer();
}

/**
 * Makes the stored preview and thumbnail (and, for stills a browser cannot show as stored, the
 * full-size display image) once; skipped when present. No metadata is written to any of them.
 */
export async function ensureDerived(still: DerivedSource, root?: string): Promise<void> {
  const look = lookOf(still);
  const variants: Exclude<StillVariant, "original">[] = browserShowsOriginal(still) ? ["preview", "thumb"] : ["preview", "thumb", "display"];
  const missing: typeof variants = [];
  for (const variant of variants) if (!(await exists(variantPath(still.sha256, variant, root, look)))) missing.push(variant);
  if (!missing.length) return;
  if (!usesTransform(still)) {
    for (const variant of missing) await writeFileAtomic(variantPath(still.sha256, variant, root, look), await sharpDerived(still, variant, root));
    return;
  }
  // One decode and one transform for all sizes.
  const v = await stillValues({ channels: 3, ...still }, { root });
  const codes = displayCodes(v.data, v.channels, v.width * v.height, v.space, DEFAULT_DISPLAY);
  for (const variant of missing) await writeFileAtomic(variantPath(still.sha256, variant, root, look), await encodeDisplay(codes, v.width, v.height, variant));
}

/** Path of a stored derived file for this still (made on demand by ensureDerived). */
export function derivedPath(still: DerivedSource, variant: Exclude<StillVariant, "original">, root?: string): string {
  return variantPath(still.sha256, variant, root, lookOf(still));
}
