import { z } from "zod";

/*
 * Shows, shots and use logs: validation shared by the server and the browser (the import
 * preview runs the same rules client-side). Nothing here may import server-only code.
 */

export const SHOW_KINDS = ["feature", "series", "commercial", "other"] as const;
export const SHOW_STATES = ["active", "wrapped"] as const;
export const SHOT_STATES = ["waiting", "in_prep", "cleaned", "on_hold"] as const;
export const USE_OUTCOMES = ["clean", "touch-up", "failed"] as const;
export type ShowKind = (typeof SHOW_KINDS)[number];
export type ShowState = (typeof SHOW_STATES)[number];
export type ShotState = (typeof SHOT_STATES)[number];
export type UseOutcome = (typeof USE_OUTCOMES)[number];

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
export const SHOT_STATE_LABELS: Record<ShotState, string> = {
  waiting: "Waiting",
  in_prep: "In prep",
  cleaned: "Cleaned",
  on_hold: "On hold",
};
export const USE_OUTCOME_LABELS: Record<UseOutcome, string> = {
  clean: "Clean",
  "touch-up": "Needed touch-up",
  failed: "Failed",
};

/**
 * SHOW_SEQ_SHOT, e.g. SLM_040_0120 (common practice, no published source). `{CODE}` stands for
 * the show's code so a pattern survives being copied between shows.
 */
export const DEFAULT_SHOT_PATTERN = String.raw`^{CODE}_\d{3}_\d{4}$`;
export const SHOT_CODE_MAX = 64;
/** PostgreSQL `integer` upper bound; frame numbers are stored in that column. */
const FRAME_MAX = 2_147_483_647;

/** Turns a show's stored pattern into a whole-string RegExp; throws SyntaxError when it does not compile. */
export function compileShotPattern(pattern: string, showCode: string): RegExp {
  const source = pattern.replaceAll("{CODE}", showCode.replace(/[.*+?^${}()|[\]\\]/g, "\\$&"));
  // Wrapping anchors a pattern a lead wrote without ^…$, so a code cannot merely contain a match.
  return new RegExp(`^(?:${source})$`);
}

/**
 * The sequence part of a shot code: the pattern's named group `seq` if it has one, else the
 * middle of SHOW_SEQ_SHOT (everything between the first and last underscore).
 */
export function sequenceFromCode(code: string, pattern?: RegExp): string {
  const fromGroup = pattern?.exec(code)?.groups?.seq;
  if (fromGroup) return fromGroup;
  const parts = code.split("_");
  if (parts.length >= 3) return parts.slice(1, -1).join("_");
  return parts.length === 2 ? (parts[0] ?? "") : "";
}

export const showCodeSchema = z
  .string()
  .trim()
  .toUpperCase()
  .regex(/^[A-Z0-9]{2,8}$/, "Use 2 to 8 letters or digits, e.g. SLM.");

export const shotPatternSchema = z
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

export const shotCodeSchema = z
  .string()
  .trim()
  .min(1, "Enter a shot code.")
  .max(SHOT_CODE_MAX, `Shot codes are at most ${SHOT_CODE_MAX} characters.`)
  .refine((v) => !v.includes("\u0000"), "Shot codes may not contain NUL (U+0000) characters.");

/** An empty cell means "not given": imports never erase a value with a blank. */
const blankToUndefined = (v: unknown) => (v === null || (typeof v === "string" && v.trim() === "") ? undefined : v);

/** PostgreSQL text cannot hold U+0000: refused here, so the dry run reports what the import would refuse. */
const noNul = (v: string | undefined) => v === undefined || !v.includes("\u0000");
const NUL_MESSAGE = "No NUL (U+0000) characters allowed.";

const frameSchema = z.preprocess(
  (v) => {
    const b = blankToUndefined(v);
    return typeof b === "string" && /^\s*\d+\s*$/.test(b) ? Number(b) : b;
  },
  z
    .number({ message: "Frame numbers are whole numbers." })
    .int("Frame numbers are whole numbers.")
    .min(0, "Frame numbers are not negative.")
    .max(FRAME_MAX, "Frame number too large.")
    .optional(),
);

const shotStateInputSchema = z.preprocess(
  (v) => {
    const b = blankToUndefined(v);
    // Spreadsheets write "In prep" or "on-hold"; the stored values are snake_case.
    return typeof b === "string" ? b.trim().toLowerCase().replace(/[\s-]+/g, "_") : b;
  },
  z.enum(SHOT_STATES, { message: `State must be one of: ${SHOT_STATES.join(", ")}.` }).optional(),
);

/**
 * One shot as it arrives in an import (a CSV row after mapping, or a JSON item). Only `code`
 * is required; absent fields keep the stored value, or take defaults for new shots.
 */
export const shotRowSchema = z.object({
  code: z.preprocess((v) => (typeof v === "string" ? v.trim() : v), shotCodeSchema),
  sequence: z.preprocess(blankToUndefined, z.string().trim().max(SHOT_CODE_MAX).optional().refine(noNul, NUL_MESSAGE)),
  description: z.preprocess(
    blankToUndefined,
    z.string().trim().max(2000, "Description is too long.").optional().refine(noNul, NUL_MESSAGE),
  ),
  frameStart: frameSchema,
  frameEnd: frameSchema,
  state: shotStateInputSchema,
});
// The frame order is checked by planImport on the merged values, where a row may give one end only.
export type ShotRowInput = z.input<typeof shotRowSchema>;
export type ShotRow = z.output<typeof shotRowSchema>;

export const SHOT_FIELDS = ["code", "sequence", "description", "frameStart", "frameEnd", "state"] as const;
export type ShotField = (typeof SHOT_FIELDS)[number];
export const SHOT_FIELD_LABELS: Record<ShotField, string> = {
  code: "Shot code",
  sequence: "Sequence",
  description: "Description",
  frameStart: "Frame start",
  frameEnd: "Frame end",
  state: "State",
};

/** Which CSV header feeds which shot field; unmapped fields are left alone. */
export const columnMappingSchema = z.object({
  code: z.string().min(1, "Choose the column that holds the shot code."),
  sequence: z.string().min(1).nullish(),
  description: z.string().min(1).nullish(),
  frameStart: z.string().min(1).nullish(),
  frameEnd: z.string().min(1).nullish(),
  state: z.string().min(1).nullish(),
});
export type ColumnMapping = z.infer<typeof columnMappingSchema>;

export const MAX_IMPORT_ROWS = 20_000;
export const MAX_IMPORT_CSV_CHARS = 5_000_000;

/** JSON body of POST /api/shows/{code}/shots: a list of rows, or CSV text with its mapping. */
export const importShotsSchema = z
  .object({
    rows: z.array(z.record(z.string(), z.unknown())).max(MAX_IMPORT_ROWS, `At most ${MAX_IMPORT_ROWS} rows per import.`).optional(),
    csv: z.string().max(MAX_IMPORT_CSV_CHARS, "The CSV is too large.").optional(),
    mapping: columnMappingSchema.optional(),
    dryRun: z.boolean().default(false),
  })
  .refine((v) => (v.rows === undefined) !== (v.csv === undefined), { message: "Send either rows or csv." });
export type ImportShotsInput = z.infer<typeof importShotsSchema>;

export const listShotsQuerySchema = z.object({
  q: z.string().trim().max(100).optional(),
  limit: z.coerce.number().int().min(1).max(500).default(100),
  offset: z.coerce.number().int().min(0).default(0),
  format: z.enum(["json", "csv"]).default("json"),
});

export const shotSearchQuerySchema = z.object({
  q: z.string().trim().max(SHOT_CODE_MAX).default(""),
  limit: z.coerce.number().int().min(1).max(50).default(10),
});

const stillRef = z.string().uuid("Not a valid still id.").nullish();

/** Body of POST /api/techniques/{slug}/uses (shared/API.md). */
export const logUseSchema = z.object({
  shot: shotCodeSchema,
  outcome: z.enum(USE_OUTCOMES, { message: `Outcome must be one of: ${USE_OUTCOMES.join(", ")}.` }),
  note: z.string().trim().max(4000, "The note is too long.").default(""),
  beforeStill: stillRef,
  afterStill: stillRef,
});
export type LogUseInput = z.infer<typeof logUseSchema>;

/** PATCH /api/uses/{id}: any subset; a still set to null is detached. */
export const updateUseSchema = z
  .object({
    shot: shotCodeSchema.optional(),
    outcome: logUseSchema.shape.outcome.optional(),
    note: z.string().trim().max(4000, "The note is too long.").optional(),
    beforeStill: stillRef,
    afterStill: stillRef,
  })
  .refine((v) => Object.values(v).some((x) => x !== undefined), { message: "Nothing to change." });
export type UpdateUseInput = z.infer<typeof updateUseSchema>;

export const USE_SORTS = ["createdAt", "shot", "outcome", "user"] as const;
export const listUsesQuerySchema = z.object({
  sort: z.enum(USE_SORTS).default("createdAt"),
  dir: z.enum(["asc", "desc"]).default("desc"),
  outcome: z.enum(USE_OUTCOMES).optional(),
  show: showCodeSchema.optional(),
  /** Part of a shot code or note. */
  q: z.string().trim().max(100).optional(),
  limit: z.coerce.number().int().min(1).max(200).default(25),
  offset: z.coerce.number().int().min(0).default(0),
});
export type ListUsesQuery = z.infer<typeof listUsesQuerySchema>;

// ---- Response DTOs (shared by route handlers and client hooks) ----

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

export type ShotResponse = {
  id: string;
  code: string;
  showCode: string;
  sequence: string;
  description: string;
  frameStart: number | null;
  frameEnd: number | null;
  state: ShotState;
  createdAt: string;
  updatedAt: string;
};
export type ShotsResponse = { items: ShotResponse[]; total: number };
export type ShotSuggestion = { code: string; showCode: string; description: string };
export type ShotSearchResponse = { items: ShotSuggestion[] };

export type PersonRef = { id: string; name: string };
export type TechniqueRef = { id: string; slug: string; title: string; status: "draft" | "in_review" | "approved" | "retired" };

/** Shown on a shot that used a retired technique: "retired — see {replacement}". */
export type FollowUp = { note: string; replacement: { slug: string; title: string } | null };

export type ShotUseResponse = {
  id: string;
  technique: TechniqueRef;
  outcome: UseOutcome;
  note: string;
  user: PersonRef | null;
  beforeStill: string | null;
  afterStill: string | null;
  /** Alt text of the stills, for their thumbnails; a still the reader may not open is left out (id and alt null). */
  beforeStillAlt: string | null;
  afterStillAlt: string | null;
  revisionId: string | null;
  followUp: FollowUp | null;
  canEdit: boolean;
  createdAt: string;
  updatedAt: string;
};
export type ShotDetailResponse = ShotResponse & {
  show: { code: string; name: string; state: ShowState };
  uses: ShotUseResponse[];
};

export type UseResponse = {
  id: string;
  technique: TechniqueRef;
  shot: { code: string; showCode: string; sequence: string };
  outcome: UseOutcome;
  note: string;
  user: PersonRef | null;
  beforeStill: string | null;
  afterStill: string | null;
  revisionId: string | null;
  canEdit: boolean;
  createdAt: string;
  updatedAt: string;
};
export type OutcomeCounts = Record<UseOutcome, number> & { total: number };
export type TechniqueUsesResponse = { items: UseResponse[]; total: number; counts: OutcomeCounts };

export type FollowUpShot = {
  code: string;
  showCode: string;
  uses: number;
  lastOutcome: UseOutcome;
  lastUsedAt: string;
};

export type ImportRowError = { row: number; line?: number; code?: string; message: string };
export type PlannedShot = {
  row: number;
  code: string;
  sequence: string;
  description: string;
  frameStart: number | null;
  frameEnd: number | null;
  state: ShotState;
};
type ShotValues = Omit<PlannedShot, "row" | "code">;
/** An existing shot the import changes: new values in `changes`, the stored ones in `previous`. */
export type ShotChange = { row: number; code: string; changes: Partial<ShotValues>; previous: Partial<ShotValues>; after: PlannedShot };
export type ImportPlan = {
  create: PlannedShot[];
  update: ShotChange[];
  unchanged: { row: number; code: string }[];
  errors: ImportRowError[];
};
export type ImportShotsResponse = {
  dryRun: boolean;
  created: number;
  updated: number;
  unchanged: number;
  errors: ImportRowError[];
  /** Only on a dry run: the rows behind each count, for the preview table. */
  preview?: Omit<ImportPlan, "errors">;
};
