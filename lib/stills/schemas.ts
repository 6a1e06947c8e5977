import { z } from "zod";

/** Client-safe shapes of the stills API (shared/API.md, "POST /api/stills"). */

const STILL_OWNERS = ["technique", "use", "trial"] as const;
export type StillOwner = (typeof STILL_OWNERS)[number];
const STILL_ROLES = ["before", "after", "reference"] as const;
export type StillRole = (typeof STILL_ROLES)[number];
export const STILL_VARIANTS = ["original", "preview", "thumb"] as const;
export type StillVariant = (typeof STILL_VARIANTS)[number];
export const STILL_FORMATS = ["png", "jpeg", "tiff", "webp"] as const;
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

export const pixelQuerySchema = z.object({
  x: z.coerce.number().int("x is a whole pixel.").min(0),
  y: z.coerce.number().int("y is a whole pixel.").min(0),
});

/** 201 answer of POST /api/stills. */
export type StillCreatedResponse = {
  id: string;
  width: number;
  height: number;
  format: StillFormat;
  bitDepth: number;
  sha256: string;
  channels: number;
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
  /** Largest code value: 255, 65535, or 1 for float TIFF. */
  max: number;
  /** Stored values per channel, in channel order (grey, grey+alpha, RGB, RGBA). */
  values: number[];
  /** values / max. */
  floats: number[];
};

/** URL of one served file of a still. */
export function stillUrl(id: string, variant: StillVariant = "preview"): string {
  return `/api/stills/${encodeURIComponent(id)}/${variant}`;
}
