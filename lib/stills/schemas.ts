import { z } from "zod";
import { DISPLAY_VIEWS, EXPOSURE_LIMIT } from "@/lib/colour/display";
import { COLOUR_SPACES, type ColourSpace } from "@/lib/colour/spaces";

/** Client-safe shapes of the stills API (shared/API.md, "POST /api/stills"). */

const STILL_OWNERS = ["technique", "use", "trial"] as const;
export type StillOwner = (typeof STILL_OWNERS)[number];
const STILL_ROLES = ["before", "after", "reference"] as const;
export type StillRole = (typeof STILL_ROLES)[number];
/** `display`: the full-resolution image through the display transform, for stills a browser cannot show as stored. */
export const STILL_VARIANTS = ["original", "preview", "thumb", "display"] as const;
export type StillVariant = (typeof STILL_VARIANTS)[number];
export const STILL_FORMATS = ["png", "jpeg", "tiff", "webp", "exr"] as const;
export type StillFormat = (typeof STILL_FORMATS)[number];

export const ALT_MAX = 300;

const optionalText = (max: number, label: string) =>
  z
    .string()
    .trim()
    .max(max, `Keep the ${label} under ${max} characters.`)
    .optional()
    .transform((v) => (v ? v : undefined));

const slug = z
  .string()
  .trim()
  .max(120)
  .regex(/^[a-z0-9]+(?:-[a-z0-9]+)*$/, "Not a valid technique address.");

/** The text fields that travel with an uploaded file (multipart form fields). */
export const stillFieldsSchema = z.object({
  alt: z
    .string({ error: "Describe the still for people who cannot see it (alt text)." })
    .trim()
    .min(1, "Describe the still for people who cannot see it (alt text).")
    .max(ALT_MAX, `Keep the alt text under ${ALT_MAX} characters.`),
  caption: optionalText(500, "caption"),
  credit: optionalText(200, "credit"),
  technique: slug.optional().or(z.literal("").transform(() => undefined)),
  role: z.enum(STILL_ROLES, { error: "Role is before, after or reference." }).default("reference"),
  owner: z.enum(STILL_OWNERS, { error: "Owner is technique, use or trial." }).optional(),
  /** Absent or "auto": the format's default (lib/stills/colour-default.ts). */
  colourSpace: z
    .enum([...COLOUR_SPACES, "auto"], { error: `Colour space is one of ${COLOUR_SPACES.join(", ")} (or auto).` })
    .optional()
    .transform((v) => (v === "auto" ? undefined : v)),
  /** OpenEXR only: the layer to show, as listed in `exr.layers` (default: RGB(A) of the default layer). */
  layer: z.string().max(600, "Layer names are shorter than that.").optional().transform((v) => (v ? v : undefined)),
});

export const createPairSchema = z
  .object({
    technique: slug,
    before: z.string().uuid("Pick the before still."),
    after: z.string().uuid("Pick the after still."),
    caption: optionalText(500, "caption"),
  })
  .refine((v) => v.before !== v.after, { message: "Before and after must be different stills.", path: ["after"] });
export type CreatePairInput = z.infer<typeof createPairSchema>;

/** Display options of the preview, thumb and display images: exposure in stops, and the view. */
export const displayQuerySchema = z.object({
  exposure: z.coerce
    .number({ error: "Exposure is a number of stops." })
    .min(-EXPOSURE_LIMIT, `Exposure is between -${EXPOSURE_LIMIT} and ${EXPOSURE_LIMIT} stops.`)
    .max(EXPOSURE_LIMIT, `Exposure is between -${EXPOSURE_LIMIT} and ${EXPOSURE_LIMIT} stops.`)
    .transform((v) => Math.round(v * 100) / 100)
    .default(0),
  view: z.enum(DISPLAY_VIEWS, { error: "View is image or range." }).default("image"),
});

export const PIXEL_BLOCK_MAX = 65536;
export const pixelQuerySchema = z.object({
  x: z.coerce.number().int("x is a whole pixel.").min(0),
  y: z.coerce.number().int("y is a whole pixel.").min(0),
  /** Optional block size: answers every value of a w × h block (at most 65 536 pixels). */
  w: z.coerce.number().int().min(1).max(PIXEL_BLOCK_MAX).optional(),
  h: z.coerce.number().int().min(1).max(PIXEL_BLOCK_MAX).optional(),
}).refine((q) => (q.w ?? 1) * (q.h ?? 1) <= PIXEL_BLOCK_MAX, { message: `Ask for at most ${PIXEL_BLOCK_MAX} pixels at once.`, path: ["w"] });

/** OpenEXR stills: the file's layout and the layer shown. */
export type StillExrInfo = {
  compression: string;
  tiled: boolean;
  parts: number;
  dataWindow: { xMin: number; yMin: number; xMax: number; yMax: number };
  displayWindow: { xMin: number; yMin: number; xMax: number; yMax: number };
  layers: { id: string; label: string; kind: string }[];
  layer: string;
  /** The layer shown when none is picked, and the colour space the file's chromaticities imply. */
  defaultLayer: string;
  defaultColourSpace: ColourSpace;
  pixelType: string;
};

/** 201 answer of POST /api/stills. */
export type StillCreatedResponse = {
  id: string;
  width: number;
  height: number;
  format: StillFormat;
  /** 8 or 16 for integer samples; 16 for half-float and 32 for float OpenEXR and TIFF. */
  bitDepth: number;
  sha256: string;
  channels: number;
  colourSpace: ColourSpace;
  pixelAspectRatio: number;
  exr: StillExrInfo | null;
};

/** A still as the interface shows it; never the storage path or the uploader's file name. */
export type StillResponse = StillCreatedResponse & {
  alt: string;
  caption: string;
  credit: string;
  role: StillRole;
  owner: StillOwner;
  techniqueId: string | null;
  uploaderId: string | null;
  sizeBytes: number;
  createdAt: string;
};

export type StillPairResponse = {
  id: string;
  techniqueId: string;
  /** Number of the revision the pair belongs to. */
  revision: number;
  caption: string;
  position: number;
  before: StillResponse;
  after: StillResponse;
};

export type PixelResponse = {
  x: number;
  y: number;
  bitDepth: number;
  /** Largest code value: 255, 65535, or 1 for float samples (float TIFF, OpenEXR). */
  max: number;
  /** Stored values per channel, in channel order (grey, grey+alpha, RGB, RGBA). */
  values: number[];
  /** values / max. */
  floats: number[];
  /** The still's declared colour space. */
  space: ColourSpace;
  /** The colour channels in linear light of that space (sRGB-encoded values decoded); null for "data". */
  linear: number[] | null;
};

/** GET /api/stills/{id}/pixel with w and h: a block of float values, row by row (stored values / max). */
export type PixelBlockResponse = { x: number; y: number; width: number; height: number; channels: number; space: ColourSpace; floats: number[] };

/** URL of one served file of a still. */
export function stillUrl(id: string, variant: StillVariant = "preview"): string {
  return `/api/stills/${encodeURIComponent(id)}/${variant}`;
}
