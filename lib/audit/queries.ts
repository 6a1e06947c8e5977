import "server-only";
import { and, desc, eq, gte, inArray, lt, sql, type SQL } from "drizzle-orm";
import { getDb } from "@/db/client";
import { auditLog, shots, shows, tags, techniques, revisions, users } from "@/db/schema";
import { assertCan } from "@/lib/auth/permissions";
import type { SessionUser } from "@/lib/auth/roles";
import { describeAuditEntry, type AuditNames, type SentencePart } from "@/lib/audit/describe";

type AuditEntryResponse = {
  id: number;
  at: string;
  actor: { id: string; name: string } | null;
  action: string;
  targetType: string;
  targetId: string | null;
  detail: Record<string, unknown>;
  /** The entry in words, with links to what it names. */
  sentence: SentencePart[];
};

export type AuditFilter = {
  /** Only what this person did. */
  actorId?: string;
  /** Only these actions. */
  actions?: string[];
  /** From this UTC day on (YYYY-MM-DD), inclusive. */
  from?: string;
  /** Up to this UTC day (YYYY-MM-DD), inclusive. */
  to?: string;
};

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
const asUuid = (v: unknown): string | null => (typeof v === "string" && UUID.test(v) ? v : null);
const nextDay = (day: string) => new Date(Date.parse(`${day}T00:00:00Z`) + 86_400_000);

/** Newest first, filtered and paged in the database; admins only. */
export async function listAudit(
  actor: SessionUser,
  options: AuditFilter & { limit: number; offset: number },
): Promise<{ items: AuditEntryResponse[]; total: number }> {
  assertCan(actor, "audit:read");
  const db = getDb();
  const conditions: SQL[] = [];
  if (options.actorId) conditions.push(eq(auditLog.actorId, options.actorId));
  if (options.actions?.length) conditions.push(inArray(auditLog.action, options.actions));
  if (options.from) conditions.push(gte(auditLog.at, new Date(`${options.from}T00:00:00Z`)));
  if (options.to) conditions.push(lt(auditLog.at, nextDay(options.to)));
  const where = conditions.length ? and(...conditions) : undefined;
  const [rows, [count]] = await Promise.all([
    db
      .select({ entry: auditLog, actorName: users.name })
      .from(auditLog)
      .leftJoin(users, eq(users.id, auditLog.actorId))
      .where(where)
      .orderBy(desc(auditLog.id))
      .limit(options.limit)
      .offset(options.offset),
    db.select({ n: sql<number>`count(*)`.mapWith(Number) }).from(auditLog).where(where),
  ]);
  const names = await resolveNames(rows.map((r) => r.entry));
  return {
    total: count?.n ?? 0,
    items: rows.map(({ entry, actorName }) => {
      const actorRef = entry.actorId ? { id: entry.actorId, name: actorName ?? "(removed)" } : null;
      return {
        id: entry.id,
        at: entry.at.toISOString(),
        actor: actorRef,
        action: entry.action,
        targetType: entry.targetType,
        targetId: entry.targetId,
        detail: entry.detail,
        sentence: describeAuditEntry(entry, names(entry, actorRef)),
      };
    }),
  };
}

type Entry = typeof auditLog.$inferSelect;

/** Looks up, in a few queries for the whole page, the techniques, tags, shows, people and shots the entries name. */
async function resolveNames(entries: Entry[]): Promise<(entry: Entry, actor: { name: string } | null) => AuditNames> {
  const db = getDb();
  const ids = (pick: (e: Entry) => unknown) => [...new Set(entries.map(pick).map(asUuid).filter((x): x is string => x !== null))];
  const techniqueIdOf = (e: Entry) => (e.targetType === "technique" ? e.targetId : (e.detail.techniqueId ?? null));
  const techniqueIds = ids(techniqueIdOf);
  const tagIds = ids((e) => (e.targetType === "tag" ? e.targetId : null));
  const showIds = ids((e) => (e.targetType === "show" ? e.targetId : null));
  const personIds = ids((e) => (e.targetType === "user" ? e.targetId : null));
  const shotIds = ids((e) => e.detail.shotId);
  const [techniqueRows, tagRows, showRows, personRows, shotRows] = await Promise.all([
    techniqueIds.length
      ? db
          .select({ id: techniques.id, slug: techniques.slug, title: revisions.title })
          .from(techniques)
          .innerJoin(revisions, eq(revisions.id, sql`coalesce(${techniques.approvedRevisionId}, ${techniques.latestRevisionId})`))
          .where(inArray(techniques.id, techniqueIds))
      : [],
    tagIds.length ? db.select({ id: tags.id, slug: tags.slug, name: tags.name, kind: tags.kind }).from(tags).where(inArray(tags.id, tagIds)) : [],
    showIds.length ? db.select({ id: shows.id, code: shows.code, name: shows.name }).from(shows).where(inArray(shows.id, showIds)) : [],
    personIds.length ? db.select({ id: users.id, name: users.name }).from(users).where(inArray(users.id, personIds)) : [],
    shotIds.length ? db.select({ id: shots.id, code: shots.code }).from(shots).where(inArray(shots.id, shotIds)) : [],
  ]);
  const byId = <T extends { id: string }>(rows: T[]) => new Map(rows.map((r) => [r.id, r]));
  const [t, g, s, p, h] = [byId(techniqueRows), byId(tagRows), byId(showRows), byId(personRows), byId(shotRows)];
  return (entry, actor) => {
    const techniqueId = asUuid(techniqueIdOf(entry));
    const shotId = asUuid(entry.detail.shotId);
    return {
      actor,
      technique: techniqueId ? (t.get(techniqueId) ?? null) : null,
      tag: entry.targetType === "tag" && entry.targetId ? (g.get(entry.targetId) ?? null) : null,
      show: entry.targetType === "show" && entry.targetId ? (s.get(entry.targetId) ?? null) : null,
      person: entry.targetType === "user" && entry.targetId ? (p.get(entry.targetId) ?? null) : null,
      shot: shotId ? (h.get(shotId) ?? null) : null,
    };
  };
}

/** Everyone who appears in the log as its actor, for the person filter. */
export async function listAuditActors(actor: SessionUser): Promise<{ id: string; name: string }[]> {
  assertCan(actor, "audit:read");
  return getDb()
    .selectDistinct({ id: users.id, name: users.name })
    .from(auditLog)
    .innerJoin(users, eq(users.id, auditLog.actorId))
    .orderBy(users.name);
}
