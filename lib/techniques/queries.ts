import "server-only";
import { and, asc, desc, eq, inArray, isNotNull, sql, type SQL } from "drizzle-orm";
import { cache } from "react";
import { getDb, type Database } from "@/db/client";
import { houseMethods, revisions, tags, techniqueSlugHistory, techniques, users, type Revision, type Technique } from "@/db/schema";
import { AppError } from "@/lib/api/errors";
import { assertCan, can } from "@/lib/auth/permissions";
import type { SessionUser } from "@/lib/auth/roles";
import { emptyDocument, type TechniqueDocument } from "@/lib/techniques/document";
import type { RecipeStep } from "@/lib/lab/recipe";
import { loadTagMap, tagRefs } from "@/lib/tags/queries";
import type {
  PersonRef,
  RevisionSummary,
  TechniqueListItem,
  TechniqueResponse,
  TechniqueStatus,
} from "@/lib/techniques/schemas";

/** Seniors and leads work on the newest revision; everyone else reads the approved one. */
function readsWorkingCopy(user: SessionUser): boolean {
  return can(user, "technique:read-working");
}

/*
 * Reads below wrapped in React `cache` are asked for by several sections of one technique page
 * (header, evidence, lab, shots); the memo lives for one server render only, so each page
 * reads each row once and nothing outlives the request. Outside a render they read every time.
 */

/** A technique row by id, once per render. */
export const techniqueRowById = cache(async (id: string): Promise<Technique | null> => {
  const [row] = await getDb().select().from(techniques).where(eq(techniques.id, id)).limit(1);
  return row ?? null;
});

/** A revision row by id, once per render. */
export const revisionRowById = cache(async (id: string): Promise<Revision | null> => {
  const [row] = await getDb().select().from(revisions).where(eq(revisions.id, id)).limit(1);
  return row ?? null;
});

const techniqueBySlugOnce = cache((slug: string) => findTechniqueBySlug(slug));

async function people(ids: (string | null | undefined)[]): Promise<Map<string, { id: string; name: string }>> {
  const unique = [...new Set(ids.filter((v): v is string => Boolean(v)))];
  if (!unique.length) return new Map();
  const rows = await getDb().select({ id: users.id, name: users.name }).from(users).where(inArray(users.id, unique));
  return new Map(rows.map((r) => [r.id, r]));
}

function ref(map: Map<string, { id: string; name: string }>, id: string | null | undefined): PersonRef {
  return id ? (map.get(id) ?? null) : null;
}

/** Finds a technique by its slug or by a slug it had before a rename. */
export async function findTechniqueBySlug(
  slug: string,
  db: Pick<Database, "select"> = getDb(),
): Promise<{ technique: Technique; renamedFrom: string | null } | null> {
  const [direct] = await db.select().from(techniques).where(eq(techniques.slug, slug)).limit(1);
  if (direct) return { technique: direct, renamedFrom: null };
  const [old] = await db
    .select({ technique: techniques })
    .from(techniqueSlugHistory)
    .innerJoin(techniques, eq(techniques.id, techniqueSlugHistory.techniqueId))
    .where(eq(techniqueSlugHistory.slug, slug))
    .limit(1);
  return old ? { technique: old.technique, renamedFrom: slug } : null;
}

/** The revision this person should see, or null when the technique is not visible to them. */
export function visibleRevisionId(user: SessionUser, t: Pick<Technique, "approvedRevisionId" | "latestRevisionId">): string | null {
  if (readsWorkingCopy(user)) return t.latestRevisionId ?? t.approvedRevisionId;
  return t.approvedRevisionId;
}

/**
 * The one visibility rule for a technique and what hangs off it (stills, pairs, use logs):
 * seniors and leads read working copies; everyone else sees it once it has an approved revision.
 */
export function isTechniqueVisible(user: SessionUser, t: Pick<Technique, "approvedRevisionId" | "latestRevisionId">): boolean {
  return visibleRevisionId(user, t) !== null;
}

/** Resolves a slug to a technique this person may see; 404 otherwise (no hint that drafts exist). */
export async function requireVisibleTechnique(user: SessionUser, slug: string): Promise<{ technique: Technique; revision: Revision; renamedFrom: string | null }> {
  assertCan(user, "technique:read");
  const found = await techniqueBySlugOnce(slug);
  const revisionId = found ? visibleRevisionId(user, found.technique) : null;
  if (!found || !revisionId) throw new AppError("not_found", "No technique at this address.");
  const revision = await revisionRowById(revisionId);
  if (!revision) throw new AppError("not_found", "No technique at this address.");
  return { technique: found.technique, revision, renamedFrom: found.renamedFrom };
}

function toRevisionSummary(r: Revision, names: Map<string, { id: string; name: string }>): RevisionSummary {
  return {
    number: r.number,
    state: r.state,
    changeNote: r.changeNote,
    author: ref(names, r.authorId),
    createdAt: r.createdAt.toISOString(),
    reviewedBy: ref(names, r.reviewedById),
    reviewedAt: r.reviewedAt?.toISOString() ?? null,
    reviewNote: r.reviewNote,
  };
}

export async function getTechnique(user: SessionUser, slug: string): Promise<TechniqueResponse & { renamedFrom: string | null }> {
  const { technique: t, revision, renamedFrom } = await requireVisibleTechnique(user, slug);
  const db = getDb();
  const [tagMap, numbers, approved, superseding, house] = await Promise.all([
    loadTagMap(),
    db.select({ id: revisions.id, number: revisions.number }).from(revisions).where(eq(revisions.techniqueId, t.id)),
    t.approvedRevisionId ? revisionRowById(t.approvedRevisionId).then((r) => (r ? [r] : [])) : Promise.resolve([]),
    t.supersededById
      ? db.select({ slug: techniques.slug, approvedRevisionId: techniques.approvedRevisionId }).from(techniques).where(eq(techniques.id, t.supersededById)).limit(1)
      : Promise.resolve([]),
    db.select({ tagId: houseMethods.tagId }).from(houseMethods).where(eq(houseMethods.techniqueId, t.id)),
  ]);
  const approvedRevision = approved[0];
  let supersededBy: TechniqueResponse["supersededBy"] = null;
  if (superseding[0]?.approvedRevisionId) {
    const [sr] = await db.select({ title: revisions.title }).from(revisions).where(eq(revisions.id, superseding[0].approvedRevisionId)).limit(1);
    supersededBy = { slug: superseding[0].slug, title: sr?.title ?? superseding[0].slug };
  }
  const names = await people([revision.authorId, revision.reviewedById, t.createdById, approvedRevision?.reviewedById]);
  const numberOf = new Map(numbers.map((n) => [n.id, n.number]));
  const latest = t.latestRevisionId ? (numberOf.get(t.latestRevisionId) ?? revision.number) : revision.number;
  const approvedNumber = t.approvedRevisionId ? (numberOf.get(t.approvedRevisionId) ?? null) : null;
  return {
    id: t.id,
    slug: t.slug,
    renamedFrom,
    title: revision.title,
    summary: revision.summary,
    aliases: revision.aliases,
    status: t.status,
    tags: tagRefs(revision.tagIds, tagMap),
    body: (revision.body as TechniqueDocument | null) ?? emptyDocument(),
    recipe: revision.recipe as RecipeStep[],
    revision: toRevisionSummary(revision, names),
    latestRevision: latest,
    approvedRevision: approvedNumber,
    hasPendingRevision: approvedNumber !== null && latest > approvedNumber,
    createdBy: ref(names, t.createdById),
    approvedBy: ref(names, approvedRevision?.reviewedById),
    lastApprovedAt: t.lastApprovedAt?.toISOString() ?? null,
    supersededBy,
    retiredAt: t.retiredAt?.toISOString() ?? null,
    retireNote: t.retireNote,
    isHouseMethodFor: tagRefs(
      house.map((h) => h.tagId),
      tagMap,
    ),
  };
}

type ListOptions = { status?: TechniqueStatus; tag?: string; mine?: boolean; limit?: number; offset?: number; order?: "recent" | "title" };

/** Techniques this person may see, with the title and tags of the revision they see. */
export async function listTechniques(user: SessionUser, options: ListOptions = {}): Promise<{ items: TechniqueListItem[]; total: number }> {
  assertCan(user, "technique:read");
  const db = getDb();
  const working = readsWorkingCopy(user);
  const revisionJoin = working ? sql`coalesce(${techniques.latestRevisionId}, ${techniques.approvedRevisionId})` : sql`${techniques.approvedRevisionId}`;
  const tagMap = await loadTagMap();
  const conditions: SQL[] = [];
  if (!working) conditions.push(isNotNull(techniques.approvedRevisionId));
  if (options.status) conditions.push(eq(techniques.status, options.status));
  if (options.mine) conditions.push(eq(techniques.createdById, user.id));
  if (options.tag) {
    const tag = [...tagMap.values()].find((t) => t.slug === options.tag);
    if (!tag) return { items: [], total: 0 };
    conditions.push(sql`${tag.id}::uuid = any(${revisions.tagIds})`);
  }
  const where = conditions.length ? and(...conditions) : undefined;
  const base = db
    .select({ t: techniques, r: revisions })
    .from(techniques)
    .innerJoin(revisions, eq(revisions.id, sql`${revisionJoin}`))
    .where(where);
  const [rows, countRows, house] = await Promise.all([
    base
      .orderBy(options.order === "title" ? asc(revisions.title) : desc(techniques.updatedAt))
      .limit(options.limit ?? 50)
      .offset(options.offset ?? 0),
    db
      .select({ n: sql<number>`count(*)`.mapWith(Number) })
      .from(techniques)
      .innerJoin(revisions, eq(revisions.id, sql`${revisionJoin}`))
      .where(where),
    db.select().from(houseMethods),
  ]);
  const houseBy = new Map<string, string[]>();
  for (const h of house) {
    const slug = tagMap.get(h.tagId)?.slug;
    if (slug) houseBy.set(h.techniqueId, [...(houseBy.get(h.techniqueId) ?? []), slug]);
  }
  const items = rows.map(({ t, r }) => ({
    slug: t.slug,
    title: r.title,
    summary: r.summary,
    status: t.status,
    tags: tagRefs(r.tagIds, tagMap),
    updatedAt: t.updatedAt.toISOString(),
    hasPendingRevision: working && t.approvedRevisionId !== null && t.latestRevisionId !== t.approvedRevisionId,
    isHouseMethodFor: houseBy.get(t.id) ?? [],
  }));
  return { items, total: countRows[0]?.n ?? 0 };
}

type ReviewQueueItem = { slug: string; title: string; revision: number; author: PersonRef; submittedAt: string; isEdit: boolean };

/** Revisions waiting for a lead. */
export async function listReviewQueue(user: SessionUser): Promise<ReviewQueueItem[]> {
  assertCan(user, "technique:review");
  const rows = await getDb()
    .select({ t: techniques, r: revisions })
    .from(revisions)
    .innerJoin(techniques, eq(techniques.id, revisions.techniqueId))
    .where(and(eq(revisions.state, "in_review"), eq(revisions.id, techniques.latestRevisionId)))
    .orderBy(asc(revisions.createdAt));
  const names = await people(rows.map((x) => x.r.authorId));
  return rows.map(({ t, r }) => ({
    slug: t.slug,
    title: r.title,
    revision: r.number,
    author: ref(names, r.authorId),
    submittedAt: r.createdAt.toISOString(),
    isEdit: t.approvedRevisionId !== null,
  }));
}

export type ReviewItem = {
  slug: string;
  title: string;
  /** The newest revision: waiting for review when `isWaiting`. */
  pending: RevisionSummary;
  isWaiting: boolean;
  approvedRevision: number | null;
  /** What the review compares with: the approved revision, else the last one sent back, else 0 (nothing). */
  compareWith: number;
};

/** What a lead needs to review a technique's waiting revision (leads only). */
export async function getReviewItem(user: SessionUser, slug: string): Promise<ReviewItem> {
  assertCan(user, "technique:review");
  const { technique: t, renamedFrom: _renamed } = await requireVisibleTechnique(user, slug);
  const db = getDb();
  const rows = await db.select().from(revisions).where(eq(revisions.techniqueId, t.id)).orderBy(desc(revisions.number));
  const latest = rows.find((r) => r.id === t.latestRevisionId) ?? rows[0]!;
  const approved = rows.find((r) => r.id === t.approvedRevisionId) ?? null;
  const sentBack = rows.find((r) => r.number < latest.number && r.state === "returned");
  const names = await people([latest.authorId, latest.reviewedById]);
  return {
    slug: t.slug,
    title: latest.title,
    pending: toRevisionSummary(latest, names),
    isWaiting: latest.state === "in_review",
    approvedRevision: approved?.number ?? null,
    compareWith: approved?.number ?? sentBack?.number ?? 0,
  };
}

export async function countReviewQueue(user: SessionUser): Promise<number> {
  if (!can(user, "technique:review")) return 0;
  const [row] = await getDb()
    .select({ n: sql<number>`count(*)`.mapWith(Number) })
    .from(revisions)
    .innerJoin(techniques, eq(techniques.id, revisions.techniqueId))
    .where(and(eq(revisions.state, "in_review"), eq(revisions.id, techniques.latestRevisionId)));
  return row?.n ?? 0;
}

type MyDraftItem = { slug: string; title: string; revision: number; state: Revision["state"]; reviewNote: string | null; updatedAt: string };

/** A writer's own unfinished revisions: drafts, and revisions a lead sent back. */
export async function listMyDrafts(user: SessionUser): Promise<MyDraftItem[]> {
  if (!can(user, "technique:write")) return [];
  const rows = await getDb()
    .select({ t: techniques, r: revisions })
    .from(revisions)
    .innerJoin(techniques, eq(techniques.id, revisions.techniqueId))
    .where(and(eq(revisions.authorId, user.id), eq(revisions.id, techniques.latestRevisionId), inArray(revisions.state, ["draft", "returned", "in_review"])))
    .orderBy(desc(revisions.createdAt));
  return rows.map(({ t, r }) => ({ slug: t.slug, title: r.title, revision: r.number, state: r.state, reviewNote: r.reviewNote, updatedAt: r.createdAt.toISOString() }));
}

export async function listRevisions(user: SessionUser, slug: string): Promise<{ slug: string; title: string; items: RevisionSummary[] }> {
  const { technique, revision } = await requireVisibleTechnique(user, slug);
  const conditions = [eq(revisions.techniqueId, technique.id)];
  // Readers see the approved history only; unpublished wording stays with writers and leads.
  if (!readsWorkingCopy(user)) conditions.push(eq(revisions.state, "approved"));
  const rows = await getDb().select().from(revisions).where(and(...conditions)).orderBy(desc(revisions.number));
  const names = await people(rows.flatMap((r) => [r.authorId, r.reviewedById]));
  return { slug: technique.slug, title: revision.title, items: rows.map((r) => toRevisionSummary(r, names)) };
}

export async function getRevisionsByNumber(user: SessionUser, slug: string, numbers: number[]): Promise<Revision[]> {
  const { technique } = await requireVisibleTechnique(user, slug);
  const rows = await getDb()
    .select()
    .from(revisions)
    .where(and(eq(revisions.techniqueId, technique.id), inArray(revisions.number, numbers)));
  const visible = readsWorkingCopy(user) ? rows : rows.filter((r) => r.state === "approved");
  return numbers.map((n) => {
    const r = visible.find((x) => x.number === n);
    if (!r) throw new AppError("not_found", `No revision ${n} of this technique.`);
    return r;
  });
}

/** The current department method of each of these problem tags (by tag slug), as readers know it. */
export async function listDepartmentMethods(tagSlugs: string[]): Promise<Record<string, { slug: string; title: string }>> {
  if (!tagSlugs.length) return {};
  const rows = await getDb()
    .select({ tag: tags.slug, slug: techniques.slug, title: revisions.title })
    .from(houseMethods)
    .innerJoin(tags, eq(tags.id, houseMethods.tagId))
    .innerJoin(techniques, eq(techniques.id, houseMethods.techniqueId))
    .innerJoin(revisions, eq(revisions.id, techniques.approvedRevisionId))
    .where(inArray(tags.slug, tagSlugs));
  return Object.fromEntries(rows.map((r) => [r.tag, { slug: r.slug, title: r.title }]));
}
