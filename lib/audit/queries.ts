import "server-only";
import { desc, eq, sql } from "drizzle-orm";
import { getDb } from "@/db/client";
import { auditLog, users } from "@/db/schema";
import { assertCan } from "@/lib/auth/permissions";
import type { SessionUser } from "@/lib/auth/roles";

type AuditEntryResponse = {
  id: number;
  at: string;
  actor: { id: string; name: string } | null;
  action: string;
  targetType: string;
  targetId: string | null;
  detail: Record<string, unknown>;
};

/** Newest first; admins only. */
export async function listAudit(actor: SessionUser, options: { limit: number; offset: number }): Promise<{ items: AuditEntryResponse[]; total: number }> {
  assertCan(actor, "audit:read");
  const db = getDb();
  const [rows, [count]] = await Promise.all([
    db
      .select({ entry: auditLog, actorName: users.name })
      .from(auditLog)
      .leftJoin(users, eq(users.id, auditLog.actorId))
      .orderBy(desc(auditLog.id))
      .limit(options.limit)
      .offset(options.offset),
    db.select({ n: sql<number>`count(*)`.mapWith(Number) }).from(auditLog),
  ]);
  return {
    total: count?.n ?? 0,
    items: rows.map(({ entry, actorName }) => ({
      id: entry.id,
      at: entry.at.toISOString(),
      actor: entry.actorId ? { id: entry.actorId, name: actorName ?? "(removed)" } : null,
      action: entry.action,
      targetType: entry.targetType,
      targetId: entry.targetId,
      detail: entry.detail,
    })),
  };
}
