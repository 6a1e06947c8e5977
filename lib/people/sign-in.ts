import "server-only";
import { and, eq, gt, lt, or, sql } from "drizzle-orm";
import { getDb } from "@/db/client";
import { signInFailures, users, type User } from "@/db/schema";
import { verifyPassword } from "@/lib/auth/password";
import { findUserByEmail } from "@/lib/people/queries";

/*
 * Sign-in throttling after the OWASP Authentication Cheat Sheet ("Account Lockout"): failures
 * are counted per account (the e-mail typed, whether or not it exists, so the answer says
 * nothing about which accounts do), and past a few free tries each further try waits a delay
 * that doubles with every failure, up to a cap. Nobody else is locked out: colleagues behind
 * the same office address keep signing in. Per address there is only a generous flood guard
 * that an office's typos cannot reach. A correct password ends the account's delays.
 */

/** Failures per account that cost nothing; from here on each try waits. */
export const FREE_FAILURES = 4;
/** The wait after the first failure past the free ones; it doubles with each further failure. */
export const FIRST_DELAY_MS = 2_000;
export const MAX_DELAY_MS = 15 * 60 * 1000;
/** Failures older than this are forgotten. */
export const FAILURE_MEMORY_MS = 24 * 60 * 60 * 1000;
/** Flood guard: failed sign-ins from one address (any accounts) within the window. */
export const ADDRESS_FLOOD_LIMIT = 300;
export const ADDRESS_WINDOW_MS = 15 * 60 * 1000;

/** The wait owed after `failures` recorded failures of one account (0 while within the free ones). */
export function accountDelayMs(failures: number): number {
  if (failures <= FREE_FAILURES) return 0;
  return Math.min(MAX_DELAY_MS, FIRST_DELAY_MS * 2 ** (failures - FREE_FAILURES - 1));
}

export type SignInWait = { retryAfterMs: number; reason: "account" | "address" };

/**
 * How long this sign-in must wait, or null when it may go ahead now. `beforeId` counts only
 * failures recorded before that row (an attempt checking the ones that raced ahead of it).
 */
export async function signInWait(email: string, address: string, options: { beforeId?: number; now?: number } = {}): Promise<SignInWait | null> {
  const now = options.now ?? Date.now();
  const normalised = email.trim().toLowerCase();
  const memory = new Date(now - FAILURE_MEMORY_MS);
  const window = new Date(now - ADDRESS_WINDOW_MS);
  const byEmail = eq(signInFailures.email, normalised);
  const byAddress = and(eq(signInFailures.address, address), gt(signInFailures.at, window));
  const [row] = await getDb()
    .select({
      failures: sql<number>`count(*) filter (where ${byEmail})`.mapWith(Number),
      lastFailure: sql<string | null>`max(${signInFailures.at}) filter (where ${byEmail})`,
      fromAddress: sql<number>`count(*) filter (where ${byAddress})`.mapWith(Number),
      oldestFromAddress: sql<string | null>`min(${signInFailures.at}) filter (where ${byAddress})`,
    })
    .from(signInFailures)
    .where(
      and(
        gt(signInFailures.at, memory),
        address === "unknown" ? byEmail : or(byEmail, byAddress),
        options.beforeId === undefined ? undefined : lt(signInFailures.id, options.beforeId),
      ),
    );
  const failures = row?.failures ?? 0;
  const last = row?.lastFailure ? new Date(row.lastFailure).getTime() : 0;
  const accountWait = last + accountDelayMs(failures) - now;
  if (accountWait > 0) return { retryAfterMs: accountWait, reason: "account" };
  if (address !== "unknown" && (row?.fromAddress ?? 0) >= ADDRESS_FLOOD_LIMIT) {
    const oldest = row?.oldestFromAddress ? new Date(row.oldestFromAddress).getTime() : now;
    return { retryAfterMs: Math.max(1000, oldest + ADDRESS_WINDOW_MS - now), reason: "address" };
  }
  return null;
}

export type CredentialsResult = { ok: true; user: User } | { ok: false; wait: SignInWait | null };

/**
 * Checks an e-mail and password. Unknown e-mail, wrong password, disabled account and
 * not-yet-activated invitation all answer the same failure after the same argon2 work,
 * so the response reveals nothing about which accounts exist.
 */
export async function checkCredentials(email: string, password: string, address: string): Promise<CredentialsResult> {
  const normalised = email.trim().toLowerCase();
  const wait = await signInWait(normalised, address);
  if (wait) return { ok: false, wait };
  // Recorded as a failure before the password is checked, so tries sent in parallel count
  // against each other: past the free ones, only the first of them is checked.
  const [attempt] = await getDb().insert(signInFailures).values({ email: normalised, address }).returning({ id: signInFailures.id });
  const raced = attempt ? await signInWait(normalised, address, { beforeId: attempt.id }) : null;
  if (raced && attempt) {
    await getDb().delete(signInFailures).where(eq(signInFailures.id, attempt.id));
    return { ok: false, wait: raced };
  }
  const user = await findUserByEmail(normalised);
  const ok = await verifyPassword(user?.passwordHash, password);
  if (!user || !ok || user.disabledAt) {
    await forgetOldFailures();
    return { ok: false, wait: null };
  }
  await getDb().delete(signInFailures).where(eq(signInFailures.email, normalised));
  return { ok: true, user };
}

let failuresSincePrune = 0;

/** Keeps the table small: every 50th failure removes what is past the failure memory. */
async function forgetOldFailures(): Promise<void> {
  if (++failuresSincePrune < 50) return;
  failuresSincePrune = 0;
  await getDb().delete(signInFailures).where(lt(signInFailures.at, new Date(Date.now() - FAILURE_MEMORY_MS)));
}

/** "about 3 minutes", "12 seconds": when to try again, for messages. */
export function waitInWords(ms: number): string {
  const seconds = Math.max(1, Math.ceil(ms / 1000));
  if (seconds < 90) return `${seconds} second${seconds === 1 ? "" : "s"}`;
  return `about ${Math.ceil(seconds / 60)} minutes`;
}

/** The message for a throttled sign-in; the same whether or not the account exists. */
export function signInWaitMessage(wait: SignInWait): string {
  const when = waitInWords(wait.retryAfterMs);
  return wait.reason === "account"
    ? `Too many failed sign-ins for this e-mail address. Try again in ${when}.`
    : `Too many failed sign-ins from your network. Try again in ${when}.`;
}

/** Makes every existing session cookie of this person stale. */
export async function endAllSessions(userId: string): Promise<void> {
  await getDb()
    .update(users)
    .set({ sessionVersion: sql`${users.sessionVersion} + 1` })
    .where(eq(users.id, userId));
}
