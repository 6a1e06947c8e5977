import "server-only";
import { and, asc, count, desc, eq, ilike, inArray, or, sql, type SQL } from "drizzle-orm";
import { alias } from "drizzle-orm/pg-core";
import { getDb } from "@/db/client";
import { revisions, shots, shows, stills, techniques, users, uses, type Shot, type Show, type Technique } from "@/db/schema";
import { AppError } from "@/lib/api/errors";
import { assertCan, can } from "@/lib/auth/permissions";
import type { SessionUser } from "@/lib/auth/roles";
import { shotsToCsv } from "@/lib/shots/csv";
import { isTechniqueVisible, requireVisibleTechnique, visibleRevisionId } from "@/lib/techniques/queries";
import {
  type FollowUp,
  type FollowUpShot,
  type ListUsesQuery,
  type OutcomeCounts,
  type ShotDetailResponse,
  type ShotResponse,
  type ShotsResponse,
  type ShotSuggestion,
  type ShowResponse,
  type TechniqueRef,
  type TechniqueUsesResponse,
  type UseResponse,
} from "@/lib/shots/schemas";

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
export const isUuid = (v: string) => UUID.test(v);

/** `%`, `_` and `\` are LIKE wildcards; `_` is in every shot code, so it must match literally. */
export function escapeLike(s: string): string {
  return s.replace(/[\\%_]/g, (c) => `\\${c}`);
}

export function toShowResponse(s: Show, shotCount: number): ShowResponse {
  return {
    id: s.id,
    code: s.code,
    name: s.name,
    kind: s.kind,
    state: s.state,
    shotPattern: s.shotPattern,
    shotCount,
    createdAt: s.createdAt.toISOString(),
  };
}

export function toShotResponse(s: Shot, showCode: string): ShotResponse {
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

// ---- techniques: lookup and visibility come from the technique DAL ----

async function titlesOf(revisionIds: string[]): Promise<Map<string, string>> {
  const ids = [...new Set(revisionIds)];
  if (!ids.length) return new Map();
  const rows = await getDb().select({ id: revisions.id, title: revisions.title }).from(revisions).where(inArray(revisions.id, ids));
  return new Map(rows.map((r) => [r.id, r.title]));
}

/** Technique references (slug, title, status) for the techniques the actor may see. */
async function techniqueRefs(actor: SessionUser, list: Technique[]): Promise<Map<string, TechniqueRef>> {
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

// ---- shows ----

// Qualified by hand: inside the subquery drizzle prints both columns unqualified, and "id" would bind to shots.
const shotCountSql = sql<number>`(select count(*) from "shots" s where s."show_id" = "shows"."id")`.mapWith(Number);

/** Every show with its number of shots, active shows first. Any signed-in person. */
export async function listShows(actor: SessionUser): Promise<ShowResponse[]> {
  assertCan(actor, "technique:read");
  const rows = await getDb()
    .select({ show: shows, shotCount: shotCountSql })
    .from(shows)
    .orderBy(asc(shows.state), asc(shows.code));
  return rows.map((r) => toShowResponse(r.show, r.shotCount));
}

/** Internal: the show row by code, or 404 "No show XYZ". */
export async function requireShow(code: string): Promise<Show> {
  const [show] = await getDb().select().from(shows).where(eq(shows.code, code.trim().toUpperCase())).limit(1);
  if (!show) throw new AppError("not_found", `No show ${code}`);
  return show;
}

export async function getShow(actor: SessionUser, code: string): Promise<ShowResponse> {
  assertCan(actor, "technique:read");
  const [row] = await getDb()
    .select({ show: shows, shotCount: shotCountSql })
    .from(shows)
    .where(eq(shows.code, code.trim().toUpperCase()))
    .limit(1);
  if (!row) throw new AppError("not_found", `No show ${code}`);
  return toShowResponse(row.show, row.shotCount);
}

// ---- shots ----

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

// ---- uses of a technique ----

const SORT_COLUMNS = {
  createdAt: uses.createdAt,
  shot: shots.code,
  outcome: uses.outcome,
  user: users.name,
} as const;

/** Internal: one use as the API shows it. */
export function toUseResponse(
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
export async function listUsesForTechnique(
  actor: SessionUser,
  techniqueId: string,
  query: Partial<ListUsesQuery> = {},
): Promise<{ items: UseResponse[]; total: number }> {
  assertCan(actor, "technique:read");
  const db = getDb();
  const [t] = await db.select().from(techniques).where(eq(techniques.id, techniqueId)).limit(1);
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
export async function outcomeCounts(techniqueId: string): Promise<OutcomeCounts> {
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

/**
 * The shots a technique was used on, one entry per shot with its latest outcome: what the
 * retire dialog lists for follow-up. No permission check; the retire flow has one.
 */
export async function shotsToFollowUp(techniqueId: string): Promise<FollowUpShot[]> {
  const rows = await getDb()
    .select({ code: shots.code, showCode: shows.code, outcome: uses.outcome, at: uses.createdAt })
    .from(uses)
    .innerJoin(shots, eq(shots.id, uses.shotId))
    .innerJoin(shows, eq(shows.id, shots.showId))
    .where(eq(uses.techniqueId, techniqueId))
    .orderBy(desc(uses.createdAt));
  const byCode = new Map<string, FollowUpShot>();
  for (const r of rows) {
    const seen = byCode.get(r.code);
    if (seen) seen.uses++;
    else byCode.set(r.code, { code: r.code, showCode: r.showCode, uses: 1, lastOutcome: r.outcome, lastUsedAt: r.at.toISOString() });
  }
  return [...byCode.values()].sort((a, b) => a.code.localeCompare(b.code));
}

/** Distinct shot codes a technique was used on, for the search index. No permission check. */
export async function shotCodesForTechnique(techniqueId: string): Promise<string[]> {
  const rows = await getDb()
    .selectDistinct({ code: shots.code })
    .from(uses)
    .innerJoin(shots, eq(shots.id, uses.shotId))
    .where(eq(uses.techniqueId, techniqueId))
    .orderBy(asc(shots.code));
  return rows.map((r) => r.code);
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
