import "server-only";
import { eq, inArray } from "drizzle-orm";
import { getDb, type Database } from "@/db/client";
import { stills, uses } from "@/db/schema";
import { AppError } from "@/lib/api/errors";
import { assertCan, can } from "@/lib/auth/permissions";
import type { SessionUser } from "@/lib/auth/roles";
import { writeAudit } from "@/lib/audit/log";
import { findShotByCode } from "@/lib/shots/queries";
import { copyTrialForUse } from "@/lib/stills/mutations";
import { requireVisibleTechnique } from "@/lib/techniques/queries";
import { reindexTechnique } from "@/lib/techniques/search-sync";
import { findStills, getUse } from "@/lib/uses/queries";
import type { LogUseInput, UpdateUseInput, UseResponse } from "@/lib/uses/schemas";
import { isUuid } from "@/lib/utils";

/*
 * Shot codes are part of a technique's search document, so every committed change to use logs
 * (and to shots that have uses) reindexes the techniques concerned. Always after the transaction:
 * the index reads through getDb(), and PGlite has one connection, so calling it inside would wait
 * on the transaction forever.
 */
export async function reindexAll(techniqueIds: Iterable<string>): Promise<void> {
  for (const id of new Set(techniqueIds)) await reindexTechnique(id);
}

type Tx = Parameters<Parameters<Database["transaction"]>[0]>[0];

/** Stills must exist and be visible to the actor (a private trial is its uploader's alone). */
type StillRefs = { beforeStill?: string | null; afterStill?: string | null };
const STILL_KEYS = ["beforeStill", "afterStill"] as const;

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
