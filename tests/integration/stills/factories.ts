import crypto from "node:crypto";
import fs from "node:fs";
import path from "node:path";
import { getDb } from "@/db/client";
import { apiTokens, revisions, techniques, users } from "@/db/schema";
import { eq } from "drizzle-orm";
import type { Role, SessionUser } from "@/lib/auth/roles";
import { hashToken } from "@/lib/people/tokens";

export type TestPerson = { user: SessionUser; token: string; auth: Record<string, string> };

/** A person with a personal API token (stored as its SHA-256 hex, as lib/people/tokens.ts does). */
export async function createPerson(role: Role, name = `${role} ${crypto.randomUUID().slice(0, 8)}`): Promise<TestPerson> {
  const db = getDb();
  const email = `${name.replace(/\W+/g, ".").toLowerCase()}@kestrel.test`;
  const [u] = await db.insert(users).values({ email, name, role }).returning();
  if (!u) throw new Error("no user");
  const token = `prt_${crypto.randomBytes(24).toString("base64url")}`;
  await db.insert(apiTokens).values({ userId: u.id, name: "tests", tokenHash: hashToken(token) });
  return { user: { id: u.id, email: u.email, name: u.name, role: u.role }, token, auth: { authorization: `Bearer ${token}` } };
}

/** A technique with one revision, approved (visible to artists) or still a draft. */
export async function createTechnique(author: SessionUser, options: { approved: boolean; slug?: string }): Promise<{ id: string; slug: string }> {
  const db = getDb();
  const slug = options.slug ?? `grain-match-${crypto.randomUUID().slice(0, 8)}`;
  const [t] = await db.insert(techniques).values({ slug, status: options.approved ? "approved" : "draft", createdById: author.id }).returning();
  if (!t) throw new Error("no technique");
  const [r] = await db
    .insert(revisions)
    .values({
      techniqueId: t.id,
      number: 1,
      title: "Grain match after paint-out",
      summary: "Regrain a painted patch so it sits in the plate.",
      body: { type: "doc", content: [{ type: "paragraph" }] },
      state: options.approved ? "approved" : "draft",
      authorId: author.id,
    })
    .returning();
  if (!r) throw new Error("no revision");
  await db
    .update(techniques)
    .set({ latestRevisionId: r.id, approvedRevisionId: options.approved ? r.id : null })
    .where(eq(techniques.id, t.id));
  return { id: t.id, slug };
}

/** Every file (not folder) under a directory, relative paths. */
export function filesUnder(dir: string): string[] {
  if (!fs.existsSync(dir)) return [];
  const out: string[] = [];
  for (const entry of fs.readdirSync(dir, { withFileTypes: true, recursive: true })) {
    if (entry.isFile()) out.push(path.relative(dir, path.join(entry.parentPath, entry.name)));
  }
  return out.sort();
}

/** A multipart upload request for POST /api/stills. */
export function uploadRequest(
  file: { bytes: Uint8Array; name: string; type?: string } | null,
  fields: Record<string, string>,
  headers: Record<string, string> = {},
): Request {
  const form = new FormData();
  if (file) form.set("file", new Blob([new Uint8Array(file.bytes)], { type: file.type ?? "application/octet-stream" }), file.name);
  for (const [k, v] of Object.entries(fields)) form.set(k, v);
  return new Request("http://plateroom.test/api/stills", { method: "POST", body: form, headers });
}

export function ctx<P>(params: P): { params: Promise<P> } {
  return { params: Promise.resolve(params) };
}
