import "server-only";
import { and, asc, desc, eq, isNull } from "drizzle-orm";
import { getDb } from "@/db/client";
import { apiTokens, changeStamp, users, type User } from "@/db/schema";
import { assertCan } from "@/lib/auth/permissions";
import type { SessionUser } from "@/lib/auth/roles";
import { hashToken } from "@/lib/people/tokens";
import type { PersonResponse, TokenResponse } from "@/lib/people/schemas";

function toSessionUser(u: Pick<User, "id" | "email" | "name" | "role">): SessionUser {
  return { id: u.id, email: u.email, name: u.name, role: u.role };
}

export function toPersonResponse(u: User): PersonResponse {
  return {
    id: u.id,
    email: u.email,
    name: u.name,
    role: u.role,
    disabled: u.disabledAt !== null,
    hasPassword: u.passwordHash !== null,
    createdAt: u.createdAt.toISOString(),
  };
}

const sessionColumns = { id: users.id, email: users.email, name: users.name, role: users.role, disabledAt: users.disabledAt, sessionVersion: users.sessionVersion };

/**
 * The person behind a session cookie, if still enabled and the cookie is not from before a
 * sign-out, and the database's change stamp (db/schema/changes.ts) for the page cache, in one read.
 */
export async function findActiveUserAndChangeStamp(id: string, sessionVersion: number): Promise<{ user: SessionUser; changeStamp: number } | null> {
  if (!/^[0-9a-f-]{36}$/i.test(id)) return null;
  const [u] = await getDb()
    .select({ ...sessionColumns, changeStamp: changeStamp.value })
    .from(users)
    .innerJoin(changeStamp, eq(changeStamp.id, 1))
    .where(eq(users.id, id))
    .limit(1);
  if (!u || u.disabledAt || u.sessionVersion !== sessionVersion) return null;
  return { user: toSessionUser(u), changeStamp: u.changeStamp };
}

/** The owner of a personal API token, acting with the owner's current role. */
export async function findUserByApiToken(token: string): Promise<SessionUser | null> {
  if (token.length > 200) return null;
  const db = getDb();
  const [row] = await db
    .select({ user: users, tokenId: apiTokens.id, lastUsedAt: apiTokens.lastUsedAt })
    .from(apiTokens)
    .innerJoin(users, eq(users.id, apiTokens.userId))
    .where(and(eq(apiTokens.tokenHash, hashToken(token)), isNull(apiTokens.revokedAt)))
    .limit(1);
  if (!row || row.user.disabledAt) return null;
  // "Last used" to the minute is enough, and a write on every scripted request is not free.
  const now = new Date();
  if (!row.lastUsedAt || now.getTime() - row.lastUsedAt.getTime() > 60_000) {
    await db.update(apiTokens).set({ lastUsedAt: now }).where(eq(apiTokens.id, row.tokenId));
  }
  return toSessionUser(row.user);
}

export async function findUserByEmail(email: string): Promise<User | null> {
  const [u] = await getDb().select().from(users).where(eq(users.email, email.toLowerCase())).limit(1);
  return u ?? null;
}

/** Admins only. */
export async function listPeople(actor: SessionUser): Promise<PersonResponse[]> {
  assertCan(actor, "people:manage");
  const rows = await getDb().select().from(users).orderBy(asc(users.name));
  return rows.map(toPersonResponse);
}

export async function listApiTokens(actor: SessionUser): Promise<TokenResponse[]> {
  assertCan(actor, "token:manage");
  const rows = await getDb()
    .select()
    .from(apiTokens)
    .where(and(eq(apiTokens.userId, actor.id), isNull(apiTokens.revokedAt)))
    .orderBy(desc(apiTokens.createdAt));
  return rows.map((t) => ({
    id: t.id,
    name: t.name,
    createdAt: t.createdAt.toISOString(),
    lastUsedAt: t.lastUsedAt?.toISOString() ?? null,
  }));
}
