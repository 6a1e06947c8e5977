import { z } from "zod";
import type { ShowState } from "@/lib/shows/schemas";
import type { ShotUseResponse } from "@/lib/uses/schemas";

/*
 * Shots and shot list imports: validation shared by the server and the browser (the import
 * preview runs the same rules client-side). Nothing here may import server-only code.
 * Shows are in lib/shows, use logs in lib/uses.
 */

const SHOT_STATES = ["waiting", "in_prep", "cleaned", "on_hold"] as const;
export type ShotState = (typeof SHOT_STATES)[number];

export const SHOT_STATE_LABELS: Record<ShotState, string> = {
  waiting: "Waiting",
  in_prep: "In prep",
  cleaned: "Cleaned",
  on_hold: "On hold",
};
const SHOT_CODE_MAX = 64;
/** PostgreSQL `integer` upper bound; frame numbers are stored in that column. */
const FRAME_MAX = 2_147_483_647;

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

// ---- Response DTOs (shared by route handlers and client hooks) ----

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

export type ShotDetailResponse = ShotResponse & {
  show: { code: string; name: string; state: ShowState };
  uses: ShotUseResponse[];
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
