import "server-only";
import { LRUCache } from "lru-cache";
import { decode } from "next-auth/jwt";
import { cookies, headers } from "next/headers";
import { cache } from "react";
import { AppError } from "@/lib/api/errors";
import { authSecret } from "@/lib/auth/secret";
import type { SessionUser } from "@/lib/auth/roles";
import { findActiveUserAndChangeStamp, findUserByApiToken } from "@/lib/people/queries";
import { rememberedUntilChange } from "@/lib/remembered-reads";

const SESSION_COOKIE_NAMES = ["__Secure-authjs.session-token", "authjs.session-token"] as const;

/**
 * Who is calling: a personal API token (`Authorization: Bearer …`) or the Auth.js session
 * cookie. The person is checked against the database on every request — or, where this process
 * holds the database (PGlite), against what it read since the last committed change to people
 * or tokens (db/change-watch.ts) — so disabling someone, changing their role, revoking a token
 * or signing out takes effect on the next request rather than at cookie expiry.
 */
async function userFromHeaders(h: Headers, cookieValue: (name: string) => string | undefined): Promise<SessionUser | null> {
  const authorization = h.get("authorization");
  if (authorization) {
    const match = /^Bearer\s+(\S+)$/i.exec(authorization);
    if (!match?.[1]) return null;
    const token = match[1];
    // Re-read at least once a minute, which keeps the token's "last used" to the minute.
    return rememberedUntilChange(`token:${token}`, 60_000, () => findUserByApiToken(token));
  }
  return (await sessionFromCookies(cookieValue))?.user ?? null;
}

/** For the page cache: the signed-in person (cookie session only) and the database's change stamp. */
export async function userAndChangeStampFromRequest(req: Request): Promise<{ user: SessionUser; changeStamp: number } | null> {
  const jar = parseCookies(req.headers.get("cookie") ?? "");
  return sessionFromCookies((name) => jar.get(name));
}

async function sessionFromCookies(cookieValue: (name: string) => string | undefined): Promise<{ user: SessionUser; changeStamp: number } | null> {
  const claims = await sessionClaims(cookieValue);
  if (!claims) return null;
  return rememberedUntilChange(`session:${claims.sub}:${claims.sv}`, 10 * 60_000, () => findActiveUserAndChangeStamp(claims.sub, claims.sv));
}

type SessionClaims = { sub: string; sv: number; exp: number };

// Decrypting a session cookie derives its key each time; a cookie seen a moment ago is not
// decrypted again. Keyed by the whole cookie, so only its holder can hit an entry.
const decodedCookies = new LRUCache<string, SessionClaims>({ max: 5_000, ttl: 5 * 60_000 });

/** Who a session cookie names (not yet checked against the database). */
async function sessionClaims(cookieValue: (name: string) => string | undefined): Promise<SessionClaims | null> {
  for (const name of SESSION_COOKIE_NAMES) {
    const token = cookieValue(name);
    if (!token) continue;
    let claims = decodedCookies.get(`${name}=${token}`);
    if (!claims) {
      const payload = await decode({ token, secret: authSecret(), salt: name }).catch(() => null);
      if (!payload?.sub) return null;
      claims = { sub: payload.sub, sv: typeof payload.sv === "number" ? payload.sv : 0, exp: typeof payload.exp === "number" ? payload.exp : Infinity };
      decodedCookies.set(`${name}=${token}`, claims);
    }
    // decode() checked expiry when it decrypted; a remembered cookie expires on the same clock.
    return claims.exp * 1000 > Date.now() ? claims : null;
  }
  return null;
}

/** For route handlers: authenticates from the Request itself. */
function userFromRequest(req: Request): Promise<SessionUser | null> {
  const jar = parseCookies(req.headers.get("cookie") ?? "");
  return userFromHeaders(req.headers, (name) => jar.get(name));
}

/** For server components and server actions; once per request however many parts of a page ask (React `cache`). */
export const currentUser = cache(async (): Promise<SessionUser | null> => {
  const [h, jar] = await Promise.all([headers(), cookies()]);
  return userFromHeaders(h, (name) => jar.get(name)?.value);
});

/** Throws 401 when nobody valid is signed in. Pass the Request from route handlers. */
export async function requireUser(req?: Request): Promise<SessionUser> {
  const user = req ? await userFromRequest(req) : await currentUser();
  if (!user) throw new AppError("unauthorized");
  return user;
}

function parseCookies(header: string): Map<string, string> {
  const jar = new Map<string, string>();
  for (const part of header.split(";")) {
    const eq = part.indexOf("=");
    if (eq < 0) continue;
    const name = part.slice(0, eq).trim();
    const value = part.slice(eq + 1).trim();
    try {
      jar.set(name, decodeURIComponent(value));
    } catch {
      jar.set(name, value);
    }
  }
  return jar;
}
