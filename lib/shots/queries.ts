import "server-only";
import { and, asc, count, desc, eq, ilike, inArray, or, type SQL } from "drizzle-orm";
import { alias } from "drizzle-orm/pg-core";
import { getDb } from "@/db/client";
import { shots, shows, stills, techniques, users, uses, type Shot, type Technique } from "@/db/schema";
import { AppError } from "@/lib/api/errors";
import { assertCan, can } from "@/lib/auth/permissions";
import type { SessionUser } from "@/lib/auth/roles";
import { shotsToCsv } from "@/lib/shots/csv";
import type { ShotDetailResponse, ShotResponse, ShotsResponse, ShotSuggestion } from "@/lib/shots/schemas";
import { requireShow } from "@/lib/shows/queries";
import { followUpFor, techniqueRefs } from "@/lib/uses/queries";
import { escapeLike } from "@/lib/utils";

function toShotResponse(s: Shot, showCode: string): ShotResponse {
  return {
    id: s.id,
    code: s.code,
    showCode,
    sequence: s.sequence,
    description: s.description,
    frameStart: s.frameStart,
    frameEnd: s.frameEnd,
    state: s.state,
    createdAt: s.createdAt.toISOString(),
    updatedAt: s.updatedAt.toISOString(),
  };
}

/** A show's shots by code, paged; `q` matches part of the code or description. */
export async function listShots(
  actor: SessionUser,
  showCode: string,
  options: { q?: string; limit?: number; offset?: number } = {},
): Promise<ShotsResponse> {
  assertCan(actor, "technique:read");
  const show = await requireShow(showCode);
  const where: SQL[] = [eq(shots.showId, show.id)];
  if (options.q) {
    const like = `%${escapeLike(options.q)}%`;
    where.push(or(ilike(shots.code, like), ilike(shots.description, like))!);
  }
  const db = getDb();
  const [items, [total]] = await Promise.all([
    db
      .select()
      .from(shots)
      .where(and(...where))
      .orderBy(asc(shots.code))
      .limit(options.limit ?? 100)
      .offset(options.offset ?? 0),
    db.select({ n: count() }).from(shots).where(and(...where)),
  ]);
  return { items: items.map((s) => toShotResponse(s, show.code)), total: total?.n ?? 0 };
}

/** All of a show's shots as CSV, for download. */
export async function exportShowShots(actor: SessionUser, showCode: string): Promise<{ filename: string; csv: string }> {
  assertCan(actor, "technique:read");
  const show = await requireShow(showCode);
  const rows = await getDb().select().from(shots).where(eq(shots.showId, show.id)).orderBy(asc(shots.code));
  return { filename: `${show.code}-shots.csv`, csv: shotsToCsv(rows) };
}

/** Shot codes starting with `prefix` (any case), for the shot typeahead. */
export async function searchShotCodes(actor: SessionUser, prefix: string, limit = 10): Promise<ShotSuggestion[]> {
  assertCan(actor, "technique:read");
  const rows = await getDb()
    .select({ code: shots.code, showCode: shows.code, description: shots.description })
    .from(shots)
    .innerJoin(shows, eq(shows.id, shots.showId))
    .where(ilike(shots.code, `${escapeLike(prefix.trim())}%`))
    .orderBy(asc(shots.code))
    .limit(Math.min(Math.max(limit, 1), 50));
  return rows;
}

/** Internal: a shot by exact code (or its upper-case form, as codes are written in capitals). */
export async function findShotByCode(code: string): Promise<(Shot & { showCode: string }) | null> {
  const trimmed = code.trim();
  const candidates = [...new Set([trimmed, trimmed.toUpperCase()])];
  const rows = await getDb()
    .select({ shot: shots, showCode: shows.code })
    .from(shots)
    .innerJoin(shows, eq(shows.id, shots.showId))
    .where(inArray(shots.code, candidates));
  const row = rows.find((r) => r.shot.code === trimmed) ?? rows[0];
  return row ? { ...row.shot, showCode: row.showCode } : null;
}

const replacementTechnique = alias(techniques, "replacement");
const beforeStills = alias(stills, "before_still");
const afterStills = alias(stills, "after_still");

type StillInfo = { id: string; alt: string; owner: "technique" | "use" | "trial"; uploaderId: string | null } | null;
/** A use's still as the reader may see it: a private trial of someone else's is not shown. */
function readableStill(actor: SessionUser, s: StillInfo): { id: string | null; alt: string | null } {
  if (!s?.id || !can(actor, "still:read", { stillOwner: s.owner, ownerId: s.uploaderId })) return { id: null, alt: null };
  return { id: s.id, alt: s.alt };
}

/**
 * A shot with the techniques used on it (outcome, who, stills) and, where a technique has been
 * retired, the follow-up note pointing to its replacement. Uses of techniques the actor may not
 * see (drafts, for artists) are left out.
 */
export async function getShotWithUses(actor: SessionUser, code: string): Promise<ShotDetailResponse> {
  assertCan(actor, "technique:read");
  const db = getDb();
  const trimmed = code.trim();
  // Codes are written in capitals; a typed lower-case code still finds its shot.
  const found = await db
    .select({ shot: shots, show: shows })
    .from(shots)
    .innerJoin(shows, eq(shows.id, shots.showId))
    .where(inArray(shots.code, [...new Set([trimmed, trimmed.toUpperCase()])]));
  const row = found.find((r) => r.shot.code === trimmed) ?? found[0];
  if (!row) throw new AppError("not_found", `No shot ${trimmed}`);

  const useRows = await db
    .select({
      use: uses,
      technique: techniques,
      replacement: replacementTechnique,
      user: { id: users.id, name: users.name },
      before: { id: beforeStills.id, alt: beforeStills.alt, owner: beforeStills.owner, uploaderId: beforeStills.uploaderId },
      after: { id: afterStills.id, alt: afterStills.alt, owner: afterStills.owner, uploaderId: afterStills.uploaderId },
    })
    .from(uses)
    .innerJoin(techniques, eq(techniques.id, uses.techniqueId))
    .leftJoin(replacementTechnique, eq(replacementTechnique.id, techniques.supersededById))
    .leftJoin(users, eq(users.id, uses.userId))
    .leftJoin(beforeStills, eq(beforeStills.id, uses.beforeStillId))
    .leftJoin(afterStills, eq(afterStills.id, uses.afterStillId))
    .where(eq(uses.shotId, row.shot.id))
    .orderBy(desc(uses.createdAt), asc(uses.id));

  const all: Technique[] = [];
  for (const r of useRows) {
    all.push(r.technique);
    if (r.replacement) all.push(r.replacement);
  }
  const refs = await techniqueRefs(actor, all);
  const items: ShotDetailResponse["uses"] = [];
  for (const r of useRows) {
    const technique = refs.get(r.technique.id);
    if (!technique) continue;
    const rep = r.replacement ? refs.get(r.replacement.id) : undefined;
    const before = readableStill(actor, r.before);
    const after = readableStill(actor, r.after);
    items.push({
      id: r.use.id,
      technique,
      outcome: r.use.outcome,
      note: r.use.note,
      user: r.user?.id ? { id: r.user.id, name: r.user.name } : null,
      beforeStill: before.id,
      afterStill: after.id,
      beforeStillAlt: before.alt,
      afterStillAlt: after.alt,
      revisionId: r.use.revisionId,
      followUp: followUpFor(r.technique, rep ? { slug: rep.slug, title: rep.title } : null),
      canEdit: can(actor, "use:edit", { ownerId: r.use.userId }),
      createdAt: r.use.createdAt.toISOString(),
      updatedAt: r.use.updatedAt.toISOString(),
    });
  }
  return {
    ...toShotResponse(row.shot, row.show.code),
    show: { code: row.show.code, name: row.show.name, state: row.show.state },
    uses: items,
  };
}

