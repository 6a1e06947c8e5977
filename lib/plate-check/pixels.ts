import "server-only";
import fs from "node:fs/promises";
import type { Still } from "@/db/schema";
import { AppError } from "@/lib/api/errors";
import { decodeStill } from "@/lib/lab/engine";
import { frameFromCodes } from "@/lib/plate-check/frame";
import type { PlateFrame } from "@/lib/plate-check/image";
import { variantPath } from "@/lib/stills/storage";

/*
 * The one place the plate check reads pixels: 8/16-bit sRGB-encoded images decoded by the lab's
 * decoder (stored values, ICC ignored). Stills in a linear colour space would come in through the
 * stills module's linear float reader and frameFromLinear(); until the tries can render them too,
 * assertCheckable() refuses them.
 */

/**
 * The check and its tries read sRGB-encoded stills only: the detectors' thresholds and the tries'
 * lab renders assume stored sRGB codes. OpenEXR and linear stills are refused in words until they
 * go through frameFromLinear() and the lab's colour-managed entry.
 */
export function assertCheckable(still: Pick<Still, "colourSpace">): void {
  if (still.colourSpace !== "srgb") {
    throw new AppError("unsupported_type", "The plate check reads sRGB-encoded stills (PNG, JPEG, TIFF, WebP). This still is in a linear or data colour space (for example OpenEXR), which the check cannot read yet.");
  }
}

/** The still's original file, exactly as stored. Its caller has checked who may read the still. */
export async function originalBytesOf(still: Pick<Still, "sha256">): Promise<Uint8Array> {
  try {
    return await fs.readFile(variantPath(still.sha256, "original"));
  } catch (cause) {
    throw new AppError("not_found", "The still's file is missing from storage.", { cause });
  }
}

/** A still's pixels as the check's two views (scene-linear and stored code values). */
export async function readStillLinear(still: Pick<Still, "sha256" | "colourSpace">, bytes?: Uint8Array): Promise<PlateFrame> {
  assertCheckable(still);
  const decoded = await decodeStill(bytes ?? (await originalBytesOf(still)));
  return frameFromCodes(decoded.codes, decoded.width, decoded.height, decoded.bits);
}
