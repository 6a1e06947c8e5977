import "server-only";
import { and, eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { techniqueRequests } from "@/db/schema";
import { AppError } from "@/lib/api/errors";
import { assertCan } from "@/lib/auth/permissions";
import type { SessionUser } from "@/lib/auth/roles";
import { writeAudit } from "@/lib/audit/log";
import type { RequestInput } from "@/lib/requests/schemas";

/** "Nobody has written this up yet": a search turned into a request that seniors see. */
export async function createRequest(user: SessionUser, input: RequestInput): Promise<{ id: string }> {
  assertCan(user, "request:create");
  return getDb().transaction(async (tx) => {
    const [row] = await tx.insert(techniqueRequests).values({ query: input.query, note: input.note, requesterId: user.id }).returning({ id: techniqueRequests.id });
    await writeAudit(tx, { actorId: user.id, action: "request.create", targetType: "request", targetId: row!.id, detail: { query: input.query } });
    return { id: row!.id };
  });
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
