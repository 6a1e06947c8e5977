import { z } from "zod";
import { LINEAR_SPACES } from "@/lib/colour/spaces";

/*
 * The still lab's recipe: an ordered list of steps run in floating point on one still.
 * Client-safe (the editor's forms and the API handlers share it). `matrix` and `copy` are
 * fixed by the API contract; the other op names are our own.
 */

const finite = z.number().refine(Number.isFinite, { message: "must be a finite number" });
const coeff = finite.refine((v) => Math.abs(v) <= 100, { message: "must be between -100 and 100" });

const channelSchema = z.enum(["r", "g", "b"]);
export type Channel = z.infer<typeof channelSchema>;
export const CHANNEL_INDEX: Record<Channel, 0 | 1 | 2> = { r: 0, g: 1, b: 2 };

const vec3Schema = z.tuple([coeff, coeff, coeff]);
const matrix3Schema = z.tuple([vec3Schema, vec3Schema, vec3Schema]);

/** A rectangle in full-resolution pixels of the still (scaled for proxy renders). */
const rectSchema = z.object({
  x: z.number().int().min(0).max(100_000),
  y: z.number().int().min(0).max(100_000),
  w: z.number().int().min(1).max(100_000),
  h: z.number().int().min(1).max(100_000),
});
export type Rect = z.infer<typeof rectSchema>;

// Large enough for a screen estimate on a 4K plate, small enough to stay interactive.
const sigma = finite.refine((v) => v > 0 && v <= 200, { message: "sigma must be > 0 and ≤ 200 px" });

const matrixStepSchema = z.object({
  op: z.literal("matrix"),
  /** Row-major: row i makes output channel i (out = M · rgb + offset). */
  m: matrix3Schema,
  offset: vec3Schema.optional(),
});

const copyStepSchema = z.object({
  op: z.literal("copy"),
  from: channelSchema,
  to: channelSchema,
});

const levelStepSchema = z.object({
  op: z.literal("level"),
  /** Channel of the working image that gets the fitted gain (and offset). */
  channel: channelSchema,
  /**
   * Channel of the plate the recipe cleans that it must match: the denoised still when the recipe
   * restores grain (the steps before the grain step all run on it), else the plate.
   */
  ref: channelSchema,
  fit: z.enum(["gain", "gain+offset"]).default("gain+offset"),
  /** Fit over this rectangle; whole frame when absent. */
  rect: rectSchema.optional(),
});

const matteStepSchema = z.object({
  op: z.literal("matte"),
  /** A channel name, or a row of weights applied to R, G, B (e.g. the solver's matte row). */
  channel: z.union([channelSchema, vec3Schema]),
  /** "current": the working image; "plate": the plate the recipe cleans (the denoised still, if it restores grain). */
  source: z.enum(["current", "plate"]).default("current"),
  black: finite.refine((v) => Math.abs(v) <= 100, { message: "must be between -100 and 100" }),
  white: finite.refine((v) => Math.abs(v) <= 100, { message: "must be between -100 and 100" }),
});

const growStepSchema = z.object({
  op: z.literal("grow"),
  /** Pixels; negative shrinks. Square structuring element of side 2|N|+1. */
  px: z.number().int().min(-256).max(256),
});

const softenStepSchema = z.object({
  op: z.literal("soften"),
  sigma,
  target: z.union([z.literal("matte"), channelSchema]).default("matte"),
});

const mixStepSchema = z.object({
  op: z.literal("mix"),
  /** out = current × matte + plate × (1 − matte). */
  invert: z.boolean().default(false),
});

const flattenStepSchema = z.object({
  op: z.literal("flatten"),
  sigma,
  /** Screen colour the flattened screen should come out at. */
  color: vec3Schema,
  /** Which side of the matte is clean screen: "outside" = where the matte is 0. */
  weight: z.enum(["outside", "inside", "all"]).default("outside"),
});

const grainStepSchema = z.object({
  op: z.literal("grain"),
  /** Still id of the denoised plate; the recipe's earlier steps run on it. */
  denoised: z.string().min(1).max(200),
});

export const recipeStepSchema = z.discriminatedUnion("op", [
  matrixStepSchema,
  copyStepSchema,
  levelStepSchema,
  matteStepSchema,
  growStepSchema,
  softenStepSchema,
  mixStepSchema,
  flattenStepSchema,
  grainStepSchema,
]);

export type RecipeStep = z.infer<typeof recipeStepSchema>;
export type RecipeStepInput = z.input<typeof recipeStepSchema>;
export type MatrixStep = z.infer<typeof matrixStepSchema>;
export type RecipeOp = RecipeStep["op"];

export const RECIPE_OPS = [
  "matrix", "copy", "level", "matte", "grow", "soften", "mix", "flatten", "grain",
] as const satisfies readonly RecipeOp[];

export const MAX_STEPS = 64;

/** Steps plus the order rules: matte users need a matte before them; one grain step. */
export const recipeSchema = z
  .array(recipeStepSchema)
  .max(MAX_STEPS)
  .superRefine((steps, ctx) => {
    let hasMatte = false;
    let grainCount = 0;
    steps.forEach((step, i) => {
      const needsMatte =
        step.op === "grow" || step.op === "mix" || (step.op === "soften" && step.target === "matte");
      if (needsMatte && !hasMatte) {
        ctx.addIssue({ code: "custom", path: [i, "op"], message: `step ${i} (${step.op}) needs a matte step before it` });
      }
      if (step.op === "matte") hasMatte = true;
      if (step.op === "grain" && ++grainCount > 1) {
        ctx.addIssue({ code: "custom", path: [i, "op"], message: "a recipe restores grain at most once" });
      }
    });
  });
export type Recipe = z.infer<typeof recipeSchema>;

export const labSpaceSchema = z.enum(["linear", "stored"]);
/** "exr": the float result as OpenEXR (see `exr`), never clipped. */
const labFormatSchema = z.enum(["png16", "png", "webp", "exr"]);
/** A linear space to work in instead of the still's own (lib/colour/spaces.ts); only with space "linear". */
export const labWorkingSpaceSchema = z.enum(LINEAR_SPACES, { error: `Working space is one of ${LINEAR_SPACES.join(", ")}.` });
const labExrSchema = z.object({
  pixelType: z.enum(["half", "float"]).default("half"),
  compression: z.enum(["zip", "none"]).default("zip"),
});
export type LabSpace = z.infer<typeof labSpaceSchema>;
export type LabFormat = z.infer<typeof labFormatSchema>;

export const labRunRequestSchema = z.object({
  still: z.string().min(1).max(200),
  space: labSpaceSchema.default("linear"),
  format: labFormatSchema.default("png16"),
  steps: recipeSchema,
  /** Proxy render: resize to this width before running. Absent = exact full resolution. */
  width: z.number().int().min(16).max(8192).optional(),
  workingSpace: labWorkingSpaceSchema.optional(),
  exr: labExrSchema.optional(),
});
export type LabRunRequest = z.infer<typeof labRunRequestSchema>;
export type LabRunRequestInput = z.input<typeof labRunRequestSchema>;

const sampleSchema = z.tuple([finite, finite, finite]);

export const labSolveRequestSchema = z.object({
  markers: z.array(sampleSchema).min(1).max(64),
  screen: z.array(sampleSchema).min(1).max(64),
  goal: z.object({ kind: z.enum(["hide", "matte"]), channel: channelSchema }),
  /** Matte goal only: ridge weight when marker shades disagree. */
  ridge: z.number().min(0).max(1).optional(),
});
export type LabSolveRequest = z.infer<typeof labSolveRequestSchema>;

export type LabSolveResponse = {
  row: [number, number, number];
  matrix: [[number, number, number], [number, number, number], [number, number, number]];
  residual: number;
  perShade: number[];
  noiseGain: number;
};

/** What each step reports after a run (level fits carry their fitted values). */
export type StepReport =
  | { index: number; op: "level"; gain: number; offset: number; residual: number; samples: number }
  | { index: number; op: "matte"; coverage: number }
  /**
   * thin: pixels with less than 1 % of the kernel's weight on clean screen within reach (their
   * estimate topped up with the frame's mean screen colour); leftAsIs: pixels with a channel whose
   * screen estimate was not positive (left unchanged); screenMean: that mean colour.
   */
  | { index: number; op: "flatten"; thin: number; leftAsIs: number; screenMean: [number, number, number] }
  | { index: number; op: Exclude<RecipeOp, "level" | "matte" | "flatten"> };

export const IDENTITY3: [[number, number, number], [number, number, number], [number, number, number]] = [
  [1, 0, 0],
  [0, 1, 0],
  [0, 0, 1],
];

/** Stable JSON (sorted keys) so equal recipes hash equally whatever their key order. */
export function canonicalJson(value: unknown): string {
  if (Array.isArray(value)) return `[${value.map(canonicalJson).join(",")}]`;
  if (value !== null && typeof value === "object") {
    const entries = Object.entries(value as Record<string, unknown>)
      .filter(([, v]) => v !== undefined)
      .sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));
    return `{${entries.map(([k, v]) => `${JSON.stringify(k)}:${canonicalJson(v)}`).join(",")}}`;
  }
  return JSON.stringify(value);
}
