import "server-only";
import { eq, inArray, sql } from "drizzle-orm";
import { getDb, type Database } from "@/db/client";
import { shots, shows, uses } from "@/db/schema";
import { AppError } from "@/lib/api/errors";
import { assertCan } from "@/lib/auth/permissions";
import type { SessionUser } from "@/lib/auth/roles";
import { writeAudit } from "@/lib/audit/log";
import { csvRecordsToRows, planImport, readShotCsv, type ExistingShot, type ImportRow } from "@/lib/shots/csv";
import { MAX_IMPORT_ROWS, type ColumnMapping, type ImportRowError, type ImportShotsResponse } from "@/lib/shots/schemas";
import { reindexAll } from "@/lib/uses/mutations";

type Tx = Parameters<Parameters<Database["transaction"]>[0]>[0];

type ImportShotsRequest = {
  /** JSON items with the shot fields (code, sequence, description, frameStart, frameEnd, state). */
  rows?: Record<string, unknown>[];
  /** CSV text with a header row; `mapping` names the columns, else they are guessed from the headers. */
  csvText?: string;
  mapping?: ColumnMapping;
  /** Plan only: nothing is written, and the response carries the preview rows. */
  dryRun?: boolean;
};

const LOOKUP_CHUNK = 1000;
const WRITE_CHUNK = 500;

/**
 * Imports a shot list into a show (leads only). Every row is checked first (see planImport);
 * then all good rows are written in one transaction, upserting by code, and the bad rows are
 * reported with their row number. Unchanged shots are not rewritten, so importing the same
 * file twice changes nothing the second time.
 */
export async function importShots(actor: SessionUser, showCode: string, request: ImportShotsRequest): Promise<ImportShotsResponse> {
  assertCan(actor, "show:manage");
  const readErrors: ImportRowError[] = [];
  let rows: ImportRow[];
  if (request.csvText !== undefined) {
    const read = readShotCsv(request.csvText, request.mapping);
    if (read.fileErrors.length) {
      throw new AppError("validation_failed", read.fileErrors.join(" "), { fields: { mapping: read.fileErrors.join(" ") } });
    }
    readErrors.push(...read.errors);
    rows = csvRecordsToRows(read.rows);
  } else {
    rows = (request.rows ?? []).map((values, i) => ({ row: i + 1, values }));
  }
  if (rows.length + readErrors.length > MAX_IMPORT_ROWS) throw new AppError("too_large", `At most ${MAX_IMPORT_ROWS} shots per import.`);

  // Codes of existing shots the write changed, for the search update after the commit.
  let touchedCodes: string[] = [];
  const run = async (db: Tx | Database): Promise<ImportShotsResponse> => {
    const [show] = await db.select().from(shows).where(eq(shows.code, showCode.trim().toUpperCase())).limit(1);
    if (!show) throw new AppError("not_found", `No show ${showCode}`);
    const existing = await loadExisting(db, rows);
    const plan = planImport(rows, existing, show);
    const errors = [...readErrors, ...plan.errors].sort((a, b) => a.row - b.row);
    const counts = { created: plan.create.length, updated: plan.update.length, unchanged: plan.unchanged.length };
    if (request.dryRun) {
      return { dryRun: true, ...counts, errors, preview: { create: plan.create, update: plan.update, unchanged: plan.unchanged } };
    }
    const writes = [...plan.create, ...plan.update.map((u) => u.after)];
    for (let i = 0; i < writes.length; i += WRITE_CHUNK) {
      const batch = writes.slice(i, i + WRITE_CHUNK).map(({ row: _row, ...s }) => ({ ...s, showId: show.id }));
      await db
        .insert(shots)
        .values(batch)
        .onConflictDoUpdate({
          target: shots.code,
          set: {
            sequence: sql.raw("excluded.sequence"),
            description: sql.raw("excluded.description"),
            frameStart: sql.raw("excluded.frame_start"),
            frameEnd: sql.raw("excluded.frame_end"),
            state: sql.raw("excluded.state"),
            updatedAt: sql`now()`,
          },
          // A code that another show took meanwhile is never moved between shows.
          setWhere: sql`${shots.showId} = excluded.show_id`,
        });
    }
    if (writes.length) {
      await writeAudit(db, {
        actorId: actor.id,
        action: "shots.import",
        targetType: "show",
        targetId: show.id,
        detail: { ...counts, errors: errors.length },
      });
    }
    touchedCodes = plan.update.map((u) => u.code);
    return { dryRun: false, ...counts, errors };
  };

  // A dry run reads only; a real import plans and writes in one transaction, so a failure
  // part-way leaves no good row written and the plan cannot go stale before the write.
  if (request.dryRun) return run(getDb());
  const result = await getDb().transaction((tx) => run(tx));
  // New shots have no uses yet; changed ones may, and their techniques' documents are rebuilt.
  await reindexAll(await techniquesUsedOnShots(touchedCodes));
  return result;
}

/** Ids of the techniques logged on any of these shots. */
async function techniquesUsedOnShots(codes: readonly string[]): Promise<string[]> {
  const out = new Set<string>();
  for (let i = 0; i < codes.length; i += LOOKUP_CHUNK) {
    const rows = await getDb()
      .selectDistinct({ id: uses.techniqueId })
      .from(uses)
      .innerJoin(shots, eq(shots.id, uses.shotId))
      .where(inArray(shots.code, codes.slice(i, i + LOOKUP_CHUNK)));
    for (const r of rows) out.add(r.id);
  }
  return [...out];
}

/** The stored shots (of any show) whose codes appear in the rows, keyed by code. */
async function loadExisting(db: Tx | Database, rows: readonly ImportRow[]): Promise<Map<string, ExistingShot>> {
  // A code holding U+0000 cannot be stored (nor sent as a parameter): planImport refuses its row.
  const codes = [...new Set(rows.map((r) => (typeof r.values.code === "string" ? r.values.code.trim() : "")).filter((c) => c && !c.includes("\u0000")))];
  const out = new Map<string, ExistingShot>();
  for (let i = 0; i < codes.length; i += LOOKUP_CHUNK) {
    const found = await db
      .select({ shot: shots, showCode: shows.code })
      .from(shots)
      .innerJoin(shows, eq(shows.id, shots.showId))
      .where(inArray(shots.code, codes.slice(i, i + LOOKUP_CHUNK)));
    for (const { shot, showCode } of found) out.set(shot.code, { ...shot, showCode });
  }
  return out;
}

