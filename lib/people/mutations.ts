import "server-only";
import { and, eq, gt, isNull, ne, sql } from "drizzle-orm";
import { getDb } from "@/db/client";
import { apiTokens, oneTimeTokens, users } from "@/db/schema";
import { AppError } from "@/lib/api/errors";
import { assertCan } from "@/lib/auth/permissions";
import type { SessionUser } from "@/lib/auth/roles";
import { hashPassword } from "@/lib/auth/password";
import { writeAudit } from "@/lib/audit/log";
import { baseUrl } from "@/lib/env";
import { hashToken, newSecretToken } from "@/lib/people/tokens";
import { toPersonResponse } from "@/lib/people/queries";
import type { InvitePersonInput, InviteResponse, PersonResponse, UpdatePersonInput } from "@/lib/people/schemas";
import { enqueueAccountMail } from "@/lib/mail/account-mail";

const INVITE_VALID_MS = 7 * 24 * 60 * 60 * 1000;

/** Creates the account without a password and mails a single-use set-password link. */
export async function invitePerson(actor: SessionUser, input: InvitePersonInput): Promise<InviteResponse> {
  assertCan(actor, "people:manage");
  const { token, hash } = newSecretToken("inv");
  const link = `${baseUrl()}/set-password?token=${encodeURIComponent(token)}`;
  return getDb().transaction(async (tx) => {
    const [existing] = await tx.select({ id: users.id }).from(users).where(eq(users.email, input.email)).limit(1);
    if (existing) throw new AppError("conflict", "Someone with this e-mail address already has an account.", { fields: { email: "Already in use." } });
    const [person] = await tx.insert(users).values({ email: input.email, name: input.name, role: input.role }).returning();
    if (!person) throw new AppError("internal");
    await tx.insert(oneTimeTokens).values({
      userId: person.id,
      purpose: "invite",
      tokenHash: hash,
      expiresAt: new Date(Date.now() + INVITE_VALID_MS),
    });
    await enqueueAccountMail(tx, { kind: "invite", to: person, link, invitedBy: actor.name });
    await writeAudit(tx, { actorId: actor.id, action: "person.invite", targetType: "user", targetId: person.id, detail: { email: person.email, role: person.role } });
    return { person: toPersonResponse(person), setPasswordUrl: link };
  });
}

/** Changes role and/or disables; the last enabled admin can be neither demoted nor disabled. */
export async function updatePerson(actor: SessionUser, id: string, input: UpdatePersonInput): Promise<PersonResponse> {
  assertCan(actor, "people:manage");
  return getDb().transaction(async (tx) => {
    const [person] = await tx.select().from(users).where(eq(users.id, id)).limit(1).for("update");
    if (!person) throw new AppError("not_found", "No such person.");
    const losesAdmin =
      person.role === "admin" && !person.disabledAt && ((input.role !== undefined && input.role !== "admin") || input.disabled === true);
    if (losesAdmin) {
      const [other] = await tx
        .select({ n: sql<number>`count(*)`.mapWith(Number) })
        .from(users)
        .where(and(eq(users.role, "admin"), isNull(users.disabledAt), ne(users.id, person.id)));
      if ((other?.n ?? 0) === 0) throw new AppError("conflict", "This is the last admin: make someone else an admin first.");
    }
    const disabledAt = input.disabled === undefined ? person.disabledAt : input.disabled ? (person.disabledAt ?? new Date()) : null;
    const [updated] = await tx
      .update(users)
      .set({
        role: input.role ?? person.role,
        disabledAt,
        // Old sessions must not keep the old role or outlive a disable.
        sessionVersion: sql`${users.sessionVersion} + 1`,
        updatedAt: new Date(),
      })
      .where(eq(users.id, id))
      .returning();
    if (!updated) throw new AppError("internal");
    if (input.disabled === true) await tx.update(apiTokens).set({ revokedAt: new Date() }).where(and(eq(apiTokens.userId, id), isNull(apiTokens.revokedAt)));
    await writeAudit(tx, {
      actorId: actor.id,
      action: "person.update",
      targetType: "user",
      targetId: id,
      detail: { from: { role: person.role, disabled: !!person.disabledAt }, to: { role: updated.role, disabled: !!updated.disabledAt } },
    });
    return toPersonResponse(updated);
  });
}

/** Uses an invitation or reset token once; a used, expired or unknown token is refused. */
export async function setPasswordWithToken(token: string, password: string): Promise<{ email: string }> {
  const passwordHash = await hashPassword(password);
  return getDb().transaction(async (tx) => {
    const [row] = await tx
      .update(oneTimeTokens)
      .set({ usedAt: new Date() })
      .where(and(eq(oneTimeTokens.tokenHash, hashToken(token)), isNull(oneTimeTokens.usedAt), gt(oneTimeTokens.expiresAt, new Date())))
      .returning();
    if (!row) throw new AppError("bad_request", "This link has expired or was already used. Ask an admin for a new one.");
    const [person] = await tx
      .update(users)
      .set({ passwordHash, sessionVersion: sql`${users.sessionVersion} + 1`, updatedAt: new Date() })
      .where(eq(users.id, row.userId))
      .returning();
    if (!person || person.disabledAt) throw new AppError("bad_request", "This account is disabled.");
    await writeAudit(tx, { actorId: person.id, action: `person.password.${row.purpose}`, targetType: "user", targetId: person.id });
    return { email: person.email };
  });
}

export async function createApiToken(actor: SessionUser, name: string): Promise<{ id: string; token: string }> {
  assertCan(actor, "token:manage");
  const { token, hash } = newSecretToken("plr");
  const [row] = await getDb().insert(apiTokens).values({ userId: actor.id, name, tokenHash: hash }).returning({ id: apiTokens.id });
  if (!row) throw new AppError("internal");
  await writeAudit(getDb(), { actorId: actor.id, action: "token.create", targetType: "api_token", targetId: row.id, detail: { name } });
  return { id: row.id, token };
}

export async function revokeApiToken(actor: SessionUser, id: string): Promise<void> {
  assertCan(actor, "token:manage");
  const [row] = await getDb()
    .update(apiTokens)
    .set({ revokedAt: new Date() })
    .where(and(eq(apiTokens.id, id), eq(apiTokens.userId, actor.id), isNull(apiTokens.revokedAt)))
    .returning({ id: apiTokens.id });
  if (!row) throw new AppError("not_found", "No such token.");
  await writeAudit(getDb(), { actorId: actor.id, action: "token.revoke", targetType: "api_token", targetId: id });
}
