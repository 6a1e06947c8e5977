import "server-only";
import { desc, eq, inArray } from "drizzle-orm";
import { getDb } from "@/db/client";
import { techniqueRequests, users } from "@/db/schema";
import { can } from "@/lib/auth/permissions";
import type { SessionUser } from "@/lib/auth/roles";
import type { TechniqueRequestResponse } from "@/lib/requests/schemas";

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
