import "server-only";
import { asc, eq, inArray } from "drizzle-orm";
import { cache } from "react";
import { getDb } from "@/db/client";
import { revisions, stillPairs, stills, type Still, type Technique } from "@/db/schema";
import { AppError } from "@/lib/api/errors";
import { can } from "@/lib/auth/permissions";
import type { SessionUser } from "@/lib/auth/roles";
import type { StillFormat, StillPairResponse, StillResponse } from "@/lib/stills/schemas";
import { isTechniqueVisible, techniqueRowById, visibleRevisionId } from "@/lib/techniques/queries";

export function toStillResponse(s: Still): StillResponse {
  return {
    id: s.id,
    width: s.width,
    height: s.height,
    format: s.format as StillFormat,
    bitDepth: s.bitDepth,
    sha256: s.sha256,
    channels: s.channels,
    alt: s.alt,
    caption: s.caption,
    credit: s.credit,
    role: s.role,
    owner: s.owner,
    techniqueId: s.techniqueId,
    uploaderId: s.uploaderId,
    sizeBytes: s.sizeBytes,
    createdAt: s.createdAt.toISOString(),
  };
}

/** A technique's stills are visible to whoever may see the technique (lib/techniques/queries.ts). */
function techniqueVisible(user: SessionUser, t: Pick<Technique, "approvedRevisionId" | "latestRevisionId"> | undefined): boolean {
  return t !== undefined && isTechniqueVisible(user, t);
}

/**
 * Whether this person may see this still: a private trial only its uploader
 * (lib/auth/permissions.ts "still:read"); stills tied to a technique whoever may see the
 * technique; the uploader always sees their own.
 */
async function canReadStill(user: SessionUser, s: Still): Promise<boolean> {
  if (!can(user, "still:read", { stillOwner: s.owner, ownerId: s.uploaderId })) return false;
  if (s.uploaderId === user.id) return true;
  if (s.owner === "trial") return true;
  if (!s.techniqueId) return s.owner === "use" || can(user, "technique:read-working");
  return techniqueVisible(user, (await techniqueRowById(s.techniqueId)) ?? undefined);
}

/**
 * The still if this person may see it. Not found and not allowed both answer 404, so
 * nobody learns that someone else's private trial exists.
 */
export async function getStillForRead(user: SessionUser, id: string): Promise<Still> {
  const [s] = await getDb().select().from(stills).where(eq(stills.id, id)).limit(1);
  if (!s || !(await canReadStill(user, s))) throw new AppError("not_found", "No still at this address.");
  return s;
}

/** A technique's still rows, once per render (the evidence and lab sections both list them). */
const stillRowsOfTechnique = cache((techniqueId: string) => getDb().select().from(stills).where(eq(stills.techniqueId, techniqueId)).orderBy(asc(stills.createdAt)));

/** Stills attached to a technique (not private trials of others), newest last. */
export async function listStillsForTechnique(user: SessionUser, techniqueId: string): Promise<StillResponse[]> {
  if (!techniqueVisible(user, (await techniqueRowById(techniqueId)) ?? undefined)) throw new AppError("not_found", "No technique at this address.");
  const rows = await stillRowsOfTechnique(techniqueId);
  const visible: StillResponse[] = [];
  for (const s of rows) if (await canReadStill(user, s)) visible.push(toStillResponse(s));
  return visible;
}

/**
 * Before/after pairs shown on a technique page, in their order: those of the revision this person
 * sees (the approved one for readers, the newest for writers), like the text beside them.
 */
export async function listPairsForTechnique(user: SessionUser, techniqueId: string): Promise<StillPairResponse[]> {
  const t = (await techniqueRowById(techniqueId)) ?? undefined;
  if (!techniqueVisible(user, t)) throw new AppError("not_found", "No technique at this address.");
  const revisionId = visibleRevisionId(user, t!);
  if (!revisionId) return [];
  const out: StillPairResponse[] = [];
  for (const p of await listPairsOfRevision(revisionId)) {
    if ((await canReadStill(user, p.beforeRow)) && (await canReadStill(user, p.afterRow))) {
      out.push({ id: p.id, techniqueId: p.techniqueId, revision: p.revision, caption: p.caption, position: p.position, before: toStillResponse(p.beforeRow), after: toStillResponse(p.afterRow) });
    }
  }
  return out;
}

export type RevisionPair = { id: string; techniqueId: string; revision: number; caption: string; position: number; beforeRow: Still; afterRow: Still };

/** The pairs of one revision with their stills, in order; the caller has checked the revision is visible. */
export async function listPairsOfRevision(revisionId: string): Promise<RevisionPair[]> {
  const db = getDb();
  const pairs = await db
    .select({ pair: stillPairs, revision: revisions.number })
    .from(stillPairs)
    .innerJoin(revisions, eq(revisions.id, stillPairs.revisionId))
    .where(eq(stillPairs.revisionId, revisionId))
    .orderBy(asc(stillPairs.position), asc(stillPairs.createdAt));
  if (!pairs.length) return [];
  const ids = [...new Set(pairs.flatMap(({ pair: p }) => [p.beforeStillId, p.afterStillId]))];
  // Pairs are made of the technique's own stills (createPair checks), already read for this render.
  const own = await stillRowsOfTechnique(pairs[0]!.pair.techniqueId);
  const missing = ids.filter((id) => !own.some((s) => s.id === id));
  const rows = missing.length ? [...own, ...(await db.select().from(stills).where(inArray(stills.id, missing)))] : own;
  const byId = new Map(rows.map((s) => [s.id, s]));
  return pairs.flatMap(({ pair: p, revision }) => {
    const beforeRow = byId.get(p.beforeStillId);
    const afterRow = byId.get(p.afterStillId);
    return beforeRow && afterRow ? [{ id: p.id, techniqueId: p.techniqueId, revision, caption: p.caption, position: p.position, beforeRow, afterRow }] : [];
  });
}

/** Which of these hashes some still row still points at (for the sweeper and cleanup). */
export async function referencedHashes(hashes: string[]): Promise<Set<string>> {
  const found = new Set<string>();
  const db = getDb();
  for (let i = 0; i < hashes.length; i += 500) {
    const rows = await db.selectDistinct({ sha256: stills.sha256 }).from(stills).where(inArray(stills.sha256, hashes.slice(i, i + 500)));
    for (const r of rows) found.add(r.sha256);
  }
  return found;
}

