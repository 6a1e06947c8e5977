import "server-only";
import fs from "node:fs/promises";
import path from "node:path";
import { z } from "zod";
import { AppError } from "@/lib/api/errors";
import type { SessionUser } from "@/lib/auth/roles";
import { env } from "@/lib/env";
import { LabInputError } from "@/lib/lab/engine";
import type { LabSpace, RecipeStep } from "@/lib/lab/recipe";
import type { LinearSpace } from "@/lib/colour/spaces";
import { colourKey, type LabColour, type StillColour } from "@/lib/stills/lab-source";
import { getStillForRead } from "@/lib/stills/queries";
import { variantPath } from "@/lib/stills/storage";

/*
 * Which stills the lab may read for a person, and where their original bytes are. The lab only
 * ever reads a stored still; it never writes to one.
 */

const uuid = z.string().uuid();

export type LabStill = { id: string; sha256: string; width: number; height: number; bitDepth: number; colour: StillColour };

/** The still if this person may read it; a malformed id is the same 404 as a missing one. */
export async function readableStill(user: SessionUser, id: string, field = "still"): Promise<LabStill> {
  if (!uuid.safeParse(id).success) throw new AppError("not_found", "No still at this address.", { fields: { [field]: "No such still." } });
  const s = await getStillForRead(user, id);
  const colour: StillColour = { format: s.format, colourSpace: s.colourSpace, exrLayer: s.exr?.layer ?? null };
  return { id: s.id, sha256: s.sha256, width: s.width, height: s.height, bitDepth: s.bitDepth, colour };
}

/**
 * The colour side of a lab request: a still declared as data always runs on stored values;
 * the cache key names the colour handling beside the bytes' hash.
 */
export function labColour(still: LabStill, space: LabSpace, working: LinearSpace | undefined, others: LabStill[] = []): { space: LabSpace; colour: LabColour; key: string } {
  const effective: LabSpace = still.colour.colourSpace === "data" ? "stored" : space;
  const colour: LabColour = { plate: still.colour, others: Object.fromEntries(others.map((o) => [o.id, o.colour])), working: working ?? null };
  const plain = still.colour.format !== "exr" && still.colour.colourSpace === "srgb" && !working && !others.some((o) => o.colour.colourSpace !== "srgb" || o.colour.format === "exr");
  const key = plain ? still.sha256 : `${still.sha256}:${colourKey(still.colour, effective, colour.working)}:${others.map((o) => `${o.id}=${colourKey(o.colour, effective, colour.working)}`).join(",")}`;
  return { space: effective, colour, key };
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
export async function denoisedLoader(user: SessionUser, steps: RecipeStep[]): Promise<((id: string) => Promise<Uint8Array>) & { stills: LabStill[] }> {
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
  const load = async (id: string) => {
    const s = allowed.get(id);
    if (!s) throw new LabInputError("the denoised still was not checked");
    return originalBytes(s);
  };
  return Object.assign(load, { stills: [...allowed.values()] });
}

/** The on-disk result cache of the lab runner, inside the data folder. */
export function labCacheDir(): string {
  return path.resolve(env.PLATEROOM_DATA_DIR, "lab-cache");
}
