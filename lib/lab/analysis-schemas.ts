import { z } from "zod";
import { labSpaceSchema, labWorkingSpaceSchema, recipeSchema } from "@/lib/lab/recipe";

/** Request and response shapes of the lab's plot and sample routes (client-safe: the lab UI shares them). */

const coord = z.number().refine(Number.isFinite, { message: "must be a finite number" }).refine((v) => Math.abs(v) <= 100_000, {
  message: "must be within the still",
});

export const labAnalyseRequestSchema = z.object({
  still: z.string().min(1).max(200),
  space: labSpaceSchema.default("linear"),
  workingSpace: labWorkingSpaceSchema.optional(),
  steps: recipeSchema.default([]),
  /** Full-resolution pixel coordinates of the line's ends; null for no profile. */
  line: z.object({ x0: coord, y0: coord, x1: coord, y1: coord }).nullable().default(null),
  histogram: z.boolean().default(false),
  bins: z.number().int().min(8).max(1024).default(128),
  /** Work on a copy resized to this width (plots need no more than the screen shows). */
  width: z.number().int().min(16).max(8192).optional(),
});
export type LabAnalyseRequest = z.input<typeof labAnalyseRequestSchema>;
export type LabAnalyseParsed = z.infer<typeof labAnalyseRequestSchema>;

const boxSchema = z.object({
  x: z.number().int().min(0).max(100_000),
  y: z.number().int().min(0).max(100_000),
  w: z.number().int().min(1).max(4096),
  h: z.number().int().min(1).max(4096),
});

export const labSampleRequestSchema = z.object({
  still: z.string().min(1).max(200),
  space: labSpaceSchema.default("linear"),
  workingSpace: labWorkingSpaceSchema.optional(),
  boxes: z.array(boxSchema).min(1).max(64),
});
export type LabSampleRequest = z.input<typeof labSampleRequestSchema>;
export type LabSampleParsed = z.infer<typeof labSampleRequestSchema>;

type LineProfileData = { t: number[]; x: number[]; y: number[]; r: number[]; g: number[]; b: number[] };
export type HistogramData = { edges: number[]; r: number[]; g: number[]; b: number[]; below: number[]; above: number[] };
export type AnalysisSide = { profile: LineProfileData | null; histogram: HistogramData | null };

export type LabAnalyseResponse = {
  width: number;
  height: number;
  sourceWidth: number;
  sourceHeight: number;
  /** Worked on a resized copy (`width`), with the proxy's approximate blurs. */
  approximate: boolean;
  before: AnalysisSide;
  /** Null when the request had no steps. */
  after: AnalysisSide | null;
};

export type LabSampleResponse = {
  /** Mean RGB float per box, in the request's space (stored or linear), in box order. */
  samples: [number, number, number][];
  /** Pixels averaged per box (after clipping the box to the still). */
  pixels: number[];
};
