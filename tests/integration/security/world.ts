import crypto from "node:crypto";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { eq, max } from "drizzle-orm";
import sharp from "sharp";
import { expect } from "vitest";
import { getDb } from "@/db/client";
import { outbox, revisions, techniques } from "@/db/schema";
import type { SessionUser } from "@/lib/auth/roles";
import { env } from "@/lib/env";
import { invitePerson } from "@/lib/people/mutations";
import { askQuestion } from "@/lib/questions/mutations";
import { createRequest } from "@/lib/requests/mutations";
import { importShots } from "@/lib/shots/mutations";
import { createShow } from "@/lib/shows/mutations";
import { logUse } from "@/lib/uses/mutations";
import { DEFAULT_SHOT_PATTERN } from "@/lib/shows/schemas";
import { createPair, createStill } from "@/lib/stills/mutations";
import { createTag as createTagRow } from "@/lib/tags/mutations";
import { createTechnique, reviewTechnique, submitTechnique } from "@/lib/techniques/mutations";
import { createPerson, simpleDoc, type TestPerson } from "@/tests/factories";

/*
 * A small department for the security tests: people of every role, a tag, techniques in each
 * state, a show with a shot, stills, a use log, a question, a request and an outbox message.
 * Built through the DAL (the same code the routes call), except where a test needs an owner
 * the DAL would not allow (an artist as a technique's author).
 */

let n = 0;
export const next = () => ++n;
export const uniq = () => `${Date.now().toString(36)}${next()}`;

/** Points uploads and the data folder at throwaway folders; route handlers read env at call time. */
export function useTempFolders(): { uploads: string; data: string; cleanup: () => void } {
  const root = fs.mkdtempSync(path.join(os.tmpdir(), "plateroom-security-"));
  const uploads = path.join(root, "uploads");
  const data = path.join(root, "data");
  fs.mkdirSync(uploads);
  fs.mkdirSync(data);
  env.PLATEROOM_UPLOADS_DIR = uploads;
  env.PLATEROOM_DATA_DIR = data;
  return { uploads, data, cleanup: () => fs.rmSync(root, { recursive: true, force: true }) };
}

/** A small noisy PNG; `seed` changes the pixels so each call is a distinct file. */
export async function smallPng(seed = next(), width = 24, height = 16): Promise<Buffer> {
  return sharp({ create: { width, height, channels: 3, background: { r: (seed * 37) % 256, g: (seed * 91) % 256, b: 120 }, noise: { type: "gaussian", mean: 128, sigma: 30 } } })
    .png()
    .toBuffer();
}

export async function uploadStill(user: SessionUser, options: { technique?: string; owner: "technique" | "trial" | "use" }): Promise<string> {
  const bytes = await smallPng();
  const file = path.join(os.tmpdir(), `plateroom-security-${crypto.randomUUID()}.png`);
  fs.writeFileSync(file, bytes);
  const sha256 = crypto.createHash("sha256").update(bytes).digest("hex");
  const created = await createStill(user, {
    file: { path: file, sha256, size: bytes.length, originalName: "plate.png" },
    alt: "Grey plate with noise",
    technique: options.technique,
    owner: options.owner,
  });
  return created.id;
}

const base = (title: string, tags: string[] = []) => ({ title, summary: "Regrain a painted patch so it sits in the plate.", aliases: [], tags, recipe: [] });

export async function draftTechnique(author: SessionUser, tags: string[] = []): Promise<string> {
  return (await createTechnique(author, base(`Patch regrain ${uniq()}`, tags))).slug;
}

export async function inReviewTechnique(author: SessionUser): Promise<string> {
  const slug = await draftTechnique(author);
  await submitTechnique(author, slug);
  return slug;
}

export async function approvedTechnique(author: SessionUser, lead: SessionUser, tags: string[] = []): Promise<string> {
  const slug = await draftTechnique(author, tags);
  await submitTechnique(author, slug);
  return (await reviewTechnique(lead, slug, { revision: 1, decision: "approve" })).slug;
}

/** An approved technique "written" by anyone (an artist or admin cannot write one through the DAL). */
export async function approvedTechniqueBy(author: SessionUser): Promise<string> {
  const db = getDb();
  const slug = `wire-removal-${uniq()}`;
  const [t] = await db.insert(techniques).values({ slug, status: "approved", createdById: author.id }).returning();
  const [r] = await db
    .insert(revisions)
    .values({ techniqueId: t!.id, number: 1, title: "Wire removal on a moving plate", summary: "Paint out a wire.", body: simpleDoc("Paint it out."), state: "approved", authorId: author.id })
    .returning();
  await db.update(techniques).set({ latestRevisionId: r!.id, approvedRevisionId: r!.id }).where(eq(techniques.id, t!.id));
  return slug;
}

export async function latestRevisionNumber(slug: string): Promise<number> {
  const [row] = await getDb()
    .select({ n: max(revisions.number) })
    .from(revisions)
    .innerJoin(techniques, eq(techniques.id, revisions.techniqueId))
    .where(eq(techniques.slug, slug));
  return row?.n ?? 1;
}

export type World = Awaited<ReturnType<typeof buildWorld>>;

export async function buildWorld() {
  const people = {
    artist: await createPerson("artist"),
    senior: await createPerson("senior"),
    lead: await createPerson("lead"),
    admin: await createPerson("admin"),
  };
  /** Someone who owns things the callers do not. */
  const other = { artist: await createPerson("artist"), senior: await createPerson("senior") };
  const tag = await createTagRow(people.lead, { kind: "problem", name: `Tracking markers ${uniq()}`, description: "", aliases: [] });
  const approved = await approvedTechnique(people.senior, people.lead, [tag.slug]);
  const draft = await draftTechnique(people.senior);
  const showCode = `S${(next() % 1000).toString().padStart(3, "0")}X`.slice(0, 8);
  await createShow(people.lead, { code: showCode, name: "Security test show", kind: "feature", state: "active", shotPattern: DEFAULT_SHOT_PATTERN });
  const shot = `${showCode}_010_0010`;
  await importShots(people.lead, showCode, { rows: [{ code: shot, description: "Wire across the sky" }] });
  const still = await uploadStill(people.senior, { technique: approved, owner: "technique" });
  const still2 = await uploadStill(people.senior, { technique: approved, owner: "technique" });
  const use = (await logUse(people.artist, approved, { shot, outcome: "clean", note: "" })).id;
  const question = (await askQuestion(people.artist, approved, simpleDoc("Does this hold on motion blur?"))).id;
  const request = (await createRequest(people.artist, { query: "Rig removal on water", note: "" })).id;
  const pair = (await createPair(people.senior, { technique: approved, before: still, after: still2, caption: undefined })).id;
  await invitePerson(people.admin, { email: `invited-${uniq()}@kestrel.test`, name: "Invited person", role: "artist" });
  const [mail] = await getDb().select({ id: outbox.id }).from(outbox).orderBy(outbox.id).limit(1);
  return { people, other, tag, approved, draft, showCode, shot, still, still2, use, question, request, pair, outboxId: mail!.id };
}

export type Caller = TestPerson | null;

/** The API error shape (shared/API.md, "Calling it"): JSON, `{ error: { code, message, fields? } }`. */
export async function expectErrorShape(res: Response, label = ""): Promise<{ code: string; message: string }> {
  expect(res.headers.get("content-type") ?? "", `${label}: error content type`).toContain("application/json");
  const text = await res.clone().text();
  let body: unknown;
  try {
    body = JSON.parse(text);
  } catch {
    throw new Error(`${label}: error body is not JSON: ${text.slice(0, 200)}`);
  }
  expect(body, `${label}: error shape`).toEqual({ error: expect.objectContaining({ code: expect.any(String), message: expect.any(String) }) });
  const error = (body as { error: { code: string; message: string } }).error;
  // No stack traces or internals in what leaves the server (shared/API.md).
  expect(error.message, `${label}: message leaks internals`).not.toMatch(/\n\s+at |node_modules|\.ts:\d+/);
  return error;
}
