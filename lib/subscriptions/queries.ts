import "server-only";
import { and, asc, eq, inArray } from "drizzle-orm";
import { getDb } from "@/db/client";
import { revisions, shows, subscriptions, tags, techniques, users, type Subscription } from "@/db/schema";
import { assertCan } from "@/lib/auth/permissions";
import type { SessionUser } from "@/lib/auth/roles";
import type { SubscriptionKind, SubscriptionListResponse, SubscriptionResponse } from "@/lib/subscriptions/schemas";

/** Human names for subscription keys; a key whose target has gone keeps the key as its label. */
export async function labelsFor(rows: Pick<Subscription, "kind" | "key">[]): Promise<Map<string, string>> {
  const db = getDb();
  const labels = new Map<string, string>();
  const keysOf = (kind: SubscriptionKind) => [...new Set(rows.filter((r) => r.kind === kind).map((r) => r.key))];
  const techniqueKeys = keysOf("technique");
  const tagKeys = keysOf("tag");
  const showKeys = keysOf("show");
  if (techniqueKeys.length > 0) {
    // Readers know a technique by its approved title; before approval by its latest draft's.
    const approved = await db
      .select({ slug: techniques.slug, title: revisions.title })
      .from(techniques)
      .innerJoin(revisions, eq(revisions.id, techniques.approvedRevisionId))
      .where(inArray(techniques.slug, techniqueKeys));
    const latest = await db
      .select({ slug: techniques.slug, title: revisions.title })
      .from(techniques)
      .innerJoin(revisions, eq(revisions.id, techniques.latestRevisionId))
      .where(inArray(techniques.slug, techniqueKeys));
    for (const r of latest) labels.set(`technique:${r.slug}`, r.title);
    for (const r of approved) labels.set(`technique:${r.slug}`, r.title);
  }
  if (tagKeys.length > 0) {
    for (const t of await db.select({ slug: tags.slug, name: tags.name }).from(tags).where(inArray(tags.slug, tagKeys))) labels.set(`tag:${t.slug}`, t.name);
  }
  if (showKeys.length > 0) {
    for (const s of await db.select({ code: shows.code, name: shows.name }).from(shows).where(inArray(shows.code, showKeys))) labels.set(`show:${s.code}`, `${s.code} · ${s.name}`);
  }
  return labels;
}

export function toSubscriptionResponse(row: Subscription, labels: Map<string, string>): SubscriptionResponse {
  return {
    id: row.id,
    target: { kind: row.kind, key: row.key },
    mode: row.mode,
    label: labels.get(`${row.kind}:${row.key}`) ?? row.key,
    createdAt: row.createdAt.toISOString(),
  };
}

/** The acting person's own subscriptions and mail mode (settings page, GET /api/subscriptions). */
export async function listSubscriptions(actor: SessionUser): Promise<SubscriptionListResponse> {
  assertCan(actor, "subscription:manage");
  const db = getDb();
  const rows = await db.select().from(subscriptions).where(eq(subscriptions.userId, actor.id)).orderBy(asc(subscriptions.kind), asc(subscriptions.key));
  const [me] = await db.select({ mailMode: users.mailMode }).from(users).where(eq(users.id, actor.id)).limit(1);
  const labels = await labelsFor(rows);
  return { items: rows.map((r) => toSubscriptionResponse(r, labels)), mailMode: me?.mailMode ?? "immediate" };
}

export async function getSubscription(actor: SessionUser, kind: SubscriptionKind, key: string): Promise<SubscriptionResponse | null> {
  assertCan(actor, "subscription:manage");
  const [row] = await getDb()
    .select()
    .from(subscriptions)
    .where(and(eq(subscriptions.userId, actor.id), eq(subscriptions.kind, kind), eq(subscriptions.key, key)))
    .limit(1);
  if (!row) return null;
  return toSubscriptionResponse(row, await labelsFor([row]));
}

/** For the follow button on technique, tag and show pages. */
export async function isSubscribed(actor: SessionUser, kind: SubscriptionKind, key: string): Promise<boolean> {
  return (await getSubscription(actor, kind, key)) !== null;
}
