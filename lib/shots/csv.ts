import Papa from "papaparse";
import { sequenceFromCode, shotRowSchema, SHOT_FIELD_LABELS, SHOT_FIELDS, type ColumnMapping, type ImportPlan, type ImportRowError, type PlannedShot, type ShotChange, type ShotField, type ShotState } from "@/lib/shots/schemas";
import { compileShotPattern, DEFAULT_SHOT_PATTERN } from "@/lib/shows/schemas";

/*
 * Shot lists as CSV: reading (with the lead's column mapping), planning an import against the
 * stored shots, and writing an export. Pure and client-safe, so the browser previews with the
 * very code the server runs. Every step is one pass over the rows: 10,000-row lists are normal.
 */

/**
 * One data record of the file. `row` counts data records the way the preview table shows them:
 * 1 is the first record under the header, blank lines are not counted. `line` is the physical
 * line (header = line 1, blank lines counted) where the record starts, for a text editor.
 */
type CsvRecord = {
  row: number;
  line: number;
  raw: Record<string, string>;
  values: Partial<Record<ShotField, string>>;
};
type ReadShotCsvResult = {
  headers: string[];
  /** The mapping that was applied: the one passed in, else a guess; null when no code column was found. */
  mapping: ColumnMapping | null;
  rows: CsvRecord[];
  /** Records that could not be read (unterminated quotes, more cells than headers). */
  errors: ImportRowError[];
  /** Problems with the file as a whole (no header row, a mapped column that is not there). */
  fileErrors: string[];
};

const normalise = (h: string) => h.toLowerCase().replace(/[^a-z0-9]/g, "");

/** Header spellings seen on shot lists, best first (common practice, no published source). */
const HEADER_SYNONYMS: Record<ShotField, string[]> = {
  code: ["shotcode", "shot", "shotname", "shotid", "code", "name"],
  sequence: ["sequence", "seq", "sequencecode", "sq"],
  frameStart: ["framestart", "startframe", "firstframe", "cutin", "frameIn", "in", "start", "first"],
  frameEnd: ["frameend", "endframe", "lastframe", "cutout", "frameout", "out", "end", "last"],
  state: ["state", "status", "prepstate", "paintstatus"],
  description: ["description", "desc", "action", "brief", "notes", "note", "comments", "comment", "summary"],
};

/** Maps each shot field to the first header that looks like it; null when no code column is recognisable. */
export function guessMapping(headers: readonly string[]): ColumnMapping | null {
  const byNorm = new Map<string, string>();
  for (const h of headers) if (!byNorm.has(normalise(h))) byNorm.set(normalise(h), h);
  const used = new Set<string>();
  const pick = (field: ShotField): string | null => {
    for (const syn of HEADER_SYNONYMS[field]) {
      const h = byNorm.get(normalise(syn));
      if (h !== undefined && !used.has(h)) {
        used.add(h);
        return h;
      }
    }
    return null;
  };
  const code = pick("code");
  if (code === null) return null;
  return {
    code,
    sequence: pick("sequence"),
    frameStart: pick("frameStart"),
    frameEnd: pick("frameEnd"),
    state: pick("state"),
    description: pick("description"),
  };
}

// Exports prefix cells that a spreadsheet would run as a formula with "'" (OWASP, "CSV Injection");
// reading undoes exactly that prefix so an export re-imports unchanged.
const FORMULA_START = /^[=+\-@\t\r]/;
const unescapeFormula = (v: string) => (v.startsWith("'") && FORMULA_START.test(v.slice(1)) ? v.slice(1) : v);

/**
 * Reads a shot list: a header row, then one shot per record. Accepts a UTF-8 BOM, quoted fields
 * holding commas, quotes or line breaks, CRLF/LF/CR line ends, and skips blank lines (also
 * lines of bare commas, which spreadsheets write for empty rows).
 */
export function readShotCsv(text: string, mapping?: ColumnMapping | null): ReadShotCsvResult {
  const body = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  const newline = body.includes("\n") ? "\n" : "\r";
  const records: { cells: string[]; line: number; error?: string }[] = [];
  let scanned = 0;
  let line = 1;
  let start = 0;
  // Step mode reports where each record ends; the next one starts there. Newlines are counted
  // incrementally from the previous start, so line numbers cost one pass over the text.
  Papa.parse<string[]>(body, {
    skipEmptyLines: false,
    step: (result) => {
      for (let i = body.indexOf(newline, scanned); i !== -1 && i < start; i = body.indexOf(newline, i + 1)) {
        line++;
        scanned = i + 1;
      }
      scanned = Math.max(scanned, start);
      const cells = result.data.map((c) => c ?? "");
      const isBlank = cells.every((c) => c.trim() === "");
      const error = result.errors[0]?.message;
      if (!isBlank || error) records.push({ cells, line, ...(error ? { error } : {}) });
      start = result.meta.cursor;
    },
  });

  const fileErrors: string[] = [];
  const errors: ImportRowError[] = [];
  const headerRecord = records.shift();
  if (!headerRecord) return { headers: [], mapping: null, rows: [], errors, fileErrors: ["The file has no header row."] };
  const headers = uniqueHeaders(headerRecord.cells.map((h) => h.trim()));

  const applied = mapping === undefined ? guessMapping(headers) : mapping;
  if (applied === null || !applied.code) {
    fileErrors.push("No column for the shot code was found; map one.");
  } else {
    for (const field of SHOT_FIELDS) {
      const h = applied[field];
      if (h && !headers.includes(h)) fileErrors.push(`${SHOT_FIELD_LABELS[field]}: the column "${h}" is not in the file.`);
    }
  }
  const columnOf = new Map<ShotField, number>();
  if (applied) for (const field of SHOT_FIELDS) {
    const h = applied[field];
    const idx = h ? headers.indexOf(h) : -1;
    if (idx >= 0) columnOf.set(field, idx);
  }

  const rows: CsvRecord[] = [];
  let row = 0;
  for (const rec of records) {
    row++;
    if (rec.error) {
      errors.push({ row, line: rec.line, message: `Could not read this row: ${rec.error}.` });
      continue;
    }
    const extra = rec.cells.slice(headers.length).some((c) => c.trim() !== "");
    if (extra) {
      errors.push({ row, line: rec.line, message: `This row has ${rec.cells.length} cells but the header has ${headers.length}.` });
      continue;
    }
    const raw: Record<string, string> = {};
    headers.forEach((h, i) => (raw[h] = unescapeFormula(rec.cells[i] ?? "")));
    const values: Partial<Record<ShotField, string>> = {};
    for (const [field, idx] of columnOf) values[field] = unescapeFormula(rec.cells[idx] ?? "");
    rows.push({ row, line: rec.line, raw, values });
  }
  return { headers, mapping: applied, rows, errors, fileErrors };
}

/** Repeated header names get " (2)", " (3)" so every column can be mapped on its own. */
function uniqueHeaders(headers: string[]): string[] {
  const seen = new Map<string, number>();
  return headers.map((h, i) => {
    const name = h === "" ? `Column ${i + 1}` : h;
    const n = (seen.get(name) ?? 0) + 1;
    seen.set(name, n);
    return n === 1 ? name : `${name} (${n})`;
  });
}

/** A row to plan: from a CSV record's mapped values, or one item of a JSON import. */
export type ImportRow = { row: number; line?: number; values: Record<string, unknown> };
/** What the plan needs to know about a stored shot. */
export type ExistingShot = {
  code: string;
  showCode: string;
  sequence: string;
  description: string;
  frameStart: number | null;
  frameEnd: number | null;
  state: ShotState;
};
type PlanShow = { code: string; shotPattern: string };

const VALUE_FIELDS = ["sequence", "description", "frameStart", "frameEnd", "state"] as const;

/**
 * Sorts rows into new, changed and unchanged shots, and rows that cannot be imported with the
 * reason: invalid values, codes that break the show's pattern, codes already used by another
 * show, a repeated code (later occurrences name the first row), a frame range that ends before
 * it starts. Blank values keep what is stored. One pass; lookups are by Map.
 */
export function planImport(rows: readonly ImportRow[], existingByCode: ReadonlyMap<string, ExistingShot>, show: PlanShow): ImportPlan {
  const plan: ImportPlan = { create: [], update: [], unchanged: [], errors: [] };
  const pattern = compileShotPattern(show.shotPattern, show.code);
  const firstRowOf = new Map<string, number>();

  for (const { row, line, values } of rows) {
    const at = line === undefined ? { row } : { row, line };
    const rawCode = typeof values.code === "string" ? values.code.trim() : "";
    if (rawCode) {
      const first = firstRowOf.get(rawCode);
      if (first !== undefined) {
        plan.errors.push({ ...at, code: rawCode, message: `${rawCode} appears more than once; first on row ${first}.` });
        continue;
      }
      firstRowOf.set(rawCode, row);
    }

    const parsed = shotRowSchema.safeParse(values);
    if (!parsed.success) {
      const issue = parsed.error.issues[0];
      const field = issue?.path[0];
      const label = typeof field === "string" && field in SHOT_FIELD_LABELS ? SHOT_FIELD_LABELS[field as ShotField] : "Row";
      plan.errors.push({ ...at, ...(rawCode ? { code: rawCode } : {}), message: `${label}: ${issue?.message ?? "invalid value"}` });
      continue;
    }
    const r = parsed.data;
    if (!pattern.test(r.code)) {
      plan.errors.push({ ...at, code: r.code, message: notAShotCode(r.code, show, existingByCode) });
      continue;
    }
    const existing = existingByCode.get(r.code);
    if (existing && existing.showCode !== show.code) {
      plan.errors.push({ ...at, code: r.code, message: `${r.code} already belongs to show ${existing.showCode}.` });
      continue;
    }

    const after: PlannedShot = existing
      ? {
          row,
          code: r.code,
          sequence: r.sequence ?? existing.sequence,
          description: r.description ?? existing.description,
          frameStart: r.frameStart ?? existing.frameStart,
          frameEnd: r.frameEnd ?? existing.frameEnd,
          state: r.state ?? existing.state,
        }
      : {
          row,
          code: r.code,
          sequence: r.sequence ?? sequenceFromCode(r.code, pattern),
          description: r.description ?? "",
          frameStart: r.frameStart ?? null,
          frameEnd: r.frameEnd ?? null,
          state: r.state ?? "waiting",
        };
    if (after.frameStart !== null && after.frameEnd !== null && after.frameStart > after.frameEnd) {
      plan.errors.push({ ...at, code: r.code, message: `Frame start ${after.frameStart} is after frame end ${after.frameEnd}.` });
      continue;
    }

    if (!existing) {
      plan.create.push(after);
      continue;
    }
    const changes: ShotChange["changes"] = {};
    const previous: ShotChange["previous"] = {};
    let changed = false;
    for (const f of VALUE_FIELDS) {
      if (after[f] !== existing[f]) {
        (changes as Record<string, unknown>)[f] = after[f];
        (previous as Record<string, unknown>)[f] = existing[f];
        changed = true;
      }
    }
    if (changed) plan.update.push({ row, code: r.code, changes, previous, after });
    else plan.unchanged.push({ row, code: r.code });
  }
  return plan;
}

/**
 * Why a code is not one of the show's shot codes, in words (never the pattern itself): the usual
 * SHOW_SEQ_SHOT form is spelled out; otherwise a code the show already has is the example.
 */
function notAShotCode(code: string, show: PlanShow, existingByCode: ReadonlyMap<string, ExistingShot>): string {
  const spelled = (p: string) => p.replaceAll("{CODE}", show.code);
  if (spelled(show.shotPattern) === spelled(DEFAULT_SHOT_PATTERN)) {
    return `${code} is not a shot code of ${show.code}: they look like ${show.code}_040_0120 (the show, a 3-digit sequence, a 4-digit shot, joined by underscores).`;
  }
  const example = [...existingByCode.values()].find((s) => s.showCode === show.code)?.code;
  return example
    ? `${code} is not written like the shot codes of ${show.code}, such as ${example}.`
    : `${code} is not written like the shot codes set for ${show.code}; a lead can see the rule on the show page.`;
}

/** Mapped CSV records as rows to plan. */
export function csvRecordsToRows(records: readonly CsvRecord[]): ImportRow[] {
  return records.map((r) => ({ row: r.row, line: r.line, values: r.values }));
}

const EXPORT_HEADERS = ["Shot", "Sequence", "Description", "Frame start", "Frame end", "State"] as const;
export type ExportableShot = {
  code: string;
  sequence: string;
  description: string;
  frameStart: number | null;
  frameEnd: number | null;
  state: ShotState;
};

/**
 * A show's shots as CSV (RFC 4180: CRLF line ends, fields quoted when needed), with headers
 * guessMapping recognises, so an export imports back unchanged.
 */
export function shotsToCsv(shots: readonly ExportableShot[]): string {
  return Papa.unparse(
    {
      fields: [...EXPORT_HEADERS],
      data: shots.map((s) => [s.code, s.sequence, s.description, s.frameStart ?? "", s.frameEnd ?? "", s.state]),
    },
    { newline: "\r\n", escapeFormulae: true },
  );
}
