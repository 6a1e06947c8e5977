import { z } from "zod";

/* Shows: validation and answers shared by the server and the browser. Nothing here may import server-only code. */

export const SHOW_KINDS = ["feature", "series", "commercial", "other"] as const;
export const SHOW_STATES = ["active", "wrapped"] as const;
export type ShowKind = (typeof SHOW_KINDS)[number];
export type ShowState = (typeof SHOW_STATES)[number];

export const SHOW_KIND_LABELS: Record<ShowKind, string> = {
  feature: "Feature",
  series: "Series",
  commercial: "Commercial",
  other: "Other",
};
export const SHOW_STATE_LABELS: Record<ShowState, string> = {
  active: "Active",
  wrapped: "Wrapped",
};

/**
 * SHOW_SEQ_SHOT, e.g. SLM_040_0120 (common practice, no published source). `{CODE}` stands for
 * the show's code so a pattern survives being copied between shows.
 */
export const DEFAULT_SHOT_PATTERN = String.raw`^{CODE}_\d{3}_\d{4}$`;

/** Turns a show's stored pattern into a whole-string RegExp; throws SyntaxError when it does not compile. */
export function compileShotPattern(pattern: string, showCode: string): RegExp {
  const source = pattern.replaceAll("{CODE}", showCode.replace(/[.*+?^${}()|[\]\\]/g, "\\$&"));
  // Wrapping anchors a pattern a lead wrote without ^…$, so a code cannot merely contain a match.
  return new RegExp(`^(?:${source})$`);
}

export const showCodeSchema = z
  .string()
  .trim()
  .toUpperCase()
  .regex(/^[A-Z0-9]{2,8}$/, "Use 2 to 8 letters or digits, e.g. SLM.");

const shotPatternSchema = z
  .string()
  .trim()
  .min(1, "Enter a pattern.")
  .max(200)
  .refine(
    (p) => {
      try {
        compileShotPattern(p, "SHOW");
        return true;
      } catch {
        return false;
      }
    },
    { message: "This is not a valid regular expression." },
  );

export const showSchema = z.object({
  code: showCodeSchema,
  name: z.string().trim().min(1, "Enter a name.").max(120),
  kind: z.enum(SHOW_KINDS).default("feature"),
  state: z.enum(SHOW_STATES).default("active"),
  shotPattern: shotPatternSchema.default(DEFAULT_SHOT_PATTERN),
});
export const createShowSchema = showSchema;
export type CreateShowInput = z.infer<typeof createShowSchema>;
/** The code is part of every shot code, so it is fixed once the show exists. */
export const updateShowSchema = z
  .object({
    name: showSchema.shape.name.optional(),
    kind: z.enum(SHOW_KINDS).optional(),
    state: z.enum(SHOW_STATES).optional(),
    shotPattern: shotPatternSchema.optional(),
  })
  .refine((v) => Object.values(v).some((x) => x !== undefined), { message: "Nothing to change." });
export type UpdateShowInput = z.infer<typeof updateShowSchema>;

// ---- Response DTOs ----

export type ShowResponse = {
  id: string;
  code: string;
  name: string;
  kind: ShowKind;
  state: ShowState;
  shotPattern: string;
  shotCount: number;
  createdAt: string;
};
export type ShowsResponse = { items: ShowResponse[] };
