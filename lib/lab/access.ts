import "server-only";
import fs from "node:fs/promises";
import path from "node:path";
import { z } from "zod";
import { AppError } from "@/lib/api/errors";
import type { SessionUser } from "@/lib/auth/roles";
import { env } from "@/lib/env";
import { LabInputError } from "@/lib/lab/engine";
import type { RecipeStep } from "@/lib/lab/recipe";
import { getStillForRead } from "@/lib/stills/queries";
import { variantPath } from "@/lib/stills/storage";

/*
 * Which stills the lab may read for a person, and where their original bytes are. The lab only
 * ever reads a stored still; it never writes to one.
 */

const uuid = z.string().uuid();

export type LabStill = { id: string; sha256: string; width: number; height: number; bitDepth: number };

/** The still if this person may read it; a malformed id is the same 404 as a missing one. */
export async function readableStill(user: SessionUser, id: string, field = "still"): Promise<LabStill> {
  if (!uuid.safeParse(id).success) throw new AppError("not_found", "No still at this address.", { fields: { [field]: "No such still." } });
  const s = await getStillForRead(user, id);
  return { id: s.id, sha256: s.sha256, width: s.width, height: s.height, bitDepth: s.bitDepth };
}

/** The original bytes exactly as uploaded. */
export async function originalBytes(still: LabStill): Promise<Uint8Array> {
  try {
    return await fs.readFile(variantPath(still.sha256, "original"));
  } catch (cause) {
    throw new AppError("not_found", "The still's file is missing from storage.", { cause });
  }
}

/**
 * Checks every still the recipe refers to (the grain step's denoised plate) before the run, so
 * a cached result never bypasses the check, and returns a loader for the engine.
 */
export async function denoisedLoader(user: SessionUser, steps: RecipeStep[]): Promise<(id: string) => Promise<Uint8Array>> {
  const allowed = new Map<string, LabStill>();
  for (const [i, step] of steps.entries()) {
    if (step.op !== "grain") continue;
    try {
      allowed.set(step.denoised, await readableStill(user, step.denoised));
    } catch (error) {
      if (error instanceof AppError && error.code === "not_found") {
        throw new AppError("validation_failed", `steps.${i}.denoised: no readable still with this id`, {
          fields: { [`steps.${i}.denoised`]: "No still you can read has this id." },
        });
      }
      throw error;
    }
  }
  return async (id) => {
    const s = allowed.get(id);
    if (!s) throw new LabInputError("the denoised still was not checked");
    return originalBytes(s);
  };
}

/** The on-disk result cache of the lab runner, inside the data folder. */
export function labCacheDir(): string {
  return path.resolve(env.PLATEROOM_DATA_DIR, "lab-cache");
}
