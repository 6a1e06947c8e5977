import "server-only";
import { asc, eq, inArray } from "drizzle-orm";
import { getDb } from "@/db/client";
import { stillPairs, stills, techniques, type Still, type Technique } from "@/db/schema";
import { AppError } from "@/lib/api/errors";
import { can } from "@/lib/auth/permissions";
import type { SessionUser } from "@/lib/auth/roles";
import type { StillFormat, StillPairResponse, StillResponse } from "@/lib/stills/schemas";
import { isTechniqueVisible } from "@/lib/techniques/queries";

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

const visibilityColumns = { approvedRevisionId: techniques.approvedRevisionId, latestRevisionId: techniques.latestRevisionId };

/**
 * Whether this person may see this still: private trials only their uploader and leads
 * (lib/auth/permissions.ts "still:read"); stills tied to a technique whoever may see the
 * technique; the uploader always sees their own.
 */
async function canReadStill(user: SessionUser, s: Still): Promise<boolean> {
  if (!can(user, "still:read", { stillOwner: s.owner, ownerId: s.uploaderId })) return false;
  if (s.uploaderId === user.id) return true;
  if (s.owner === "trial") return true;
  if (!s.techniqueId) return s.owner === "use" || can(user, "technique:read-working");
  const [t] = await getDb().select(visibilityColumns).from(techniques).where(eq(techniques.id, s.techniqueId)).limit(1);
  return techniqueVisible(user, t);
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

/** Stills attached to a technique (not private trials of others), newest last. */
export async function listStillsForTechnique(user: SessionUser, techniqueId: string): Promise<StillResponse[]> {
  const [t] = await getDb().select(visibilityColumns).from(techniques).where(eq(techniques.id, techniqueId)).limit(1);
  if (!techniqueVisible(user, t)) throw new AppError("not_found", "No technique at this address.");
  const rows = await getDb().select().from(stills).where(eq(stills.techniqueId, techniqueId)).orderBy(asc(stills.createdAt));
  const visible: StillResponse[] = [];
  for (const s of rows) if (await canReadStill(user, s)) visible.push(toStillResponse(s));
  return visible;
}

/** Before/after pairs shown on a technique page, in their order. */
export async function listPairsForTechnique(user: SessionUser, techniqueId: string): Promise<StillPairResponse[]> {
  const db = getDb();
  const [t] = await db.select(visibilityColumns).from(techniques).where(eq(techniques.id, techniqueId)).limit(1);
  if (!techniqueVisible(user, t)) throw new AppError("not_found", "No technique at this address.");
  const pairs = await db.select().from(stillPairs).where(eq(stillPairs.techniqueId, techniqueId)).orderBy(asc(stillPairs.position), asc(stillPairs.createdAt));
  if (!pairs.length) return [];
  const ids = [...new Set(pairs.flatMap((p) => [p.beforeStillId, p.afterStillId]))];
  const rows = await db.select().from(stills).where(inArray(stills.id, ids));
  const byId = new Map(rows.map((s) => [s.id, s]));
  const out: StillPairResponse[] = [];
  for (const p of pairs) {
    const before = byId.get(p.beforeStillId);
    const after = byId.get(p.afterStillId);
    if (!before || !after || !(await canReadStill(user, before)) || !(await canReadStill(user, after))) continue;
    out.push({ id: p.id, techniqueId: p.techniqueId, caption: p.caption, position: p.position, before: toStillResponse(before), after: toStillResponse(after) });
  }
  return out;
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

