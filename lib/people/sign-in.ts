import "server-only";
import { and, eq, gt, or, sql } from "drizzle-orm";
import { getDb } from "@/db/client";
import { signInFailures, users, type User } from "@/db/schema";
import { verifyPassword } from "@/lib/auth/password";
import { findUserByEmail } from "@/lib/people/queries";

/** Failed sign-ins allowed per e-mail or per address within the window before 429. */
export const SIGN_IN_FAILURE_LIMIT = 10;
export const SIGN_IN_WINDOW_MS = 15 * 60 * 1000;

export async function isSignInLimited(email: string, address: string): Promise<boolean> {
  const since = new Date(Date.now() - SIGN_IN_WINDOW_MS);
  const [row] = await getDb()
    .select({
      byEmail: sql<number>`count(*) filter (where ${signInFailures.email} = ${email.toLowerCase()})`.mapWith(Number),
      byAddress: sql<number>`count(*) filter (where ${signInFailures.address} = ${address})`.mapWith(Number),
    })
    .from(signInFailures)
    .where(and(gt(signInFailures.at, since), or(eq(signInFailures.email, email.toLowerCase()), eq(signInFailures.address, address))));
  // Without a proxy telling us the client address every caller looks alike ("local"); counting
  // those together would let ten typos lock everyone out, so only known addresses are counted.
  const addressLimited = address !== "local" && (row?.byAddress ?? 0) >= SIGN_IN_FAILURE_LIMIT;
  return (row?.byEmail ?? 0) >= SIGN_IN_FAILURE_LIMIT || addressLimited;
}

/**
 * Checks an e-mail and password. Unknown e-mail, wrong password, disabled account and
 * not-yet-activated invitation all answer the same null after the same argon2 work,
 * so the response reveals nothing about which accounts exist.
 */
export async function checkCredentials(email: string, password: string, address: string): Promise<User | null> {
  const normalised = email.toLowerCase();
  if (await isSignInLimited(normalised, address)) return null;
  const user = await findUserByEmail(normalised);
  const ok = await verifyPassword(user?.passwordHash, password);
  if (!user || !ok || user.disabledAt) {
    await getDb().insert(signInFailures).values({ email: normalised, address });
    return null;
  }
  return user;
}

/** Makes every existing session cookie of this person stale. */
export async function endAllSessions(userId: string): Promise<void> {
  await getDb()
    .update(users)
    .set({ sessionVersion: sql`${users.sessionVersion} + 1` })
    .where(eq(users.id, userId));
}
