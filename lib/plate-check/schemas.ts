import { z } from "zod";
import type { RecipeStep } from "@/lib/lab/recipe";

/*
 * What the plate check reports, and the request bodies of its routes. Client-safe: the page,
 * the route handlers and the stored rows share these shapes.
 */

export type Rgb = [number, number, number];
export type BoxDto = { x: number; y: number; w: number; h: number };
export type ChannelName = "r" | "g" | "b";

/** A coarse overlay: `data` is base64 of width × height bytes, 0..255 share of each cell. */
export type OverlayGrid = { width: number; height: number; cell: number; data: string };

/** A problem tag a finding points to, with the measurement that made it. */
export type TagReason = { slug: string; because: string };

export type ScreenFinding = {
  present: boolean;
  confidence: number;
  summary: string;
  hue: number | null;
  kind: "green" | "cyan" | "blue" | "other" | null;
  /** Mean of the clean screen in the still's linear space. */
  meanLinear: Rgb | null;
  /** Share of the frame that is screen (clean screen plus the markers and dust on it), 0..1. */
  coverage: number;
  /** (P95 − P5) / P50 of block-mean luminance of the clean screen, per cent. */
  unevenness: number | null;
  /** Brightest and darkest screen block, relative to the median. */
  range: [number, number] | null;
  mask: OverlayGrid | null;
  tags: TagReason[];
};

export type MarkerItem = { x: number; y: number; box: BoxDto; shade: number; confidence: number };
export type MarkerShade = {
  index: number;
  count: number;
  /** The shade's colour at the screen's mean level, linear (what the solver samples). */
  colourLinear: Rgb;
  /** The screen around those markers, brought to the same level. */
  screenLinear: Rgb;
  /** Unit direction of (marker − screen) in linear RGB. */
  direction: Rgb;
};
export type MarkerFinding = {
  searched: boolean;
  summary: string;
  count: number;
  confidence: number;
  items: MarkerItem[];
  shades: MarkerShade[];
  tags: TagReason[];
};

export type DefectItem = { x: number; y: number; kind: "hot" | "dead" | "stuck"; channels: ChannelName[] };
export type DefectFinding = {
  summary: string;
  count: number;
  items: DefectItem[];
  truncated: boolean;
  /** Step from the neighbours that counts as a defect, code values on a 0..1 scale. */
  threshold: Rgb;
  confidence: number;
  tags: TagReason[];
};

export type SpeckItem = { kind: "dust" | "hair"; box: BoxDto; confidence: number };
export type DustFinding = {
  summary: string;
  dust: number;
  hairs: number;
  items: SpeckItem[];
  /** Share of the frame flat enough to search (clean screen or flat background). */
  searchedShare: number;
  confidence: number;
  tags: TagReason[];
};

export type NoiseFinding = {
  summary: string;
  /** Sigma per channel in code values on a 0..1 scale, and in codes of the stored depth. */
  sigma: Rgb;
  sigmaCodes: Rgb;
  codeMax: number;
  noisiest: ChannelName;
  /** Relative standard error of each sigma (0.01 = 1 %). */
  relativeError: Rgb;
  pixels: number;
  method: "flat-areas" | "whole-frame-median";
  confidence: number;
  tags: TagReason[];
};

export type ClippingFinding = {
  summary: string;
  clipped: Rgb;
  crushed: Rgb;
  clippedShare: number;
  crushedShare: number;
  /** True for integer stills (a hard ceiling); float stills count values ≥ 1 and ≤ 0. */
  hardCeiling: boolean;
  clippedMask: OverlayGrid | null;
  crushedMask: OverlayGrid | null;
  confidence: number;
  tags: TagReason[];
};

/** How the still's file stores its pixels: lossy coding changes what grain, defects and dust look like. */
export type CompressionFinding = {
  lossy: boolean;
  /** The format and coding, in words ("WebP, lossy VP8 coding"). */
  method: string;
  summary: string;
  confidence: number;
  tags: TagReason[];
};

export type Findings = {
  detectorVersion: number;
  width: number;
  height: number;
  /** How the check read the stored values: sRGB-encoded, or linear floats in the still's own space. */
  colourSpace: "srgb" | "linear";
  screen: ScreenFinding;
  markers: MarkerFinding;
  defects: DefectFinding;
  dust: DustFinding;
  noise: NoiseFinding;
  clipping: ClippingFinding;
  compression: CompressionFinding;
  /** Problem tags over all findings, strongest reason first. */
  problemTags: TagReason[];
  /** Plate tags the findings suggest (the screen's colour). */
  plateTags: string[];
  timings: Record<string, number>;
};

export type SuggestedMethod = {
  slug: string;
  title: string;
  summary: string;
  /** Problem tags of the findings this technique is tagged with. */
  problems: string[];
  isHouseMethod: boolean;
  hasRecipe: boolean;
};

/** One technique tried on the frame: the filled recipe and what it did. */
export type TryResult = {
  slug: string;
  title: string;
  revision: number;
  isHouseMethod: boolean;
  /** The technique's recipe with the frame's values filled in (what the render ran). */
  recipe: RecipeStep[];
  /** What was filled and from which finding, in plain words. */
  filled: string[];
  /** Steps left out, with the reason (e.g. a grain step: the frame has no denoised twin). */
  skipped: string[];
  measures: TryMeasures | null;
  /** Why it could not be tried, when it could not. */
  problem: string | null;
};

export type TryMeasures = {
  /** Channel the markers were hidden in (the screen's strongest channel). */
  targetChannel: ChannelName;
  /** Mean |marker − screen| in that channel over the detected markers, linear, before → after. */
  markerContrast: { before: number; after: number } | null;
  /** Noise after ÷ noise before in the target channel, over the pixels the recipe changed. */
  noiseGain: number | null;
  /** Solver's noise gain ‖row‖ of the hide matrix, when the recipe has one. */
  matrixGain: number | null;
  /** Share of pixels outside the marker matte that the recipe changed visibly. */
  changedOutsideMatte: number;
  /** Solver residual per marker shade (hide goal), linear. */
  residualPerShade: number[];
  proxyWidth: number;
  renderMs: number;
};

export type CheckDto = {
  stillId: string;
  findings: Findings;
  checkedAt: string;
  /** The stored findings came from an older detector version. */
  stale: boolean;
  suggestions: SuggestedMethod[];
  tries: TryResult[];
  /** The reader's own kept recipes on this still. */
  kept: KeptRecipeDto[];
};

export type KeptRecipeDto = { id: string; slug: string; title: string; revision: number; recipe: RecipeStep[]; note: string; createdAt: string };

/** An empty body is an empty object (POST without options). */
const orEmpty = <T extends z.ZodType>(schema: T) => z.preprocess((v) => v ?? {}, schema);

export const runCheckSchema = orEmpty(
  z.object({
    /** Re-run even when stored findings are current. */
    force: z.boolean().default(false),
  }),
);

export const tryRequestSchema = orEmpty(
  z.object({
    /** Technique slugs to try (at most three); absent = the best suggested methods that carry a recipe. */
    techniques: z.array(z.string().trim().min(1).max(200)).min(1).max(3, "Try at most three techniques at once.").optional(),
  }),
);

export const keepRequestSchema = orEmpty(
  z.object({
    note: z.string().trim().max(500).default(""),
  }),
);

export const proposeRequestSchema = z.object({
  changeNote: z.string().trim().min(1, "Say what the proposed values are for.").max(500),
});

export const renderQuerySchema = z.object({
  size: z.enum(["proxy", "exact"]).default("proxy"),
});

export const PROXY_WIDTH = 1024;
export const MAX_TRIES = 3;
