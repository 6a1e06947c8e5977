import "server-only";
import { and, eq, inArray, ne, sql } from "drizzle-orm";
import { getDb, type Database } from "@/db/client";
import { houseMethods, revisions, stillPairs, tags, techniqueRequests, techniqueSlugHistory, techniques, users, type Revision, type Technique } from "@/db/schema";
import { AppError } from "@/lib/api/errors";
import { assertCan } from "@/lib/auth/permissions";
import type { SessionUser } from "@/lib/auth/roles";
import { writeAudit } from "@/lib/audit/log";
import { notifyDepartmentMethod, notifyLeads, notifyPerson, notifyTechniqueEvent, techniqueUrl } from "@/lib/mail/events";
import { revisionReviewedMail, reviewWaitingMail } from "@/lib/mail/templates";
import { baseUrl } from "@/lib/env";
import { emptyDocument, type TechniqueDocument } from "@/lib/techniques/document";
import { documentToPlainText } from "@/lib/techniques/plain-text";
import { findTechniqueBySlug } from "@/lib/techniques/queries";
import { slugify } from "@/lib/techniques/slug";
import { reindexTechnique } from "@/lib/techniques/search-sync";
import { followOwnTechnique, renameTechniqueSubscriptions } from "@/lib/subscriptions/mutations";
import type { CreateTechniqueInput, RetireInput, ReviewInput, UpdateTechniqueInput } from "@/lib/techniques/schemas";

type Tx = Parameters<Parameters<Database["transaction"]>[0]>[0];

async function resolveTagIds(tx: Tx, slugs: string[]): Promise<string[]> {
  if (!slugs.length) return [];
  const rows = await tx.select({ id: tags.id, slug: tags.slug }).from(tags).where(inArray(tags.slug, slugs));
  const missing = slugs.filter((s) => !rows.some((r) => r.slug === s));
  if (missing.length) throw new AppError("validation_failed", `Unknown tag: ${missing.join(", ")}.`, { fields: { tags: `Unknown tag: ${missing.join(", ")}` } });
  return slugs.map((s) => rows.find((r) => r.slug === s)!.id);
}

async function tagSlugsOf(tx: Tx, ids: string[]): Promise<string[]> {
  if (!ids.length) return [];
  const rows = await tx.select({ slug: tags.slug }).from(tags).where(inArray(tags.id, ids));
  return rows.map((r) => r.slug);
}

/** A slug not used by any technique now or before. */
async function uniqueSlug(tx: Tx, title: string, exceptTechniqueId?: string): Promise<string> {
  const base = slugify(title);
  for (let n = 1; n < 1000; n++) {
    const candidate = n === 1 ? base : `${base}-${n}`;
    const [current] = await tx.select({ id: techniques.id }).from(techniques).where(eq(techniques.slug, candidate)).limit(1);
    const [old] = await tx.select({ id: techniqueSlugHistory.techniqueId }).from(techniqueSlugHistory).where(eq(techniqueSlugHistory.slug, candidate)).limit(1);
    const takenByOther = (current && current.id !== exceptTechniqueId) || (old && old.id !== exceptTechniqueId);
    if (!takenByOther) return candidate;
  }
  throw new AppError("conflict", "Could not find a free address for this title.");
}

/** Renames the slug, keeping the old one as a redirect. */
async function renameSlug(tx: Tx, technique: Technique, title: string): Promise<string> {
  if (slugify(title) === technique.slug.replace(/-\d+$/, "") || slugify(title) === technique.slug) return technique.slug;
  const slug = await uniqueSlug(tx, title, technique.id);
  if (slug === technique.slug) return slug;
  await tx.delete(techniqueSlugHistory).where(eq(techniqueSlugHistory.slug, slug));
  await tx.insert(techniqueSlugHistory).values({ slug: technique.slug, techniqueId: technique.id }).onConflictDoNothing();
  await tx.update(techniques).set({ slug }).where(eq(techniques.id, technique.id));
  await renameTechniqueSubscriptions(tx, technique.slug, slug);
  return slug;
}

function revisionContent(input: CreateTechniqueInput | UpdateTechniqueInput) {
  const body: TechniqueDocument = input.body ?? emptyDocument();
  return {
    title: input.title,
    summary: input.summary,
    aliases: [...new Set(input.aliases)],
    body,
    bodyText: documentToPlainText(body),
    recipe: input.recipe,
  };
}

async function lockTechnique(tx: Tx, slug: string): Promise<Technique> {
  // Inside a transaction every read goes through tx: PGlite has one connection, so a read
  // through getDb() would wait for this transaction forever.
  const found = await findTechniqueBySlug(slug, tx);
  if (!found) throw new AppError("not_found", "No technique at this address.");
  const [t] = await tx.select().from(techniques).where(eq(techniques.id, found.technique.id)).for("update");
  if (!t) throw new AppError("not_found", "No technique at this address.");
  return t;
}

async function latestRevision(tx: Tx, t: Technique): Promise<Revision> {
  const [r] = await tx.select().from(revisions).where(eq(revisions.id, t.latestRevisionId!)).limit(1);
  if (!r) throw new AppError("internal", undefined, { cause: new Error(`technique ${t.id} has no latest revision`) });
  return r;
}

/** A new revision starts with copies of its base revision's before/after pairs. */
async function copyPairs(tx: Tx, fromRevisionId: string, toRevisionId: string): Promise<void> {
  const pairs = await tx.select().from(stillPairs).where(eq(stillPairs.revisionId, fromRevisionId));
  if (!pairs.length) return;
  await tx.insert(stillPairs).values(
    pairs.map((p) => ({
      techniqueId: p.techniqueId,
      revisionId: toRevisionId,
      beforeStillId: p.beforeStillId,
      afterStillId: p.afterStillId,
      caption: p.caption,
      position: p.position,
      createdAt: p.createdAt,
    })),
  );
}

/**
 * Runs a change to the revision people are working on (its before/after pairs) in one transaction.
 * A draft or sent-back newest revision is changed in place; when the newest is approved or waiting
 * for review, a new draft revision (a copy, with `changeNote`) takes the change, so it goes
 * through review like any other edit and readers keep what was approved.
 */
export async function changeWorkingRevision<T>(
  actor: SessionUser,
  slug: string,
  changeNote: string,
  work: (tx: Tx, revision: Revision, technique: Technique) => Promise<T>,
): Promise<T> {
  assertCan(actor, "technique:write");
  const result = await getDb().transaction(async (tx) => {
    const t = await lockTechnique(tx, slug);
    if (t.status === "retired") throw new AppError("conflict", "This technique is retired; it can no longer be changed.");
    let revision = await latestRevision(tx, t);
    if (revision.state === "approved" || revision.state === "in_review") {
      const { id: _id, number, state: _state, createdAt: _at, reviewedById: _by, reviewedAt: _rat, reviewNote: _note, ...content } = revision;
      const [next] = await tx
        .insert(revisions)
        .values({ ...content, number: number + 1, changeNote, authorId: actor.id, state: "draft" })
        .returning();
      await copyPairs(tx, revision.id, next!.id);
      await tx
        .update(techniques)
        .set({ latestRevisionId: next!.id, updatedAt: new Date(), status: t.approvedRevisionId ? t.status : "draft" })
        .where(eq(techniques.id, t.id));
      await writeAudit(tx, { actorId: actor.id, action: "technique.edit", targetType: "technique", targetId: t.id, detail: { revision: next!.number, changeNote } });
      revision = next!;
    }
    return { id: t.id, value: await work(tx, revision, t) };
  });
  await reindexTechnique(result.id);
  return result.value;
}

/** Seniors and leads write a new technique; it starts as a draft. */
export async function createTechnique(actor: SessionUser, input: CreateTechniqueInput): Promise<{ slug: string; revision: number }> {
  assertCan(actor, "technique:write");
  const result = await getDb().transaction(async (tx) => {
    const tagIds = await resolveTagIds(tx, input.tags);
    const slug = await uniqueSlug(tx, input.title);
    const [t] = await tx.insert(techniques).values({ slug, createdById: actor.id }).returning();
    if (!t) throw new AppError("internal");
    const [r] = await tx
      .insert(revisions)
      .values({ techniqueId: t.id, number: 1, ...revisionContent(input), tagIds, changeNote: "First version.", authorId: actor.id })
      .returning();
    await tx.update(techniques).set({ latestRevisionId: r!.id }).where(eq(techniques.id, t.id));
    if (input.requestId) {
      await tx
        .update(techniqueRequests)
        .set({ status: "claimed", claimedById: actor.id, resolvedByTechniqueId: t.id })
        .where(and(eq(techniqueRequests.id, input.requestId), ne(techniqueRequests.status, "resolved")));
    }
    await followOwnTechnique(tx, actor.id, slug);
    await writeAudit(tx, { actorId: actor.id, action: "technique.create", targetType: "technique", targetId: t.id, detail: { slug, title: input.title } });
    return { id: t.id, slug, revision: 1 };
  });
  await reindexTechnique(result.id);
  return { slug: result.slug, revision: result.revision };
}

/**
 * Saves a new revision. `baseRevision` must be the newest: otherwise someone saved in
 * between and the answer is 409 naming who and when, so nothing is silently overwritten.
 * One rule for new and approved techniques alike: a saved revision is a draft until someone
 * submits it for review (submitTechnique); readers of an approved technique keep the approved one.
 */
export async function updateTechnique(
  actor: SessionUser,
  slug: string,
  input: UpdateTechniqueInput,
  options: { pairsFromRevisionId?: string } = {},
): Promise<{ slug: string; revision: number }> {
  assertCan(actor, "technique:write");
  const result = await getDb().transaction(async (tx) => {
    const t = await lockTechnique(tx, slug);
    if (t.status === "retired") throw new AppError("conflict", "This technique is retired; it can no longer be edited.");
    const latest = await latestRevision(tx, t);
    if (input.baseRevision !== latest.number) {
      const [author] = latest.authorId ? await tx.select({ name: users.name }).from(users).where(eq(users.id, latest.authorId)) : [];
      throw new AppError(
        "conflict",
        `${author?.name ?? "Someone"} saved revision ${latest.number} at ${latest.createdAt.toISOString()} after the revision ${input.baseRevision} you started from. Compare and re-apply your changes.`,
        { details: { latest: { number: latest.number, author: author?.name ?? null, savedAt: latest.createdAt.toISOString() } } },
      );
    }
    const tagIds = await resolveTagIds(tx, input.tags);
    const isEditOfApproved = t.approvedRevisionId !== null;
    const [r] = await tx
      .insert(revisions)
      .values({
        techniqueId: t.id,
        number: latest.number + 1,
        ...revisionContent(input),
        tagIds,
        changeNote: input.changeNote,
        authorId: actor.id,
        state: "draft",
      })
      .returning();
    await copyPairs(tx, options.pairsFromRevisionId ?? latest.id, r!.id);
    const newSlug = isEditOfApproved ? t.slug : await renameSlug(tx, t, input.title);
    await tx
      .update(techniques)
      .set({ latestRevisionId: r!.id, updatedAt: new Date(), status: isEditOfApproved ? t.status : "draft" })
      .where(eq(techniques.id, t.id));
    await writeAudit(tx, {
      actorId: actor.id,
      action: "technique.edit",
      targetType: "technique",
      targetId: t.id,
      detail: { revision: r!.number, changeNote: input.changeNote },
    });
    return { id: t.id, slug: newSlug, revision: r!.number };
  });
  await reindexTechnique(result.id);
  return { slug: result.slug, revision: result.revision };
}

/** Draft (or sent-back) revision → waiting for a lead. */
export async function submitTechnique(actor: SessionUser, slug: string): Promise<{ slug: string; revision: number; state: "in_review" }> {
  assertCan(actor, "technique:submit");
  const result = await getDb().transaction(async (tx) => {
    const t = await lockTechnique(tx, slug);
    const latest = await latestRevision(tx, t);
    if (latest.state === "in_review") throw new AppError("conflict", "This revision is already waiting for review.");
    if (latest.state === "approved") throw new AppError("conflict", "This revision is already approved; edit it to make a new one.");
    await tx.update(revisions).set({ state: "in_review" }).where(eq(revisions.id, latest.id));
    if (t.approvedRevisionId === null) await tx.update(techniques).set({ status: "in_review", updatedAt: new Date() }).where(eq(techniques.id, t.id));
    await writeAudit(tx, { actorId: actor.id, action: "technique.submit", targetType: "technique", targetId: t.id, detail: { revision: latest.number } });
    const isEdit = t.approvedRevisionId !== null;
    const technique = { slug: t.slug, title: latest.title };
    const link = reviewUrl(t.slug);
    await notifyLeads(tx, {
      kind: "review-waiting",
      actorId: actor.id,
      title: `${latest.title}: revision ${latest.number} waits for review`,
      summary: isEdit ? latest.changeNote : `New technique by ${actor.name}.`,
      link,
      mail: (name) => reviewWaitingMail({ name, technique, revisionNumber: latest.number, author: actor.name, isEdit, changeNote: latest.changeNote, link }),
    });
    return { id: t.id, slug: t.slug, revision: latest.number };
  });
  await reindexTechnique(result.id);
  return { slug: result.slug, revision: result.revision, state: "in_review" };
}

/** A lead approves the waiting revision (readers switch to it) or sends it back with a note. */
export async function reviewTechnique(actor: SessionUser, slug: string, input: ReviewInput): Promise<{ slug: string; revision: number; state: "approved" | "returned" }> {
  assertCan(actor, "technique:review");
  const result = await getDb().transaction(async (tx) => {
    const t = await lockTechnique(tx, slug);
    const latest = await latestRevision(tx, t);
    if (input.revision !== latest.number) throw new AppError("conflict", `Revision ${input.revision} is no longer the newest (${latest.number} is). Review the newest one.`);
    if (latest.state !== "in_review") throw new AppError("conflict", "This revision is not waiting for review.");
    const now = new Date();
    if (input.decision === "return") {
      await tx.update(revisions).set({ state: "returned", reviewedById: actor.id, reviewedAt: now, reviewNote: input.note ?? "" }).where(eq(revisions.id, latest.id));
      if (t.approvedRevisionId === null) await tx.update(techniques).set({ status: "draft", updatedAt: now }).where(eq(techniques.id, t.id));
      await writeAudit(tx, { actorId: actor.id, action: "technique.return", targetType: "technique", targetId: t.id, detail: { revision: latest.number, note: input.note } });
      await tellAuthorOfReview(tx, actor, latest, t.slug, "return", input.note ?? null);
      return { id: t.id, slug: t.slug, revision: latest.number, state: "returned" as const };
    }
    const [previous] = t.approvedRevisionId ? await tx.select({ number: revisions.number }).from(revisions).where(eq(revisions.id, t.approvedRevisionId)) : [];
    await tx.update(revisions).set({ state: "approved", reviewedById: actor.id, reviewedAt: now, reviewNote: input.note ?? null }).where(eq(revisions.id, latest.id));
    const slugNow = await renameSlug(tx, t, latest.title);
    await tx
      .update(techniques)
      .set({ approvedRevisionId: latest.id, status: t.status === "retired" ? "retired" : "approved", lastApprovedAt: now, updatedAt: now })
      .where(eq(techniques.id, t.id));
    const tagSlugs = await tagSlugsOf(tx, latest.tagIds);
    const technique = { slug: slugNow, title: latest.title, tagSlugs };
    await tellAuthorOfReview(tx, actor, latest, slugNow, "approve", input.note ?? null);
    // The revision's author heard in their own message above, not again as a follower.
    const skipUserIds = latest.authorId ? [latest.authorId] : [];
    if (previous) {
      await notifyTechniqueEvent(tx, {
        kind: "revision-approved",
        skipUserIds,
        actorId: actor.id,
        technique,
        revisionNumber: latest.number,
        previousApprovedNumber: previous.number,
        changeNote: latest.changeNote,
      });
    } else {
      await notifyTechniqueEvent(tx, { kind: "new-approved-under-tag", skipUserIds, actorId: actor.id, technique });
      await resolveRequestsFor(tx, actor, t.id, technique);
    }
    await writeAudit(tx, { actorId: actor.id, action: "technique.approve", targetType: "technique", targetId: t.id, detail: { revision: latest.number } });
    return { id: t.id, slug: slugNow, revision: latest.number, state: "approved" as const };
  });
  await reindexTechnique(result.id);
  return { slug: result.slug, revision: result.revision, state: result.state };
}

/** Where a lead reviews a waiting revision: its changes against the approved one, and the decision. */
function reviewUrl(slug: string): string {
  return `${techniqueUrl(slug)}/review`;
}

/** The author of a reviewed revision hears the decision, with the lead's note (never about their own review). */
async function tellAuthorOfReview(tx: Tx, actor: SessionUser, revision: Revision, slug: string, decision: "approve" | "return", note: string | null) {
  if (!revision.authorId) return;
  const technique = { slug, title: revision.title };
  const link = decision === "approve" ? techniqueUrl(slug) : `${techniqueUrl(slug)}/edit`;
  await notifyPerson(tx, {
    kind: "revision-reviewed",
    actorId: actor.id,
    toUserId: revision.authorId,
    title: `${revision.title}: revision ${revision.number} ${decision === "approve" ? "approved" : "sent back"} by ${actor.name}`,
    summary: note ?? "",
    link,
    mail: (name) => revisionReviewedMail({ name, technique, revisionNumber: revision.number, decision, reviewer: actor.name, note, link }),
  });
}

async function resolveRequestsFor(tx: Tx, actor: SessionUser, techniqueId: string, technique: { slug: string; title: string }) {
  const resolved = await tx
    .update(techniqueRequests)
    .set({ status: "resolved", resolvedAt: new Date() })
    .where(and(eq(techniqueRequests.resolvedByTechniqueId, techniqueId), ne(techniqueRequests.status, "resolved")))
    .returning();
  for (const request of resolved) {
    if (!request.requesterId) continue;
    await notifyPerson(tx, {
      kind: "request-resolved",
      actorId: actor.id,
      toUserId: request.requesterId,
      title: technique.title,
      link: `${baseUrl()}/techniques/${technique.slug}`,
      summary: `Your request "${request.query}" now has an approved write-up.`,
    });
  }
}

/** Retires a technique, optionally pointing to the approved technique that replaces it. */
export async function retireTechnique(actor: SessionUser, slug: string, input: RetireInput): Promise<{ slug: string; status: "retired" }> {
  assertCan(actor, "technique:retire");
  const result = await getDb().transaction(async (tx) => {
    const t = await lockTechnique(tx, slug);
    if (t.status === "retired") throw new AppError("conflict", "This technique is already retired.");
    let replacement: { id: string; slug: string; title: string } | null = null;
    if (input.supersededBy) {
      const found = await findTechniqueBySlug(input.supersededBy, tx);
      if (!found || !found.technique.approvedRevisionId || found.technique.status !== "approved") {
        throw new AppError("validation_failed", "The replacement must be an approved technique.", { fields: { supersededBy: "Choose an approved technique." } });
      }
      if (found.technique.id === t.id) throw new AppError("validation_failed", "A technique cannot replace itself.", { fields: { supersededBy: "Choose another technique." } });
      const [r] = await tx.select({ title: revisions.title }).from(revisions).where(eq(revisions.id, found.technique.approvedRevisionId));
      replacement = { id: found.technique.id, slug: found.technique.slug, title: r?.title ?? found.technique.slug };
    }
    const now = new Date();
    await tx
      .update(techniques)
      .set({ status: "retired", retiredAt: now, retiredById: actor.id, retireNote: input.note ?? null, supersededById: replacement?.id ?? null, updatedAt: now })
      .where(eq(techniques.id, t.id));
    // A retired technique is nobody's approved method any more.
    await tx.delete(houseMethods).where(eq(houseMethods.techniqueId, t.id));
    const shown = t.approvedRevisionId ?? t.latestRevisionId!;
    const [r] = await tx.select().from(revisions).where(eq(revisions.id, shown));
    if (t.approvedRevisionId) {
      await notifyTechniqueEvent(tx, {
        kind: "technique-retired",
        actorId: actor.id,
        technique: { slug: t.slug, title: r?.title ?? t.slug, tagSlugs: await tagSlugsOf(tx, r?.tagIds ?? []) },
        supersededBy: replacement ? { slug: replacement.slug, title: replacement.title } : null,
        note: input.note ?? null,
      });
    }
    await writeAudit(tx, { actorId: actor.id, action: "technique.retire", targetType: "technique", targetId: t.id, detail: { supersededBy: replacement ? { slug: replacement.slug, title: replacement.title } : null, note: input.note } });
    return { id: t.id, slug: t.slug };
  });
  await reindexTechnique(result.id);
  return { slug: result.slug, status: "retired" };
}

/** Title of a technique as readers know it (approved revision), else its newest. */
async function titleOf(tx: Tx, t: Pick<Technique, "approvedRevisionId" | "latestRevisionId" | "slug">): Promise<string> {
  const id = t.approvedRevisionId ?? t.latestRevisionId;
  const [r] = id ? await tx.select({ title: revisions.title }).from(revisions).where(eq(revisions.id, id)) : [];
  return r?.title ?? t.slug;
}

/**
 * Marks (or clears) the department's approved method for a problem tag. `replaces` is the method
 * the lead saw and agreed to replace (slug, or null for none): when given and no longer true,
 * the answer is 409 rather than a silent swap. Both methods go into the audit log, and people
 * following the problem hear of a new method.
 */
export async function setHouseMethod(actor: SessionUser, tagSlug: string, techniqueSlug: string | null, options: { replaces?: string | null } = {}): Promise<void> {
  assertCan(actor, "technique:set-house-method");
  const changed = await getDb().transaction(async (tx) => {
    const [tag] = await tx.select().from(tags).where(eq(tags.slug, tagSlug)).limit(1);
    if (!tag) throw new AppError("not_found", "No such tag.");
    if (tag.kind !== "problem") throw new AppError("validation_failed", "Approved methods are chosen for problem tags.", { fields: { tag: "Choose a problem tag." } });
    const [before] = await tx.select().from(houseMethods).where(eq(houseMethods.tagId, tag.id)).for("update");
    const [current] = before ? await tx.select().from(techniques).where(eq(techniques.id, before.techniqueId)) : [];
    const replaced = current ? { slug: current.slug, title: await titleOf(tx, current) } : null;
    if (options.replaces !== undefined && (options.replaces ?? null) !== (replaced?.slug ?? null)) {
      throw new AppError(
        "conflict",
        replaced
          ? `The department method for ${tag.name} changed meanwhile: it is now "${replaced.title}". Look again before replacing it.`
          : `${tag.name} has no department method any more. Look again before choosing one.`,
      );
    }
    if (techniqueSlug === null) {
      await tx.delete(houseMethods).where(eq(houseMethods.tagId, tag.id));
      await writeAudit(tx, { actorId: actor.id, action: "tag.house-method.clear", targetType: "tag", targetId: tag.id, detail: { tag: tag.name, replaced } });
      return [before?.techniqueId].filter((x): x is string => Boolean(x));
    }
    const found = await findTechniqueBySlug(techniqueSlug, tx);
    if (!found || found.technique.status !== "approved" || !found.technique.approvedRevisionId) {
      throw new AppError("validation_failed", "Only an approved technique can be the department's method.", { fields: { technique: "Choose an approved technique." } });
    }
    const [r] = await tx.select({ tagIds: revisions.tagIds, title: revisions.title }).from(revisions).where(eq(revisions.id, found.technique.approvedRevisionId));
    if (!r?.tagIds.includes(tag.id)) {
      throw new AppError("validation_failed", `The technique is not tagged "${tag.name}".`, { fields: { technique: "Tag the technique with this problem first." } });
    }
    if (before?.techniqueId === found.technique.id) return [];
    await tx
      .insert(houseMethods)
      .values({ tagId: tag.id, techniqueId: found.technique.id, setById: actor.id })
      .onConflictDoUpdate({ target: houseMethods.tagId, set: { techniqueId: found.technique.id, setById: actor.id, setAt: new Date() } });
    const technique = { slug: found.technique.slug, title: r.title };
    await writeAudit(tx, {
      actorId: actor.id,
      action: "tag.house-method.set",
      targetType: "tag",
      targetId: tag.id,
      detail: { tag: tag.name, technique: technique.slug, title: technique.title, replaced },
    });
    await notifyDepartmentMethod(tx, { actorId: actor.id, actorName: actor.name, tag: { slug: tag.slug, name: tag.name }, technique, replaced });
    return [before?.techniqueId, found.technique.id].filter((x): x is string => Boolean(x));
  });
  for (const id of new Set(changed)) await reindexTechnique(id);
}

/** Copies an older revision's content into a new revision (history's "restore"). */
export async function restoreRevision(actor: SessionUser, slug: string, number: number, baseRevision: number): Promise<{ slug: string; revision: number }> {
  assertCan(actor, "technique:write");
  const [old] = await getDb()
    .select({ r: revisions })
    .from(revisions)
    .innerJoin(techniques, eq(techniques.id, revisions.techniqueId))
    .where(and(eq(techniques.id, (await findTechniqueBySlug(slug))?.technique.id ?? sql`null`), eq(revisions.number, number)));
  if (!old) throw new AppError("not_found", `No revision ${number} of this technique.`);
  const tagRows = old.r.tagIds.length ? await getDb().select({ slug: tags.slug }).from(tags).where(inArray(tags.id, old.r.tagIds)) : [];
  return updateTechnique(
    actor,
    slug,
    {
    title: old.r.title,
    summary: old.r.summary,
    aliases: old.r.aliases,
    tags: tagRows.map((t) => t.slug),
    body: old.r.body as TechniqueDocument,
    recipe: old.r.recipe as UpdateTechniqueInput["recipe"],
    baseRevision,
    changeNote: `Restored revision ${number}.`,
    },
    // Restoring brings back that revision's before/after pairs with its text.
    { pairsFromRevisionId: old.r.id },
  );
}
