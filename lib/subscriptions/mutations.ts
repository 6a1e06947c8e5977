import "server-only";
import { and, eq, sql } from "drizzle-orm";
import { getDb, type Database } from "@/db/client";
import { shows, subscriptions, tags, techniqueSlugHistory, techniques, users } from "@/db/schema";
import { AppError } from "@/lib/api/errors";
import { assertCan, can } from "@/lib/auth/permissions";
import type { SessionUser } from "@/lib/auth/roles";
import { writeAudit } from "@/lib/audit/log";
import { labelsFor, toSubscriptionResponse } from "@/lib/subscriptions/queries";
import type { MailMode, SubscribeInput, SubscriptionResponse, SubscriptionTarget } from "@/lib/subscriptions/schemas";

/**
 * The canonical key of an existing target, or not_found. Slugs and codes match regardless of
 * case; an old technique slug resolves to the current one. People who may not read drafts
 * cannot follow one (it would reveal that it exists).
 */
async function resolveTarget(db: Pick<Database, "select">, actor: SessionUser, target: SubscriptionTarget): Promise<SubscriptionTarget> {
  const key = target.key.trim();
  if (target.kind === "technique") {
    let [row] = await db
      .select({ slug: techniques.slug, status: techniques.status })
      .from(techniques)
      .where(sql`lower(${techniques.slug}) = lower(${key})`)
      .limit(1);
    if (!row) {
      [row] = await db
        .select({ slug: techniques.slug, status: techniques.status })
        .from(techniqueSlugHistory)
        .innerJoin(techniques, eq(techniques.id, techniqueSlugHistory.techniqueId))
        .where(sql`lower(${techniqueSlugHistory.slug}) = lower(${key})`)
        .limit(1);
    }
    const readable = row && (row.status === "approved" || row.status === "retired" || can(actor, "technique:read-working"));
    if (!row || !readable) throw new AppError("not_found", "No such technique.");
    return { kind: "technique", key: row.slug };
  }
  if (target.kind === "tag") {
    const [row] = await db.select({ slug: tags.slug }).from(tags).where(sql`lower(${tags.slug}) = lower(${key})`).limit(1);
    if (!row) throw new AppError("not_found", "No such tag.");
    return { kind: "tag", key: row.slug };
  }
  const [row] = await db.select({ code: shows.code }).from(shows).where(sql`lower(${shows.code}) = lower(${key})`).limit(1);
  if (!row) throw new AppError("not_found", "No such show.");
  return { kind: "show", key: row.code };
}

/** Follows a technique, tag or show; following again only changes the mode. */
export async function subscribe(actor: SessionUser, input: SubscribeInput): Promise<SubscriptionResponse> {
  assertCan(actor, "subscription:manage");
  const db = getDb();
  const target = await resolveTarget(db, actor, input.target);
  let mode: MailMode | undefined = input.mode;
  if (!mode) {
    const [me] = await db.select({ mailMode: users.mailMode }).from(users).where(eq(users.id, actor.id)).limit(1);
    mode = me?.mailMode ?? "immediate";
  }
  const [row] = await db
    .insert(subscriptions)
    .values({ userId: actor.id, kind: target.kind, key: target.key, mode })
    .onConflictDoUpdate({ target: [subscriptions.userId, subscriptions.kind, subscriptions.key], set: { mode } })
    .returning();
  if (!row) throw new AppError("internal");
  return toSubscriptionResponse(row, await labelsFor([row]));
}

/** Stops following; unfollowing what one does not follow is not an error (the button may be stale). */
export async function unsubscribe(actor: SessionUser, target: SubscriptionTarget): Promise<{ removed: boolean }> {
  assertCan(actor, "subscription:manage");
  const key = target.key.trim();
  const removed = await getDb()
    .delete(subscriptions)
    .where(
      and(
        eq(subscriptions.userId, actor.id),
        eq(subscriptions.kind, target.kind),
        // Keys are stored canonical (resolveTarget); match the way subscribe() looked them up.
        sql`lower(${subscriptions.key}) = lower(${key})`,
      ),
    )
    .returning({ id: subscriptions.id });
  return { removed: removed.length > 0 };
}

/** Immediate mail or a daily digest, for everything the person follows (and what they follow later). */
export async function setMailMode(actor: SessionUser, mode: MailMode): Promise<{ mailMode: MailMode }> {
  assertCan(actor, "subscription:manage");
  await getDb().transaction(async (tx) => {
    await tx.update(users).set({ mailMode: mode, updatedAt: new Date() }).where(eq(users.id, actor.id));
    await tx.update(subscriptions).set({ mode }).where(eq(subscriptions.userId, actor.id));
    await writeAudit(tx, { actorId: actor.id, action: "subscription.mail-mode", targetType: "user", targetId: actor.id, detail: { mode } });
  });
  return { mailMode: mode };
}

/**
 * Authors follow their own technique from its first save, in the mail mode they chose; following
 * it already (or having chosen otherwise since) is left as it is. Call in the creating transaction.
 */
export async function followOwnTechnique(tx: Pick<Database, "insert" | "select">, userId: string, slug: string): Promise<void> {
  const [me] = await tx.select({ mailMode: users.mailMode }).from(users).where(eq(users.id, userId)).limit(1);
  await tx
    .insert(subscriptions)
    .values({ userId, kind: "technique", key: slug, mode: me?.mailMode ?? "immediate" })
    .onConflictDoNothing();
}

/**
 * Call in the transaction that renames a technique's slug: subscriptions are keyed by slug, so
 * without this the followers of the old slug would stop hearing about it.
 */
export async function renameTechniqueSubscriptions(tx: Pick<Database, "update">, oldSlug: string, newSlug: string): Promise<void> {
  if (oldSlug === newSlug) return;
  await tx.update(subscriptions).set({ key: newSlug }).where(and(eq(subscriptions.kind, "technique"), eq(subscriptions.key, oldSlug)));
}
