import "server-only";
import { and, desc, eq, inArray } from "drizzle-orm";
import { getDb } from "@/db/client";
import { techniqueRequests, users } from "@/db/schema";
import { AppError } from "@/lib/api/errors";
import { assertCan, can } from "@/lib/auth/permissions";
import type { SessionUser } from "@/lib/auth/roles";
import { writeAudit } from "@/lib/audit/log";
import type { TechniqueRequestResponse } from "@/lib/requests/types";


/** "Nobody has written this up yet": a search turned into a request that seniors see. */
export async function createRequest(user: SessionUser, input: { query: string; note: string }): Promise<{ id: string }> {
  assertCan(user, "request:create");
  return getDb().transaction(async (tx) => {
    const [row] = await tx.insert(techniqueRequests).values({ query: input.query, note: input.note, requesterId: user.id }).returning({ id: techniqueRequests.id });
    await writeAudit(tx, { actorId: user.id, action: "request.create", targetType: "request", targetId: row!.id, detail: { query: input.query } });
    return { id: row!.id };
  });
}

/** Open and claimed requests for writers; a person's own requests for everyone else. */
export async function listRequests(user: SessionUser, scope: "open" | "mine"): Promise<TechniqueRequestResponse[]> {
  const db = getDb();
  const where =
    scope === "open"
      ? can(user, "request:claim")
        ? inArray(techniqueRequests.status, ["open", "claimed"])
        : undefined
      : eq(techniqueRequests.requesterId, user.id);
  if (!where) return [];
  const rows = await db.select().from(techniqueRequests).where(where).orderBy(desc(techniqueRequests.createdAt)).limit(100);
  const ids = [...new Set(rows.flatMap((r) => [r.requesterId, r.claimedById]).filter((x): x is string => Boolean(x)))];
  const names = new Map((ids.length ? await db.select({ id: users.id, name: users.name }).from(users).where(inArray(users.id, ids)) : []).map((u) => [u.id, u]));
  return rows.map((r) => ({
    id: r.id,
    query: r.query,
    note: r.note,
    status: r.status,
    requester: r.requesterId ? (names.get(r.requesterId) ?? null) : null,
    claimedBy: r.claimedById ? (names.get(r.claimedById) ?? null) : null,
    createdAt: r.createdAt.toISOString(),
  }));
}

export async function claimRequest(user: SessionUser, id: string): Promise<void> {
  assertCan(user, "request:claim");
  await getDb().transaction(async (tx) => {
    const [row] = await tx
      .update(techniqueRequests)
      .set({ status: "claimed", claimedById: user.id })
      .where(and(eq(techniqueRequests.id, id), eq(techniqueRequests.status, "open")))
      .returning({ id: techniqueRequests.id });
    if (!row) throw new AppError("conflict", "This request is already claimed or resolved.");
    await writeAudit(tx, { actorId: user.id, action: "request.claim", targetType: "request", targetId: id });
  });
}
