import "server-only";
import { decode } from "next-auth/jwt";
import { cookies, headers } from "next/headers";
import { AppError } from "@/lib/api/errors";
import { authSecret } from "@/lib/auth/secret";
import type { SessionUser } from "@/lib/auth/roles";
import { findActiveUser, findUserByApiToken } from "@/lib/people/queries";

export const SESSION_COOKIE_NAMES = ["__Secure-authjs.session-token", "authjs.session-token"] as const;

/**
 * Who is calling: a personal API token (`Authorization: Bearer …`) or the Auth.js session
 * cookie. The person is re-read from the database on every request, so disabling someone,
 * changing their role or signing out takes effect at once rather than at cookie expiry.
 */
export async function userFromHeaders(h: Headers, cookieValue: (name: string) => string | undefined): Promise<SessionUser | null> {
  const authorization = h.get("authorization");
  if (authorization) {
    const match = /^Bearer\s+(\S+)$/i.exec(authorization);
    if (!match?.[1]) return null;
    return findUserByApiToken(match[1]);
  }
  for (const name of SESSION_COOKIE_NAMES) {
    const token = cookieValue(name);
    if (!token) continue;
    const payload = await decode({ token, secret: authSecret(), salt: name }).catch(() => null);
    if (!payload?.sub) return null;
    return findActiveUser(payload.sub, typeof payload.sv === "number" ? payload.sv : 0);
  }
  return null;
}

/** For route handlers: authenticates from the Request itself. */
export function userFromRequest(req: Request): Promise<SessionUser | null> {
  const jar = parseCookies(req.headers.get("cookie") ?? "");
  return userFromHeaders(req.headers, (name) => jar.get(name));
}

/** For server components and server actions. */
export async function currentUser(): Promise<SessionUser | null> {
  const [h, jar] = await Promise.all([headers(), cookies()]);
  return userFromHeaders(h, (name) => jar.get(name)?.value);
}

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
