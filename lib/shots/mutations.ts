import "server-only";
import { eq, inArray, sql } from "drizzle-orm";
import { getDb, type Database } from "@/db/client";
import { shots, shows, stills, uses } from "@/db/schema";
import { AppError } from "@/lib/api/errors";
import { assertCan, can } from "@/lib/auth/permissions";
import type { SessionUser } from "@/lib/auth/roles";
import { writeAudit } from "@/lib/audit/log";
import { csvRecordsToRows, planImport, readShotCsv, type ExistingShot, type ImportRow } from "@/lib/shots/csv";
import { findShotByCode, findStills, getShow, getUse, isUuid, requireShow } from "@/lib/shots/queries";
import {
  MAX_IMPORT_ROWS,
  type ColumnMapping,
  type CreateShowInput,
  type ImportRowError,
  type ImportShotsResponse,
  type LogUseInput,
  type ShowResponse,
  type UpdateShowInput,
  type UpdateUseInput,
  type UseResponse,
} from "@/lib/shots/schemas";
import { copyTrialForUse } from "@/lib/stills/mutations";
import { requireVisibleTechnique } from "@/lib/techniques/queries";
import { reindexTechnique } from "@/lib/techniques/search-sync";

type Tx = Parameters<Parameters<Database["transaction"]>[0]>[0];

/*
 * Shot codes are part of a technique's search document, so every committed change to use logs
 * (and to shots that have uses) reindexes the techniques concerned. Always after the transaction:
 * the index reads through getDb(), and PGlite has one connection, so calling it inside would wait
 * on the transaction forever.
 */
async function reindexAll(techniqueIds: Iterable<string>): Promise<void> {
  for (const id of new Set(techniqueIds)) await reindexTechnique(id);
}

/** PostgreSQL's unique_violation (SQLSTATE 23505), possibly wrapped by the driver layer. */
function isUniqueViolation(error: unknown): boolean {
  for (let e: unknown = error; e && typeof e === "object"; e = (e as { cause?: unknown }).cause) {
    if ((e as { code?: unknown }).code === "23505") return true;
  }
  return false;
}

// ---- shows ----

/** Leads only. 409 when the code is taken. */
export async function createShow(actor: SessionUser, input: CreateShowInput): Promise<ShowResponse> {
  assertCan(actor, "show:manage");
  const taken = () => new AppError("conflict", `A show with code ${input.code} already exists.`, { fields: { code: "Already in use." } });
  try {
    return await getDb().transaction(async (tx) => {
      const [existing] = await tx.select({ id: shows.id }).from(shows).where(eq(shows.code, input.code)).limit(1);
      if (existing) throw taken();
      const [show] = await tx.insert(shows).values(input).returning();
      if (!show) throw new AppError("internal");
      await writeAudit(tx, { actorId: actor.id, action: "show.create", targetType: "show", targetId: show.id, detail: { code: show.code } });
      return { ...toShow(show), shotCount: 0 };
    });
  } catch (error) {
    if (isUniqueViolation(error)) throw taken();
    throw error;
  }
}

function toShow(s: typeof shows.$inferSelect): Omit<ShowResponse, "shotCount"> {
  return { id: s.id, code: s.code, name: s.name, kind: s.kind, state: s.state, shotPattern: s.shotPattern, createdAt: s.createdAt.toISOString() };
}

/** Leads only. The code is fixed; name, kind, state and shot pattern may change. */
export async function updateShow(actor: SessionUser, code: string, input: UpdateShowInput): Promise<ShowResponse> {
  assertCan(actor, "show:manage");
  const show = await requireShow(code);
  const changes = Object.fromEntries(Object.entries(input).filter(([, v]) => v !== undefined));
  await getDb().transaction(async (tx) => {
    await tx.update(shows).set(changes).where(eq(shows.id, show.id));
    await writeAudit(tx, { actorId: actor.id, action: "show.update", targetType: "show", targetId: show.id, detail: changes });
  });
  return getShow(actor, show.code);
}

// ---- shot import ----

export type ImportShotsRequest = {
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

// ---- use logs ----

type StillRefs = { beforeStill?: string | null; afterStill?: string | null };
const STILL_KEYS = ["beforeStill", "afterStill"] as const;

/** Stills must exist and be visible to the actor (a private trial is its uploader's alone). */
async function checkStills(actor: SessionUser, refs: StillRefs): Promise<void> {
  const ids = STILL_KEYS.map((k) => refs[k]).filter((x): x is string => typeof x === "string");
  if (!ids.length) return;
  const found = await findStills(ids);
  const fields: Record<string, string> = {};
  for (const key of STILL_KEYS) {
    const id = refs[key];
    if (typeof id !== "string") continue;
    const still = found.get(id);
    if (!still || !can(actor, "still:read", { stillOwner: still.owner, ownerId: still.uploaderId })) fields[key] = `No still ${id}.`;
  }
  const first = Object.values(fields)[0];
  if (first) throw new AppError("validation_failed", first, { fields });
}

/**
 * The still ids a use log stores: the actor's own private trials are replaced by shared copies
 * (lib/stills/mutations.ts copyTrialForUse), so the log's readers never meet a still they may
 * not see. Call after checkStills, inside the transaction that writes the use.
 */
async function shareTrials(tx: Tx, actor: SessionUser, refs: StillRefs): Promise<StillRefs> {
  const out: StillRefs = { ...refs };
  const ids = STILL_KEYS.map((k) => refs[k]).filter((x): x is string => typeof x === "string");
  if (!ids.length) return out;
  const rows = await tx.select().from(stills).where(inArray(stills.id, ids));
  const copies = new Map<string, string>();
  for (const key of STILL_KEYS) {
    const row = rows.find((r) => r.id === refs[key]);
    if (row?.owner !== "trial") continue;
    const copy = copies.get(row.id) ?? (await copyTrialForUse(tx, actor, row)).id;
    copies.set(row.id, copy);
    out[key] = copy;
  }
  return out;
}

async function requireShotByCode(code: string) {
  const shot = await findShotByCode(code);
  if (!shot) throw new AppError("not_found", `No shot ${code.trim()}`, { fields: { shot: "No shot with this code." } });
  return shot;
}

/**
 * Records that a technique was used on a shot (POST /api/techniques/{slug}/uses). Artists log
 * uses of approved techniques; seniors and leads of any they can read. The use pins the
 * approved revision if there is one, else the latest.
 */
export async function logUse(actor: SessionUser, techniqueSlug: string, input: LogUseInput): Promise<UseResponse> {
  assertCan(actor, "use:log");
  // 404 for what the actor may not read: artists see techniques with an approved revision only.
  const { technique } = await requireVisibleTechnique(actor, techniqueSlug);
  if (technique.status !== "approved" && !can(actor, "technique:read-working")) {
    throw new AppError("conflict", "This technique is retired; log the use on its replacement.");
  }
  const shot = await requireShotByCode(input.shot);
  await checkStills(actor, input);
  const created = await getDb().transaction(async (tx) => {
    const refs = await shareTrials(tx, actor, input);
    const [row] = await tx
      .insert(uses)
      .values({
        techniqueId: technique.id,
        revisionId: technique.approvedRevisionId ?? technique.latestRevisionId,
        shotId: shot.id,
        userId: actor.id,
        outcome: input.outcome,
        note: input.note,
        beforeStillId: refs.beforeStill ?? null,
        afterStillId: refs.afterStill ?? null,
      })
      .returning({ id: uses.id });
    if (!row) throw new AppError("internal");
    return row;
  });
  await reindexAll([technique.id]);
  return getUse(actor, created.id);
}

async function requireOwnUse(actor: SessionUser, id: string) {
  if (!isUuid(id)) throw new AppError("not_found", "No such use log.");
  const [use] = await getDb().select().from(uses).where(eq(uses.id, id)).limit(1);
  if (!use) throw new AppError("not_found", "No such use log.");
  assertCan(actor, "use:edit", { ownerId: use.userId });
  return use;
}

/** Changes a use log: its author, or any lead. */
export async function updateUse(actor: SessionUser, id: string, input: UpdateUseInput): Promise<UseResponse> {
  const use = await requireOwnUse(actor, id);
  const shot = input.shot !== undefined ? await requireShotByCode(input.shot) : null;
  await checkStills(actor, input);
  await getDb().transaction(async (tx) => {
    const refs = await shareTrials(tx, actor, input);
    await tx
      .update(uses)
      .set({
        ...(shot ? { shotId: shot.id } : {}),
        ...(input.outcome !== undefined ? { outcome: input.outcome } : {}),
        ...(input.note !== undefined ? { note: input.note } : {}),
        ...(refs.beforeStill !== undefined ? { beforeStillId: refs.beforeStill } : {}),
        ...(refs.afterStill !== undefined ? { afterStillId: refs.afterStill } : {}),
        updatedAt: new Date(),
      })
      .where(eq(uses.id, use.id));
    if (use.userId !== actor.id) {
      await writeAudit(tx, { actorId: actor.id, action: "use.update", targetType: "use", targetId: use.id, detail: { ownerId: use.userId } });
    }
  });
  // Only the shot code reaches the search document; outcome and note changes leave it as is.
  if (shot) await reindexAll([use.techniqueId]);
  return getUse(actor, use.id);
}

/** Deletes a use log: its author, or any lead. */
export async function deleteUse(actor: SessionUser, id: string): Promise<void> {
  const use = await requireOwnUse(actor, id);
  await getDb().transaction(async (tx) => {
    await tx.delete(uses).where(eq(uses.id, use.id));
    await writeAudit(tx, {
      actorId: actor.id,
      action: "use.delete",
      targetType: "use",
      targetId: use.id,
      detail: { ownerId: use.userId, techniqueId: use.techniqueId, shotId: use.shotId, outcome: use.outcome },
    });
  });
  await reindexAll([use.techniqueId]);
}
