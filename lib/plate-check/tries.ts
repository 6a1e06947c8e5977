import "server-only";
import type { Still } from "@/db/schema";
import { AppError } from "@/lib/api/errors";
import { decodeStill, LabInputError } from "@/lib/lab/engine";
import { recipeSchema, type LabFormat, type RecipeStep } from "@/lib/lab/recipe";
import { LabBusyError, LabTimeoutError, runLab, type LabRunOutput } from "@/lib/lab/runner";
import { fillRecipe } from "@/lib/plate-check/fill";
import { frameFromCodes } from "@/lib/plate-check/frame";
import { measureTry, type FloatFrame } from "@/lib/plate-check/measure";
import { originalBytesOf } from "@/lib/plate-check/pixels";
import { PROXY_WIDTH, type Findings, type TryResult } from "@/lib/plate-check/schemas";

/*
 * One technique tried on one frame: its recipe filled from the findings, rendered through the
 * lab's runner (its public entry point, runLab) as a proxy, and measured against the plate.
 */

function labError(error: unknown): never {
  if (error instanceof LabBusyError) throw new AppError("rate_limited", "The lab is busy. Try again in a moment.", { cause: error });
  if (error instanceof LabTimeoutError) throw new AppError("unavailable", `${error.message}.`);
  if (error instanceof LabInputError) throw new AppError("validation_failed", error.message);
  throw error;
}

/** A filled recipe rendered through the lab's runner: a proxy at PROXY_WIDTH, or the exact frame. */
export async function renderFilled(still: Pick<Still, "id" | "sha256">, recipe: RecipeStep[], format: LabFormat, exact: boolean, bytes?: Uint8Array): Promise<LabRunOutput> {
  try {
    return await runLab({
      stillBytes: bytes ?? (await originalBytesOf(still)),
      stillSha256: still.sha256,
      request: { still: still.id, space: "linear", format, steps: recipe, ...(exact ? {} : { width: PROXY_WIDTH }) },
    });
  } catch (error) {
    labError(error);
  }
}

/**
 * The plate at proxy size in linear light, as the runner sees it (an empty recipe rendered
 * 16-bit): the same resize the tries get, and it leaves the decoded proxy in the runner's cache
 * for their renders.
 */
export async function plateProxy(still: Pick<Still, "id" | "sha256">, bytes: Uint8Array): Promise<FloatFrame> {
  const out = await renderFilled(still, [], "png16", false, bytes);
  const d = await decodeStill(out.bytes);
  const f = frameFromCodes(d.codes, d.width, d.height, d.bits);
  return { width: f.width, height: f.height, data: f.linear };
}

export type TryInput = {
  still: Pick<Still, "id" | "sha256">;
  bytes: Uint8Array;
  /** The plate at proxy size, linear light. */
  before: FloatFrame;
  findings: Findings;
  recipe: RecipeStep[];
  slug: string;
  title: string;
  revision: number;
  isHouseMethod: boolean;
};

export async function tryRecipe(input: TryInput): Promise<TryResult> {
  const { still, bytes, before, findings } = input;
  const base = { slug: input.slug, title: input.title, revision: input.revision, isHouseMethod: input.isHouseMethod };
  const fill = fillRecipe(input.recipe, findings);
  const parsed = recipeSchema.safeParse(fill.recipe);
  if (fill.problem || !parsed.success) {
    const problem = fill.problem ?? "The values solved for this frame are outside what the lab accepts (the marker shades are too close to the screen's colour).";
    return { ...base, recipe: [], filled: fill.filled, skipped: fill.skipped, measures: null, problem };
  }
  const t0 = performance.now();
  // One proxy render, 16-bit: the measures are taken from it, and the page's preview is the same
  // render (kept in the runner's memory) encoded for display.
  const png16 = await renderFilled(still, parsed.data, "png16", false, bytes);
  const renderMs = performance.now() - t0;
  const d = await decodeStill(png16.bytes);
  const f = frameFromCodes(d.codes, d.width, d.height, d.bits);
  const m = measureTry(before, { width: f.width, height: f.height, data: f.linear }, findings, fill.targetChannel);
  return {
    ...base,
    recipe: parsed.data,
    filled: fill.filled,
    skipped: fill.skipped,
    problem: null,
    measures: {
      targetChannel: fill.targetChannel,
      markerContrast: m.markerContrast,
      noiseGain: m.noiseGain,
      matrixGain: fill.hide?.noiseGain ?? null,
      changedOutsideMatte: m.changedOutsideMatte,
      residualPerShade: fill.hide?.residualPerShade ?? [],
      proxyWidth: f.width,
      renderMs: Math.round(renderMs),
    },
  };
}
