import "server-only";
import { and, asc, count, desc, eq, ilike, inArray, or, type SQL } from "drizzle-orm";
import { getDb } from "@/db/client";
import { revisions, shots, shows, stills, techniques, users, uses, type Technique } from "@/db/schema";
import { AppError } from "@/lib/api/errors";
import { assertCan, can } from "@/lib/auth/permissions";
import type { SessionUser } from "@/lib/auth/roles";
import { isTechniqueVisible, requireVisibleTechnique, techniqueRowById, visibleRevisionId } from "@/lib/techniques/queries";
import type { FollowUp, ListUsesQuery, OutcomeCounts, TechniqueRef, TechniqueUsesResponse, UseResponse } from "@/lib/uses/schemas";
import { escapeLike, isUuid } from "@/lib/utils";

// ---- techniques: lookup and visibility come from the technique DAL ----

async function titlesOf(revisionIds: string[]): Promise<Map<string, string>> {
  const ids = [...new Set(revisionIds)];
  if (!ids.length) return new Map();
  const rows = await getDb().select({ id: revisions.id, title: revisions.title }).from(revisions).where(inArray(revisions.id, ids));
  return new Map(rows.map((r) => [r.id, r.title]));
}

/** Technique references (slug, title, status) for the techniques the actor may see. */
export async function techniqueRefs(actor: SessionUser, list: Technique[]): Promise<Map<string, TechniqueRef>> {
  const visible = list.filter((t) => isTechniqueVisible(actor, t));
  const titles = await titlesOf(visible.map((t) => visibleRevisionId(actor, t)).filter((id): id is string => id !== null));
  const out = new Map<string, TechniqueRef>();
  for (const t of visible) {
    const rid = visibleRevisionId(actor, t);
    out.set(t.id, { id: t.id, slug: t.slug, title: (rid && titles.get(rid)) || t.slug, status: t.status });
  }
  return out;
}

/**
 * The follow-up note a shot shows for a retired technique: "retired — see {replacement}".
 * Derived from the technique's retired/supersededBy state (no column of its own).
 */
export function followUpFor(t: Pick<Technique, "status">, replacement: { slug: string; title: string } | null): FollowUp | null {
  if (t.status !== "retired") return null;
  return replacement ? { note: `retired — see ${replacement.title}`, replacement } : { note: "retired — no replacement named", replacement: null };
}

const SORT_COLUMNS = {
  createdAt: uses.createdAt,
  shot: shots.code,
  outcome: uses.outcome,
  user: users.name,
} as const;

/** Internal: one use as the API shows it. */
function toUseResponse(
  actor: SessionUser,
  r: { use: typeof uses.$inferSelect; shot: { code: string; sequence: string }; showCode: string; user: { id: string; name: string } | null },
  technique: TechniqueRef,
): UseResponse {
  return {
    id: r.use.id,
    technique,
    shot: { code: r.shot.code, showCode: r.showCode, sequence: r.shot.sequence },
    outcome: r.use.outcome,
    note: r.use.note,
    user: r.user?.id ? { id: r.user.id, name: r.user.name } : null,
    beforeStill: r.use.beforeStillId,
    afterStill: r.use.afterStillId,
    revisionId: r.use.revisionId,
    canEdit: can(actor, "use:edit", { ownerId: r.use.userId }),
    createdAt: r.use.createdAt.toISOString(),
    updatedAt: r.use.updatedAt.toISOString(),
  };
}

/**
 * A technique's uses, sorted, filtered and paged for its shot table. The caller has checked that
 * the actor may see the technique (see listTechniqueUses).
 */
async function listUsesForTechnique(
  actor: SessionUser,
  techniqueId: string,
  query: Partial<ListUsesQuery> = {},
): Promise<{ items: UseResponse[]; total: number }> {
  assertCan(actor, "technique:read");
  const db = getDb();
  const t = await techniqueRowById(techniqueId);
  if (!t || !isTechniqueVisible(actor, t)) throw new AppError("not_found", "No such technique.");
  const ref = (await techniqueRefs(actor, [t])).get(t.id)!;

  const where: SQL[] = [eq(uses.techniqueId, techniqueId)];
  if (query.outcome) where.push(eq(uses.outcome, query.outcome));
  if (query.show) where.push(eq(shows.code, query.show));
  if (query.q) {
    const like = `%${escapeLike(query.q)}%`;
    where.push(or(ilike(shots.code, like), ilike(uses.note, like))!);
  }
  const column = SORT_COLUMNS[query.sort ?? "createdAt"];
  const direction = (query.dir ?? "desc") === "asc" ? asc : desc;

  const base = () =>
    db
      .select({ use: uses, shot: { code: shots.code, sequence: shots.sequence }, showCode: shows.code, user: { id: users.id, name: users.name } })
      .from(uses)
      .innerJoin(shots, eq(shots.id, uses.shotId))
      .innerJoin(shows, eq(shows.id, shots.showId))
      .leftJoin(users, eq(users.id, uses.userId))
      .where(and(...where));
  const [rows, [total]] = await Promise.all([
    base()
      .orderBy(direction(column), desc(uses.createdAt), asc(uses.id))
      .limit(query.limit ?? 25)
      .offset(query.offset ?? 0),
    db
      .select({ n: count() })
      .from(uses)
      .innerJoin(shots, eq(shots.id, uses.shotId))
      .innerJoin(shows, eq(shows.id, shots.showId))
      .where(and(...where)),
  ]);
  return { items: rows.map((r) => toUseResponse(actor, r, ref)), total: total?.n ?? 0 };
}

/** How a technique has fared: uses per outcome. No permission check; callers have one. */
async function outcomeCounts(techniqueId: string): Promise<OutcomeCounts> {
  const rows = await getDb()
    .select({ outcome: uses.outcome, n: count() })
    .from(uses)
    .where(eq(uses.techniqueId, techniqueId))
    .groupBy(uses.outcome);
  const counts: OutcomeCounts = { clean: 0, "touch-up": 0, failed: 0, total: 0 };
  for (const r of rows) {
    counts[r.outcome] = r.n;
    counts.total += r.n;
  }
  return counts;
}

/** GET /api/techniques/{slug}/uses: the page of uses and the outcome counts. */
export async function listTechniqueUses(actor: SessionUser, slug: string, query: Partial<ListUsesQuery> = {}): Promise<TechniqueUsesResponse> {
  const { technique: t } = await requireVisibleTechnique(actor, slug);
  const [page, counts] = await Promise.all([listUsesForTechnique(actor, t.id, query), outcomeCounts(t.id)]);
  return { ...page, counts };
}

/** The outcome counts of a technique's shot log, for the page's chart (the rows come from the API in the browser). */
export async function techniqueUseCounts(actor: SessionUser, slug: string): Promise<OutcomeCounts> {
  const { technique: t } = await requireVisibleTechnique(actor, slug);
  return outcomeCounts(t.id);
}

/** Internal: the stills with these ids that exist, with what visibility needs. */
export async function findStills(ids: string[]): Promise<Map<string, { id: string; owner: "technique" | "use" | "trial"; uploaderId: string | null }>> {
  const wanted = ids.filter(isUuid);
  if (!wanted.length) return new Map();
  const rows = await getDb()
    .select({ id: stills.id, owner: stills.owner, uploaderId: stills.uploaderId })
    .from(stills)
    .where(inArray(stills.id, wanted));
  return new Map(rows.map((r) => [r.id, r]));
}

/** One use log as the API shows it; 404 when it does not exist or its technique is hidden from the actor. */
export async function getUse(actor: SessionUser, id: string): Promise<UseResponse> {
  assertCan(actor, "technique:read");
  if (!isUuid(id)) throw new AppError("not_found", "No such use log.");
  const [r] = await getDb()
    .select({ use: uses, technique: techniques, shot: { code: shots.code, sequence: shots.sequence }, showCode: shows.code, user: { id: users.id, name: users.name } })
    .from(uses)
    .innerJoin(techniques, eq(techniques.id, uses.techniqueId))
    .innerJoin(shots, eq(shots.id, uses.shotId))
    .innerJoin(shows, eq(shows.id, shots.showId))
    .leftJoin(users, eq(users.id, uses.userId))
    .where(eq(uses.id, id))
    .limit(1);
  const ref = r ? (await techniqueRefs(actor, [r.technique])).get(r.technique.id) : undefined;
  if (!r || !ref) throw new AppError("not_found", "No such use log.");
  return toUseResponse(actor, r, ref);
}
