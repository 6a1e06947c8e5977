import crypto from "node:crypto";
import { eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { apiTokens, revisions, shots, shows, stills, techniques, users } from "@/db/schema";
import type { Role } from "@/lib/auth/roles";
import { hashToken } from "@/lib/people/tokens";

/*
 * Local factories for the shots tests: rows straight into the database, and Requests that
 * authenticate with a personal API token the way scripts do.
 */

let seq = 0;
const next = () => `${Date.now().toString(36)}${(++seq).toString(36)}`;

export type Person = { id: string; name: string; role: Role; token: string };

export async function makePerson(role: Role, name = `${role} ${next()}`): Promise<Person> {
  const db = getDb();
  const [user] = await db.insert(users).values({ email: `${next()}@kestrel.test`, name, role }).returning();
  if (!user) throw new Error("no user");
  const token = `pat_${crypto.randomBytes(24).toString("base64url")}`;
  await db.insert(apiTokens).values({ userId: user.id, name: "tests", tokenHash: hashToken(token) });
  return { id: user.id, name, role, token };
}

type RequestOptions = { as?: Person | null; json?: unknown; body?: string; contentType?: string };

export function request(method: string, path: string, options: RequestOptions = {}): Request {
  const headers = new Headers();
  if (options.as) headers.set("Authorization", `Bearer ${options.as.token}`);
  let body: string | undefined;
  if (options.json !== undefined) {
    headers.set("Content-Type", "application/json");
    body = JSON.stringify(options.json);
  } else if (options.body !== undefined) {
    headers.set("Content-Type", options.contentType ?? "text/csv");
    body = options.body;
  }
  return new Request(`http://localhost${path}`, { method, headers, body });
}

export const ctx = <P extends Record<string, string>>(params: P) => ({ params: Promise.resolve(params) });

export async function makeShow(code: string, values: Partial<typeof shows.$inferInsert> = {}) {
  const [show] = await getDb()
    .insert(shows)
    .values({ code, name: `Show ${code}`, shotPattern: String.raw`^{CODE}_\d{3}_\d{4}$`, ...values })
    .returning();
  if (!show) throw new Error("no show");
  return show;
}

export async function makeShot(showId: string, code: string, values: Partial<typeof shots.$inferInsert> = {}) {
  const [shot] = await getDb()
    .insert(shots)
    .values({ showId, code, sequence: code.split("_")[1] ?? "", ...values })
    .returning();
  if (!shot) throw new Error("no shot");
  return shot;
}

/** A technique with one revision; `approved` gives it an approved revision (as approved and retired ones have). */
export async function makeTechnique(options: {
  title: string;
  status?: "draft" | "in_review" | "approved" | "retired";
  createdById?: string | null;
  supersededById?: string | null;
}) {
  const db = getDb();
  const status = options.status ?? "approved";
  const slug = `${options.title.toLowerCase().replace(/[^a-z0-9]+/g, "-")}-${next()}`;
  const [t] = await db
    .insert(techniques)
    .values({ slug, status, createdById: options.createdById ?? null, supersededById: options.supersededById ?? null })
    .returning();
  if (!t) throw new Error("no technique");
  const isApproved = status === "approved" || status === "retired";
  const [r] = await db
    .insert(revisions)
    .values({ techniqueId: t.id, number: 1, title: options.title, summary: "", body: {}, state: isApproved ? "approved" : "draft" })
    .returning();
  if (!r) throw new Error("no revision");
  const [updated] = await db
    .update(techniques)
    .set({ latestRevisionId: r.id, approvedRevisionId: isApproved ? r.id : null, retiredAt: status === "retired" ? new Date() : null })
    .where(eq(techniques.id, t.id))
    .returning();
  return { ...updated!, revisionId: r.id };
}

export async function makeStill(uploaderId: string, owner: "technique" | "use" | "trial" = "use") {
  const [still] = await getDb()
    .insert(stills)
    .values({
      sha256: crypto.randomBytes(32).toString("hex"),
      width: 4,
      height: 4,
      format: "png",
      bitDepth: 8,
      channels: 3,
      sizeBytes: 100,
      uploaderId,
      alt: "test still",
      owner,
    })
    .returning();
  if (!still) throw new Error("no still");
  return still;
}

/** The API error shape of shared/API.md. */
export type ErrorJson = { error: { code: string; message: string; fields?: Record<string, string> } };
