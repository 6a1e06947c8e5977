import "server-only";
import fs from "node:fs/promises";
import type { Still } from "@/db/schema";
import { AppError } from "@/lib/api/errors";
import { decodeStill } from "@/lib/lab/engine";
import { frameFromCodes, frameFromLinear } from "@/lib/plate-check/frame";
import type { PlateFrame } from "@/lib/plate-check/image";
import { variantPath } from "@/lib/stills/storage";
import { readStillLinear as readLinearValues, type StillSource } from "@/lib/stills/values";

/*
 * The one place the plate check reads pixels. Two ways in:
 * - 8/16-bit sRGB-encoded PNG, JPEG, TIFF and WebP: the lab's decoder (stored codes, ICC
 *   ignored), decoded to linear through exact tables;
 * - everything else a still can be (OpenEXR, float TIFF, stills declared in a linear space): the
 *   stills module's linear float reader (lib/stills/values.ts), in the still's own linear space
 *   (its primaries kept, so the screen's mean and hue are in that space).
 * Stills declared as data (not light) are refused: a screen colour or grain has no meaning there.
 */

export type CheckSource = Pick<Still, "sha256" | "colourSpace"> & Partial<Pick<Still, "format" | "bitDepth" | "channels" | "exr">>;

/** True when the still goes through the lab's code-table decoder (8/16-bit sRGB-encoded, not OpenEXR). */
export function isCodedSrgb(still: CheckSource): boolean {
  return still.colourSpace === "srgb" && still.format !== "exr" && (still.bitDepth ?? 8) <= 16;
}

/** Refuses, in words, the one kind of still the check cannot read as light. */
export function assertCheckable(still: Pick<Still, "colourSpace">): void {
  if (still.colourSpace === "data") {
    throw new AppError("unsupported_type", "This still is declared as data (stored values, not colour), so there is no screen colour or grain to measure. If it is a picture, set its colour space on the still's page and check it again.");
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

/**
 * A still's pixels as the check's two views (linear light and stored values). `bytes` (the
 * original, already read) is used by the coded path; the float path reads through the stills
 * module, from `root` when given (benchmarks and tests).
 */
export async function readStillLinear(still: CheckSource, bytes?: Uint8Array, options: { root?: string } = {}): Promise<PlateFrame> {
  assertCheckable(still);
  if (isCodedSrgb(still)) {
    const decoded = await decodeStill(bytes ?? (await originalBytesOf(still)));
    return frameFromCodes(decoded.codes, decoded.width, decoded.height, decoded.bits);
  }
  const source: StillSource = { sha256: still.sha256, colourSpace: still.colourSpace, format: still.format ?? "exr", bitDepth: still.bitDepth ?? 32, channels: still.channels ?? 3, exr: still.exr ?? null };
  const values = await readLinearValues(source, options);
  const integer = still.format !== "exr" && (still.bitDepth === 8 || still.bitDepth === 16) ? still.bitDepth : undefined;
  return frameFromLinear(values.data, values.width, values.height, { transfer: still.colourSpace === "srgb" ? "srgb" : "linear", bits: integer });
}
