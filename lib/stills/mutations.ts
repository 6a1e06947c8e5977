import "server-only";
import fs from "node:fs/promises";
import { eq, sql } from "drizzle-orm";
import { getDb } from "@/db/client";
import { stillPairs, stills, type Still } from "@/db/schema";
import { AppError } from "@/lib/api/errors";
import { parseWith } from "@/lib/api/handler";
import { writeAudit } from "@/lib/audit/log";
import { assertCan } from "@/lib/auth/permissions";
import type { SessionUser } from "@/lib/auth/roles";
import { requireVisibleTechnique } from "@/lib/techniques/queries";
import { inspectStill } from "@/lib/stills/inspect";
import { getStillForRead, referencedHashes, toStillResponse } from "@/lib/stills/queries";
import {
  createPairSchema,
  stillFieldsSchema,
  type CreatePairInput,
  type StillCreatedResponse,
  type StillOwner,
  type StillPairResponse,
  type StillRole,
} from "@/lib/stills/schemas";
import { ensureDerived, removeStored, storeOriginal } from "@/lib/stills/storage";

type CreateStillInput = {
  /** A received upload: temp file path, its sha256 and size. createStill consumes the file. */
  file: { path: string; sha256: string; size: number; originalName?: string };
  alt: string;
  caption?: string;
  credit?: string;
  /** Technique slug. */
  technique?: string;
  role?: StillRole;
  /** Default: "technique" when a technique is named, else "trial". */
  owner?: StillOwner;
};

/**
 * In-process queue per content hash: storing, deriving and inserting for one hash happen
 * one at a time, so a failed insert never removes a file a parallel identical upload is
 * about to point at. (Across app instances the sweeper's grace period covers the same gap.)
 */
const hashQueues = new Map<string, Promise<unknown>>();
function withHashLock<T>(sha: string, work: () => Promise<T>): Promise<T> {
  const previous = hashQueues.get(sha) ?? Promise.resolve();
  const run = previous.then(work, work);
  const tail = run.catch(() => undefined);
  hashQueues.set(sha, tail);
  void tail.then(() => {
    if (hashQueues.get(sha) === tail) hashQueues.delete(sha);
  });
  return run;
}

/**
 * Stores one uploaded still and records it. Seniors and up attach stills to techniques;
 * anyone signed in uploads stills for their use logs and private trials. The file is
 * checked by content, moved to its content address (atomic), previews made, then the row
 * written; on any failure the temp file is gone and no row or unreferenced file remains.
 */
export async function createStill(user: SessionUser, input: CreateStillInput, options: { root?: string } = {}): Promise<StillCreatedResponse> {
  try {
    const fields = parseWith(stillFieldsSchema, {
      alt: input.alt,
      caption: input.caption,
      credit: input.credit,
      technique: input.technique,
      role: input.role,
      owner: input.owner,
    });
    const owner: StillOwner = fields.owner ?? (fields.technique ? "technique" : "trial");
    assertCan(user, owner === "technique" ? "still:upload" : "still:upload-trial");
    if (owner === "technique" && !fields.technique) {
      throw new AppError("validation_failed", "Name the technique this still belongs to.", { fields: { technique: "Required for technique stills." } });
    }
    const technique = fields.technique ? (await requireVisibleTechnique(user, fields.technique)).technique : null;
    const facts = await inspectStill(input.file.path);

    return await withHashLock(input.file.sha256, async () => {
      await storeOriginal(input.file.path, input.file.sha256, options.root);
      let row: Still;
      try {
        await ensureDerived(input.file.sha256, options.root);
        row = await getDb().transaction(async (tx) => {
          const [inserted] = await tx
            .insert(stills)
            .values({
              sha256: input.file.sha256,
              width: facts.width,
              height: facts.height,
              format: facts.format,
              bitDepth: facts.bitDepth,
              channels: facts.channels,
              sizeBytes: input.file.size,
              originalName: input.file.originalName ?? "",
              uploaderId: user.id,
              alt: fields.alt,
              caption: fields.caption ?? "",
              credit: fields.credit ?? "",
              owner,
              role: fields.role,
              techniqueId: technique?.id ?? null,
            })
            .returning();
          if (!inserted) throw new Error("Insert returned no row.");
          await writeAudit(tx, {
            actorId: user.id,
            action: "still.upload",
            targetType: "still",
            targetId: inserted.id,
            detail: { owner, techniqueId: technique?.id ?? null, sha256: input.file.sha256, sizeBytes: input.file.size },
          });
          return inserted;
        });
      } catch (error) {
        // Leave no file behind that no row points at; a shared file stays for its other rows.
        const inUse = await referencedHashes([input.file.sha256]).catch(() => new Set([input.file.sha256]));
        if (!inUse.has(input.file.sha256)) await removeStored(input.file.sha256, options.root);
        throw error;
      }
      return {
        id: row.id,
        width: row.width,
        height: row.height,
        format: facts.format,
        bitDepth: row.bitDepth,
        sha256: row.sha256,
        channels: row.channels,
      };
    });
  } finally {
    await fs.rm(input.file.path, { force: true });
  }
}

/** Saves two stills of a technique as a before/after pair (seniors and up). */
export async function createPair(user: SessionUser, input: CreatePairInput): Promise<StillPairResponse> {
  assertCan(user, "still:upload");
  const data = parseWith(createPairSchema, input);
  const { technique } = await requireVisibleTechnique(user, data.technique);
  const [before, after] = await Promise.all([getStillForRead(user, data.before), getStillForRead(user, data.after)]);
  for (const [field, s] of [
    ["before", before],
    ["after", after],
  ] as const) {
    // A pair is shown to everyone who sees the technique, so a private trial may not be in one.
    if (s.owner === "trial") throw new AppError("validation_failed", "Private trial stills cannot be shown in a pair.", { fields: { [field]: "This still is a private trial." } });
    if (s.techniqueId !== technique.id) throw new AppError("validation_failed", "Both stills must belong to this technique.", { fields: { [field]: "Not a still of this technique." } });
  }
  const db = getDb();
  const pair = await db.transaction(async (tx) => {
    const [{ next } = { next: 0 }] = await tx
      .select({ next: sql<number>`coalesce(max(${stillPairs.position}) + 1, 0)`.mapWith(Number) })
      .from(stillPairs)
      .where(eq(stillPairs.techniqueId, technique.id));
    const [row] = await tx
      .insert(stillPairs)
      .values({ techniqueId: technique.id, beforeStillId: before.id, afterStillId: after.id, caption: data.caption ?? "", position: next })
      .returning();
    if (!row) throw new Error("Insert returned no row.");
    // Pairing says which still is which, whatever role they were uploaded with.
    await tx.update(stills).set({ role: "before" }).where(eq(stills.id, before.id));
    await tx.update(stills).set({ role: "after" }).where(eq(stills.id, after.id));
    await writeAudit(tx, { actorId: user.id, action: "still_pair.create", targetType: "still_pair", targetId: row.id, detail: { techniqueId: technique.id } });
    return row;
  });
  return {
    id: pair.id,
    techniqueId: pair.techniqueId,
    caption: pair.caption,
    position: pair.position,
    before: toStillResponse({ ...before, role: "before" }),
    after: toStillResponse({ ...after, role: "after" }),
  };
}

/** Removes a pair (seniors and up); the stills stay. */
export async function deletePair(user: SessionUser, id: string): Promise<void> {
  assertCan(user, "still:upload");
  const db = getDb();
  await db.transaction(async (tx) => {
    const [row] = await tx.delete(stillPairs).where(eq(stillPairs.id, id)).returning({ id: stillPairs.id, techniqueId: stillPairs.techniqueId });
    if (!row) throw new AppError("not_found", "No pair at this address.");
    await writeAudit(tx, { actorId: user.id, action: "still_pair.delete", targetType: "still_pair", targetId: row.id, detail: { techniqueId: row.techniqueId } });
  });
}
