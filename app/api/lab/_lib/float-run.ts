import "server-only";
import { applyStep, createLabState, decodeSource, LabInputError, type PixelSource } from "@/lib/lab/engine";
import type { LabColour } from "@/lib/stills/lab-source";
import type { FloatImage } from "@/lib/lab/analysis";
import type { LabSpace, RecipeStep, StepReport } from "@/lib/lab/recipe";

/*
 * The engine's decode-and-run without the encode, for plots and samples that need the float
 * values themselves (values outside 0..1 included). Mirrors lib/lab/engine.ts runRecipe, which
 * only answers encoded bytes; an engine export of the float result would replace this.
 */

export type FloatRun = {
  before: FloatImage;
  after: FloatImage | null;
  reports: StepReport[];
  sourceWidth: number;
  sourceHeight: number;
};

function toFloat(src: PixelSource, n: number): Float32Array {
  if (src.kind === "float") return src.data.slice(0, n * 3);
  const out = new Float32Array(n * 3);
  const { codes, lut } = src;
  for (let i = 0; i < out.length; i++) out[i] = lut[codes[i]!]!;
  return out;
}

export async function runToFloat(opts: {
  still: Uint8Array;
  steps: RecipeStep[];
  space: LabSpace;
  width?: number;
  loadStill: (id: string) => Promise<Uint8Array>;
  colour?: LabColour;
}): Promise<FloatRun> {
  const codes = await decodeSource(opts.still, opts.width, opts.space, opts.colour);
  const { width, height } = codes;
  const plate = codes.source;
  const before: FloatImage = { width, height, data: toFloat(plate, width * height) };
  const meta = { sourceWidth: codes.sourceWidth, sourceHeight: codes.sourceHeight };
  if (!opts.steps.length) return { before, after: null, reports: [], ...meta };
  let base: PixelSource = plate;
  const grainIndex = opts.steps.findIndex((s) => s.op === "grain");
  if (grainIndex >= 0) {
    const step = opts.steps[grainIndex] as Extract<RecipeStep, { op: "grain" }>;
    const den = await decodeSource(await opts.loadStill(step.denoised), opts.width, opts.space, opts.colour, step.denoised);
    if (den.width !== width || den.height !== height) {
      throw new LabInputError(`step ${grainIndex}: the denoised still is not the plate's size`, grainIndex);
    }
    base = den.source;
  }
  const state = createLabState({ width, height, plate, base, scale: codes.sourceWidth / width });
  const reports: StepReport[] = [];
  for (let i = 0; i < opts.steps.length; i++) {
    reports.push(applyStep(state, opts.steps[i]!, i));
    await new Promise<void>((resolve) => setImmediate(resolve));
  }
  return { before, after: { width, height, data: state.cur }, reports, ...meta };
}
