import crypto from "node:crypto";
import { encode } from "next-auth/jwt";
import { getDb } from "@/db/client";
import { apiTokens, tags, users, type User } from "@/db/schema";
import type { Role, SessionUser } from "@/lib/auth/roles";
import { authSecret } from "@/lib/auth/secret";
import { hashToken } from "@/lib/people/tokens";
import { documentFromText, type TechniqueDocument } from "@/lib/techniques/document";

let counter = 0;

export type TestPerson = SessionUser & { token: string; row: User };

/** A person with a personal API token; `token` goes in `Authorization: Bearer`. */
export async function createPerson(role: Role, overrides: Partial<{ email: string; name: string; passwordHash: string | null }> = {}): Promise<TestPerson> {
  counter += 1;
  const email = overrides.email ?? `${role}-${counter}-${crypto.randomUUID().slice(0, 8)}@kestrel.test`;
  const [row] = await getDb()
    .insert(users)
    .values({ email, name: overrides.name ?? `Test ${role} ${counter}`, role, passwordHash: overrides.passwordHash ?? null })
    .returning();
  const token = `plr_test_${crypto.randomBytes(16).toString("hex")}`;
  await getDb().insert(apiTokens).values({ userId: row!.id, name: "test", tokenHash: hashToken(token) });
  return { id: row!.id, email: row!.email, name: row!.name, role: row!.role, token, row: row! };
}

export async function createPeople(): Promise<Record<Role, TestPerson>> {
  return {
    artist: await createPerson("artist"),
    senior: await createPerson("senior"),
    lead: await createPerson("lead"),
    admin: await createPerson("admin"),
  };
}

/** An Auth.js session cookie for this person, as the sign-in flow would set it. */
export async function sessionCookie(person: { id: string; role: Role }, sessionVersion = 0): Promise<string> {
  const name = "authjs.session-token";
  const value = await encode({ token: { sub: person.id, role: person.role, sv: sessionVersion }, secret: authSecret(), salt: name });
  return `${name}=${value}`;
}

export async function createTag(kind: "problem" | "plate", name: string, aliases: string[] = []) {
  const slug = name.toLowerCase().replace(/[^a-z0-9]+/g, "-");
  const [row] = await getDb().insert(tags).values({ kind, name, slug, aliases }).returning();
  return row!;
}

type Caller = { token: string } | null;

/** Builds a Request as a caller would send it: JSON body, bearer token or nobody. */
export function apiRequest(method: string, path: string, who: Caller, body?: unknown, headers: Record<string, string> = {}): Request {
  const h = new Headers(headers);
  if (who) h.set("Authorization", `Bearer ${who.token}`);
  if (body !== undefined && !h.has("Content-Type")) h.set("Content-Type", "application/json");
  return new Request(`http://localhost${path}`, {
    method,
    headers: h,
    body: body === undefined ? undefined : typeof body === "string" ? body : JSON.stringify(body),
  });
}

export function params<P>(value: P): { params: Promise<P> } {
  return { params: Promise.resolve(value) };
}

export const simpleDoc = (text: string): TechniqueDocument => documentFromText(text);
