import "server-only";
import fs from "node:fs/promises";
import type { Still } from "@/db/schema";
import { AppError } from "@/lib/api/errors";
import { decodeStill } from "@/lib/lab/engine";
import { frameFromCodes } from "@/lib/plate-check/frame";
import type { PlateFrame } from "@/lib/plate-check/image";
import { variantPath } from "@/lib/stills/storage";

/*
 * The one place the plate check reads pixels. Today stills are 8/16-bit sRGB-encoded images
 * decoded by the lab's decoder (stored values, ICC ignored); when stills carry their own colour
 * space and OpenEXR input (issue 17), this function switches to the stills module's linear float
 * reader and nothing else in lib/plate-check changes: frameFromLinear() takes its floats.
 */

/** The still's original file, exactly as stored. Its caller has checked who may read the still. */
export async function originalBytesOf(still: Pick<Still, "sha256">): Promise<Uint8Array> {
  try {
    return await fs.readFile(variantPath(still.sha256, "original"));
  } catch (cause) {
    throw new AppError("not_found", "The still's file is missing from storage.", { cause });
  }
}

/** A still's pixels as the check's two views (scene-linear and stored code values). */
export async function readStillLinear(still: Pick<Still, "sha256">, bytes?: Uint8Array): Promise<PlateFrame> {
  const decoded = await decodeStill(bytes ?? (await originalBytesOf(still)));
  return frameFromCodes(decoded.codes, decoded.width, decoded.height, decoded.bits);
}
