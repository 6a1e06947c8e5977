import "server-only";
import fs from "node:fs/promises";
import { and, eq, sql } from "drizzle-orm";
import { getDb, type Database } from "@/db/client";
import { stillPairs, stills, techniques, type Still } from "@/db/schema";
import { AppError } from "@/lib/api/errors";
import { parseWith } from "@/lib/api/handler";
import { writeAudit } from "@/lib/audit/log";
import { assertCan } from "@/lib/auth/permissions";
import type { SessionUser } from "@/lib/auth/roles";
import { changeWorkingRevision } from "@/lib/techniques/mutations";
import { requireVisibleTechnique } from "@/lib/techniques/queries";
import { prepareOriginal } from "@/lib/stills/inspect";
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
import { ensureDerived, newIncomingPath, removeStored, storeOriginal } from "@/lib/stills/storage";

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
 * stripped of identifying metadata and checked by content, moved to the content address of
 * what remains (atomic), previews made, then the row written; on any failure the temp files
 * are gone and no row or unreferenced file remains.
 */
export async function createStill(user: SessionUser, input: CreateStillInput, options: { root?: string } = {}): Promise<StillCreatedResponse> {
  const cleanPath = await newIncomingPath(options.root);
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
    const { facts, ...stored } = await prepareOriginal(input.file.path, cleanPath);

    return await withHashLock(stored.sha256, async () => {
      await storeOriginal(stored.path, stored.sha256, options.root);
      let row: Still;
      try {
        await ensureDerived(stored.sha256, options.root);
        row = await getDb().transaction(async (tx) => {
          const [inserted] = await tx
            .insert(stills)
            .values({
              sha256: stored.sha256,
              width: facts.width,
              height: facts.height,
              format: facts.format,
              bitDepth: facts.bitDepth,
              channels: facts.channels,
              sizeBytes: stored.size,
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
            detail: { owner, techniqueId: technique?.id ?? null, sha256: stored.sha256, sizeBytes: stored.size },
          });
          return inserted;
        });
      } catch (error) {
        // Leave no file behind that no row points at; a shared file stays for its other rows.
        const inUse = await referencedHashes([stored.sha256]).catch(() => new Set([stored.sha256]));
        if (!inUse.has(stored.sha256)) await removeStored(stored.sha256, options.root);
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
    await fs.rm(cleanPath, { force: true });
  }
}

/**
 * Saves two stills of a technique as a before/after pair (seniors and up). The pair belongs to the
 * revision being worked on: a draft takes it at once; an approved or waiting revision gets a new
 * draft revision for it (lib/techniques/mutations.ts changeWorkingRevision), which goes to review.
 */
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
  const { pair, revision } = await changeWorkingRevision(user, technique.slug, "Added a before/after pair.", async (tx, revision) => {
    const [{ next } = { next: 0 }] = await tx
      .select({ next: sql<number>`coalesce(max(${stillPairs.position}) + 1, 0)`.mapWith(Number) })
      .from(stillPairs)
      .where(eq(stillPairs.revisionId, revision.id));
    const [row] = await tx
      .insert(stillPairs)
      .values({ techniqueId: technique.id, revisionId: revision.id, beforeStillId: before.id, afterStillId: after.id, caption: data.caption ?? "", position: next })
      .returning();
    if (!row) throw new Error("Insert returned no row.");
    // Pairing says which still is which, whatever role they were uploaded with.
    await tx.update(stills).set({ role: "before" }).where(eq(stills.id, before.id));
    await tx.update(stills).set({ role: "after" }).where(eq(stills.id, after.id));
    await writeAudit(tx, { actorId: user.id, action: "still_pair.create", targetType: "still_pair", targetId: row.id, detail: { techniqueId: technique.id, revision: revision.number } });
    return { pair: row, revision };
  });
  return {
    id: pair.id,
    techniqueId: pair.techniqueId,
    revision: revision.number,
    caption: pair.caption,
    position: pair.position,
    before: toStillResponse({ ...before, role: "before" }),
    after: toStillResponse({ ...after, role: "after" }),
  };
}

/**
 * Removes a pair (seniors and up); the stills stay. Like adding one, it changes the revision being
 * worked on: from an approved or waiting revision a new draft revision is made without the pair.
 */
export async function deletePair(user: SessionUser, id: string): Promise<void> {
  assertCan(user, "still:upload");
  const [found] = await getDb()
    .select({ pair: stillPairs, slug: techniques.slug })
    .from(stillPairs)
    .innerJoin(techniques, eq(techniques.id, stillPairs.techniqueId))
    .where(eq(stillPairs.id, id))
    .limit(1);
  if (!found) throw new AppError("not_found", "No pair at this address.");
  await requireVisibleTechnique(user, found.slug);
  const { pair } = found;
  await changeWorkingRevision(user, found.slug, "Removed a before/after pair.", async (tx, revision) => {
    // In a new draft revision the pair is a copy: the same stills at the same place.
    const [row] = await tx
      .delete(stillPairs)
      .where(
        pair.revisionId === revision.id
          ? eq(stillPairs.id, pair.id)
          : and(
              eq(stillPairs.revisionId, revision.id),
              eq(stillPairs.beforeStillId, pair.beforeStillId),
              eq(stillPairs.afterStillId, pair.afterStillId),
              eq(stillPairs.position, pair.position),
            ),
      )
      .returning({ id: stillPairs.id, techniqueId: stillPairs.techniqueId });
    if (!row) throw new AppError("conflict", "This pair is no longer in the revision being worked on; reload the page.");
    await writeAudit(tx, { actorId: user.id, action: "still_pair.delete", targetType: "still_pair", targetId: row.id, detail: { techniqueId: row.techniqueId, revision: revision.number } });
  });
}

type Tx = Parameters<Parameters<Database["transaction"]>[0]>[0];

/**
 * Shares a private trial by copy: a new still row (owner "use") over the same stored file, so
 * those who read the use log see it while the trial itself stays its uploader's alone. Only the
 * uploader may share their trial; pass the transaction that writes the use log.
 */
export async function copyTrialForUse(tx: Tx, user: SessionUser, trial: Still): Promise<Still> {
  if (trial.owner !== "trial" || trial.uploaderId !== user.id) throw new AppError("not_found", "No still at this address.");
  const { id: _id, createdAt: _createdAt, ...fields } = trial;
  const [copy] = await tx.insert(stills).values({ ...fields, owner: "use", techniqueId: null }).returning();
  if (!copy) throw new Error("Insert returned no row.");
  await writeAudit(tx, { actorId: user.id, action: "still.share", targetType: "still", targetId: copy.id, detail: { from: trial.id, sha256: trial.sha256 } });
  return copy;
}
