import "server-only";
import type { Still } from "@/db/schema";
import { AppError } from "@/lib/api/errors";
import { decodeStill, LabInputError } from "@/lib/lab/engine";
import { recipeSchema, type LabFormat, type RecipeStep } from "@/lib/lab/recipe";
import { LabBusyError, LabTimeoutError, runLab, type LabRunOutput } from "@/lib/lab/runner";
import { decodeExr } from "@/lib/exr/decode";
import { labColour, type LabStill } from "@/lib/lab/access";
import { fillRecipe } from "@/lib/plate-check/fill";
import { frameFromCodes } from "@/lib/plate-check/frame";
import { measureTry, type FloatFrame } from "@/lib/plate-check/measure";
import { originalBytesOf } from "@/lib/plate-check/pixels";
import { PROXY_WIDTH, type Findings, type TryResult } from "@/lib/plate-check/schemas";
import type { LabColour } from "@/lib/stills/lab-source";
import { PIXEL_LIMIT } from "@/lib/stills/inspect";

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

/** What the tries need of a still: its content address and, for colour-managed stills, how its values are held. */
export type TryStill = Pick<Still, "id" | "sha256"> & Partial<Pick<Still, "format" | "colourSpace" | "exr" | "width" | "height" | "bitDepth">>;

/**
 * The lab's colour entry for the still (lib/lab/access.ts labColour): none for an sRGB-encoded
 * PNG/JPEG/TIFF/WebP (the engine decodes those itself); for OpenEXR and stills declared in a
 * linear space, the still's own linear space to work in, with the cache key that names it.
 */
function colourEntry(still: TryStill): { key: string; colour?: LabColour } {
  if (!still.format || !still.colourSpace) return { key: still.sha256 };
  const lab: LabStill = { id: still.id, sha256: still.sha256, width: still.width ?? 0, height: still.height ?? 0, bitDepth: still.bitDepth ?? 8, colour: { format: still.format, colourSpace: still.colourSpace, exrLayer: still.exr?.layer ?? null } };
  const { colour, key } = labColour(lab, "linear", undefined);
  return key === still.sha256 ? { key } : { key, colour };
}

/** A filled recipe rendered through the lab's runner: a proxy at PROXY_WIDTH, or the exact frame. */
export async function renderFilled(still: TryStill, recipe: RecipeStep[], format: LabFormat, exact: boolean, bytes?: Uint8Array): Promise<LabRunOutput> {
  const { key, colour } = colourEntry(still);
  try {
    return await runLab({
      stillBytes: bytes ?? (await originalBytesOf(still)),
      stillSha256: key,
      colour,
      request: { still: still.id, space: "linear", format, steps: recipe, ...(format === "exr" ? { exr: MEASURE_EXR } : {}), ...(exact ? {} : { width: PROXY_WIDTH }) },
    });
  } catch (error) {
    labError(error);
  }
}

/** Float renders for measuring (no rounding to half, no compression work). */
const MEASURE_EXR = { pixelType: "float", compression: "none" } as const;

/**
 * A proxy render as linear floats in the space the lab worked in. sRGB-encoded stills render as
 * 16-bit PNG (the runner encodes linear Rec.709 — their own space — with the sRGB curve, decoded
 * here by exact tables); colour-managed stills render as float OpenEXR in their own linear space,
 * never clipped, so the measures stay in the still's space and keep values above 1.
 */
async function renderMeasured(still: TryStill, recipe: RecipeStep[], bytes: Uint8Array): Promise<FloatFrame> {
  if (!colourEntry(still).colour) {
    const out = await renderFilled(still, recipe, "png16", false, bytes);
    const d = await decodeStill(out.bytes);
    const f = frameFromCodes(d.codes, d.width, d.height, d.bits);
    return { width: f.width, height: f.height, data: f.linear };
  }
  const out = await renderFilled(still, recipe, "exr", false, bytes);
  const d = decodeExr(out.bytes, { maxPixels: PIXEL_LIMIT });
  const n = d.width * d.height;
  const data = new Float32Array(n * 3);
  for (let p = 0, i = 0; p < n; p++, i += d.channels) {
    data[p * 3] = d.data[i]!;
    data[p * 3 + 1] = d.data[d.channels === 1 ? i : i + 1]!;
    data[p * 3 + 2] = d.data[d.channels === 1 ? i : i + 2]!;
  }
  return { width: d.width, height: d.height, data };
}

/**
 * The plate at proxy size in linear light, as the runner sees it (an empty recipe): the same
 * resize the tries get, and it leaves the decoded proxy in the runner's cache for their renders.
 */
export async function plateProxy(still: TryStill, bytes: Uint8Array): Promise<FloatFrame> {
  return renderMeasured(still, [], bytes);
}

export type TryInput = {
  still: TryStill;
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
  // One proxy render: the measures are taken from it, and the page's preview is the same
  // recipe rendered for display (kept in the runner's memory for sRGB-encoded stills).
  const f = await renderMeasured(still, parsed.data, bytes);
  const renderMs = performance.now() - t0;
  const m = measureTry(before, f, findings, fill.targetChannel);
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
