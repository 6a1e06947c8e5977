import "server-only";
import type { Database } from "@/db/client";
import { auditLog } from "@/db/schema";

type AuditInput = {
  actorId: string | null;
  action: string;
  targetType: string;
  targetId?: string | null;
  detail?: Record<string, unknown>;
};

/** Writes one audit entry; pass the transaction so the entry commits with the change. */
export async function writeAudit(db: Pick<Database, "insert">, entry: AuditInput): Promise<void> {
  await db.insert(auditLog).values({
    actorId: entry.actorId,
    action: entry.action,
    targetType: entry.targetType,
    targetId: entry.targetId ?? null,
    detail: entry.detail ?? {},
  });
}
