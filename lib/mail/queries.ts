import "server-only";
import { count, desc, eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { outbox, type OutboxMessage } from "@/db/schema";
import { assertCan } from "@/lib/auth/permissions";
import type { SessionUser } from "@/lib/auth/roles";
import { OUTBOX_STATES, type ListOutboxInput, type OutboxItemResponse, type OutboxListResponse, type OutboxState } from "@/lib/mail/schemas";

/**
 * A reset link lets whoever holds it set that person's password: admins see that a reset mail
 * went out, never its token (README, roles: what the admin may not read).
 */
function hideResetToken(row: OutboxMessage, text: string): string;
function hideResetToken(row: OutboxMessage, text: string | null): string | null;
function hideResetToken(row: OutboxMessage, text: string | null): string | null {
  return row.kind === "reset" && text ? text.replace(/token=[^\s"'<&]+/g, "token=(hidden)") : text;
}

export function toOutboxItem(row: OutboxMessage): OutboxItemResponse {
  return {
    id: row.id,
    to: row.toEmail,
    toUserId: row.toUserId,
    kind: row.kind,
    subject: row.subject,
    state: row.state,
    attempts: row.attempts,
    nextAttemptAt: row.nextAttemptAt.toISOString(),
    lastError: row.lastError,
    createdAt: row.createdAt.toISOString(),
    sentAt: row.sentAt?.toISOString() ?? null,
    messageId: row.messageId,
    headers: row.headers,
    text: hideResetToken(row, row.text),
    html: hideResetToken(row, row.html),
  };
}

/** Admin view of the outbox, newest first, with a count per state. */
export async function listOutbox(actor: SessionUser, input: ListOutboxInput): Promise<OutboxListResponse> {
  assertCan(actor, "mail:read-outbox");
  const db = getDb();
  const where = input.state ? eq(outbox.state, input.state) : undefined;
  const rows = await db.select().from(outbox).where(where).orderBy(desc(outbox.id)).limit(input.limit).offset(input.offset);
  const byState = await db.select({ state: outbox.state, n: count() }).from(outbox).groupBy(outbox.state);
  const counts = Object.fromEntries(OUTBOX_STATES.map((s) => [s, 0])) as Record<OutboxState, number>;
  for (const row of byState) counts[row.state] = row.n;
  const total = input.state ? counts[input.state] : Object.values(counts).reduce((a, b) => a + b, 0);
  return { items: rows.map(toOutboxItem), total, counts };
}

export async function getOutboxItem(actor: SessionUser, id: number): Promise<OutboxItemResponse | null> {
  assertCan(actor, "mail:read-outbox");
  const [row] = await getDb().select().from(outbox).where(eq(outbox.id, id)).limit(1);
  return row ? toOutboxItem(row) : null;
}
