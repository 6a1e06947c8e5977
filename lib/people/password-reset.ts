import "server-only";
import { and, eq, gt, lt, sql } from "drizzle-orm";
import { after } from "next/server";
import { getDb } from "@/db/client";
import { oneTimeTokens, passwordResetRequests, users } from "@/db/schema";
import { baseUrl } from "@/lib/env";
import { enqueueAccountMail } from "@/lib/mail/account-mail";
import { newSecretToken } from "@/lib/people/tokens";

/*
 * "Forgot password", after the OWASP Forgot Password Cheat Sheet:
 * - the same answer, in the same time, whether or not the address has an account: the answer
 *   path only counts and records the request (the same statements for every e-mail); looking the
 *   account up, making the token and queueing the mail run after the answer has gone (`later`);
 * - limits per account (the e-mail typed, existing or not) and per client address;
 * - one live link per person: a new one retires the ones before it.
 */

export const RESET_VALID_MS = 60 * 60 * 1000;
/** Requests per e-mail address typed, within the window. */
export const RESET_PER_ACCOUNT = 3;
export const RESET_ACCOUNT_WINDOW_MS = 60 * 60 * 1000;
/** Requests per client address (any e-mails), within the window. */
export const RESET_PER_ADDRESS = 10;
export const RESET_ADDRESS_WINDOW_MS = 15 * 60 * 1000;

export type ResetAnswer = { ok: true } | { ok: false; retryAfterMs: number; reason: "account" | "address" };

/** Runs work after the answer is sent (`afterAnswer` below; tests pass their own). */
export type Later = (work: () => Promise<void>) => void;

/** Next.js `after`; outside a request (a handler called from a script or test) there is no answer to wait for. */
export function afterAnswer(work: () => Promise<void>): void {
  try {
    after(work);
  } catch {
    void work();
  }
}

/** Answers a reset request; the work for an existing account is handed to `later`. */
export async function requestPasswordReset(email: string, address: string, later: Later, now = Date.now()): Promise<ResetAnswer> {
  const normalised = email.trim().toLowerCase();
  const accountSince = new Date(now - RESET_ACCOUNT_WINDOW_MS);
  const addressSince = new Date(now - RESET_ADDRESS_WINDOW_MS);
  const byEmail = and(eq(passwordResetRequests.email, normalised), gt(passwordResetRequests.at, accountSince));
  const byAddress = and(eq(passwordResetRequests.address, address), gt(passwordResetRequests.at, addressSince));
  const [counts] = await getDb()
    .select({
      forEmail: sql<number>`count(*) filter (where ${byEmail})`.mapWith(Number),
      oldestForEmail: sql<string | null>`min(${passwordResetRequests.at}) filter (where ${byEmail})`,
      fromAddress: sql<number>`count(*) filter (where ${byAddress})`.mapWith(Number),
      oldestFromAddress: sql<string | null>`min(${passwordResetRequests.at}) filter (where ${byAddress})`,
    })
    .from(passwordResetRequests)
    .where(gt(passwordResetRequests.at, accountSince < addressSince ? accountSince : addressSince));
  const waitUntil = (oldest: string | null, windowMs: number) => Math.max(1000, (oldest ? new Date(oldest).getTime() : now) + windowMs - now);
  // "unknown": no connection address was recorded (lib/auth/client-address.ts); never one shared bucket.
  if (address !== "unknown" && (counts?.fromAddress ?? 0) >= RESET_PER_ADDRESS) {
    return { ok: false, reason: "address", retryAfterMs: waitUntil(counts?.oldestFromAddress ?? null, RESET_ADDRESS_WINDOW_MS) };
  }
  if ((counts?.forEmail ?? 0) >= RESET_PER_ACCOUNT) {
    return { ok: false, reason: "account", retryAfterMs: waitUntil(counts?.oldestForEmail ?? null, RESET_ACCOUNT_WINDOW_MS) };
  }
  await getDb().insert(passwordResetRequests).values({ email: normalised, address, at: new Date(now) });
  later(() => issueResetLink(normalised).catch((error: unknown) => console.error("[reset] could not issue a reset link:", error)));
  return { ok: true };
}

/** Mails a reset link to an existing, enabled person, retiring their earlier unused links. */
async function issueResetLink(email: string): Promise<void> {
  await getDb().transaction(async (tx) => {
    const [person] = await tx.select().from(users).where(eq(users.email, email)).limit(1);
    if (!person || person.disabledAt) return;
    const { token, hash } = newSecretToken("rst");
    await tx.delete(oneTimeTokens).where(and(eq(oneTimeTokens.userId, person.id), eq(oneTimeTokens.purpose, "reset")));
    await tx.insert(oneTimeTokens).values({ userId: person.id, purpose: "reset", tokenHash: hash, expiresAt: new Date(Date.now() + RESET_VALID_MS) });
    await enqueueAccountMail(tx, { kind: "reset", to: person, link: `${baseUrl()}/set-password?token=${encodeURIComponent(token)}` });
  });
  await forgetOldRequests();
}

let requestsSincePrune = 0;

async function forgetOldRequests(): Promise<void> {
  if (++requestsSincePrune < 50) return;
  requestsSincePrune = 0;
  await getDb().delete(passwordResetRequests).where(lt(passwordResetRequests.at, new Date(Date.now() - RESET_ACCOUNT_WINDOW_MS)));
}

/** The answer's words, the same for every e-mail address. */
export function resetAnswerMessage(answer: ResetAnswer, waitWords: (ms: number) => string): string {
  if (answer.ok) return "If that address has an account, a link to set a new password is on its way.";
  return answer.reason === "address"
    ? `Too many reset requests from your network. Try again in ${waitWords(answer.retryAfterMs)}.`
    : `A reset was asked for this address several times already. Check your mail, or try again in ${waitWords(answer.retryAfterMs)}.`;
}
