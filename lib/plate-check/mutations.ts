import "server-only";
import { and, eq, notInArray } from "drizzle-orm";
import { getDb } from "@/db/client";
import { keptRecipes, plateCheckTries, plateChecks, type Still } from "@/db/schema";
import { AppError } from "@/lib/api/errors";
import { writeAudit } from "@/lib/audit/log";
import { assertCan } from "@/lib/auth/permissions";
import type { SessionUser } from "@/lib/auth/roles";
import { checkFrame, DETECTOR_VERSION, type CheckStage } from "@/lib/plate-check/check";
import { compressionFinding } from "@/lib/plate-check/compression";
import { assertCheckable, isCodedSrgb, originalBytesOf, readStillLinear } from "@/lib/plate-check/pixels";
import { checkDtoFor, storedCheck, storedTries, toKeptDto } from "@/lib/plate-check/queries";
import { MAX_TRIES, type CheckDto, type Findings, type KeptRecipeDto, type TryResult } from "@/lib/plate-check/schemas";
import { plateProxy, tryRecipe } from "@/lib/plate-check/tries";
import { approvedRecipe, suggestMethods } from "@/lib/plate-check/suggest";
import { getStillForRead } from "@/lib/stills/queries";
import { getTechnique } from "@/lib/techniques/queries";
import { submitTechnique, updateTechnique } from "@/lib/techniques/mutations";

/*
 * Running the plate check, trying methods on the frame, keeping and proposing filled recipes.
 * Each function takes the acting person and checks the still's visibility first, so someone
 * else's private trial answers 404 whatever is asked of it.
 */

/** One check at a time per process, three waiting: a 4K check holds ~0.5 GB for a few seconds. */
const slots = { active: 0, waiting: [] as (() => void)[] };
const MAX_WAITING = 3;

async function withCheckSlot<T>(work: () => Promise<T>): Promise<T> {
  if (slots.active >= 1) {
    if (slots.waiting.length >= MAX_WAITING) throw new AppError("rate_limited", "The plate check is busy. Try again in a moment.");
    await new Promise<void>((resolve) => slots.waiting.push(resolve));
  } else slots.active++;
  try {
    return await work();
  } finally {
    const next = slots.waiting.shift();
    if (next) next();
    else slots.active--;
  }
}

const pause = (): Promise<void> => new Promise((resolve) => setImmediate(resolve));

export type RunCheckOptions = { force?: boolean; onStage?: (stage: CheckStage, done: number, total: number) => void };

/**
 * Measures the still (or answers the stored findings when they are current and not forced) and
 * stores them; tries made against older findings are dropped with them.
 */
export async function runPlateCheck(user: SessionUser, stillId: string, options: RunCheckOptions = {}): Promise<CheckDto> {
  assertCan(user, "still:check");
  const still = await getStillForRead(user, stillId);
  const stored = await storedCheck(still.id);
  if (!stored || stored.detectorVersion !== DETECTOR_VERSION || options.force) {
    assertCheckable(still);
    const findings = await withCheckSlot(async () => {
      // The coded path decodes these bytes; WebP's chunks tell its coding. Float stills are read by the stills module.
      const bytes = isCodedSrgb(still) || still.format === "webp" ? await originalBytesOf(still) : undefined;
      const compression = compressionFinding({ format: still.format, bytes, exr: still.exr });
      return checkFrame(await readStillLinear(still, bytes), { compression, pause, onStage: options.onStage });
    });
    await getDb().transaction(async (tx) => {
      await tx
        .insert(plateChecks)
        .values({ stillId: still.id, detectorVersion: DETECTOR_VERSION, findings, checkedById: user.id, checkedAt: new Date() })
        .onConflictDoUpdate({ target: plateChecks.stillId, set: { detectorVersion: DETECTOR_VERSION, findings, checkedById: user.id, checkedAt: new Date() } });
      await tx.delete(plateCheckTries).where(eq(plateCheckTries.stillId, still.id));
    });
  }
  return (await checkDtoFor(user, still))!;
}

/** The still and its current findings, or a 409 asking for a check first. */
async function currentFindings(user: SessionUser, stillId: string): Promise<{ still: Still; findings: Findings }> {
  assertCan(user, "still:check");
  const still = await getStillForRead(user, stillId);
  const stored = await storedCheck(still.id);
  if (!stored || stored.detectorVersion !== DETECTOR_VERSION) throw new AppError("conflict", "Check the plate first: there are no current findings for this still.");
  return { still, findings: stored.findings };
}

/**
 * Tries up to three techniques on the frame: each approved recipe filled from the findings,
 * rendered as a proxy through the lab's runner, and measured against the plate. With no slugs,
 * the best suggested methods that carry a recipe. Stored with the still (replacing earlier tries).
 */
export async function tryMethods(user: SessionUser, stillId: string, slugs?: string[]): Promise<TryResult[]> {
  const { still, findings } = await currentFindings(user, stillId);
  let chosen = slugs ? [...new Set(slugs)] : (await suggestMethods(user, findings)).filter((s) => s.hasRecipe).map((s) => s.slug);
  chosen = chosen.slice(0, MAX_TRIES);
  const bytes = await originalBytesOf(still);
  const before = await plateProxy(still, bytes);
  const results: TryResult[] = [];
  const ids: string[] = [];
  for (const slug of chosen) {
    const approved = await approvedRecipe(user, slug);
    if (!approved) {
      if (slugs) throw new AppError("not_found", `No approved technique “${slug}” to try.`, { fields: { techniques: `No approved technique “${slug}”.` } });
      continue;
    }
    const base = { slug: approved.slug, title: approved.title, revision: approved.revision, isHouseMethod: approved.isHouseMethodFor.some((t) => findings.problemTags.some((p) => p.slug === t)) };
    ids.push(approved.techniqueId);
    results.push(await tryRecipe({ still, bytes, before, findings, recipe: approved.recipe, ...base }));
  }
  await saveTries(still.id, results, ids);
  return results;
}

/** Stores tries (`ids`: each result's technique id) and drops earlier tries of other techniques. */
async function saveTries(stillId: string, results: TryResult[], ids: string[]): Promise<void> {
  await getDb().transaction(async (tx) => {
    for (const [position, r] of results.entries()) {
      await tx
        .insert(plateCheckTries)
        .values({ stillId, techniqueId: ids[position]!, revisionNumber: r.revision, detectorVersion: DETECTOR_VERSION, result: r, position })
        .onConflictDoUpdate({ target: [plateCheckTries.stillId, plateCheckTries.techniqueId], set: { revisionNumber: r.revision, detectorVersion: DETECTOR_VERSION, result: r, position, createdAt: new Date() } });
    }
    if (ids.length) await tx.delete(plateCheckTries).where(and(eq(plateCheckTries.stillId, stillId), notInArray(plateCheckTries.techniqueId, ids)));
  });
}

/** A stored try of this technique on this still (made against the current findings). */
export async function findTry(user: SessionUser, stillId: string, slug: string): Promise<{ still: Still; result: TryResult }> {
  const { still } = await currentFindings(user, stillId);
  const result = (await storedTries(still.id)).find((t) => t.slug === slug);
  if (!result || !result.recipe.length) throw new AppError("not_found", "This technique has not been tried on this still.");
  return { still, result };
}

/** The reader keeps a tried recipe, filled for this frame, for themselves (private like a trial). */
export async function keepRecipe(user: SessionUser, stillId: string, slug: string, note: string): Promise<KeptRecipeDto> {
  assertCan(user, "recipe:keep");
  const { still, result } = await findTry(user, stillId, slug);
  const t = await getTechnique(user, slug);
  const [row] = await getDb()
    .insert(keptRecipes)
    .values({ stillId: still.id, ownerId: user.id, techniqueId: t.id, techniqueTitle: result.title, techniqueSlug: result.slug, revisionNumber: result.revision, recipe: result.recipe, note })
    .returning();
  return toKeptDto(row!);
}

/**
 * A senior proposes the filled recipe as an edit of the technique: a new revision with the same
 * text and tags and this recipe, through the techniques module's own update (so it goes to
 * review like any edit of an approved technique, and a 409 when someone saved in between).
 */
export async function proposeRecipe(user: SessionUser, stillId: string, slug: string, changeNote: string): Promise<{ slug: string; revision: number }> {
  assertCan(user, "technique:write");
  const { still, result } = await findTry(user, stillId, slug);
  const t = await getTechnique(user, slug);
  const out = await updateTechnique(user, t.slug, {
    title: t.title,
    summary: t.summary,
    aliases: t.aliases,
    tags: t.tags.map((x) => x.slug),
    body: t.body,
    recipe: result.recipe,
    baseRevision: t.latestRevision,
    changeNote,
  });
  await writeAudit(getDb(), { actorId: user.id, action: "plate-check.propose", targetType: "technique", targetId: t.id, detail: { still: still.id, revision: out.revision, from: result.revision } });
  // A saved revision is a draft (issue 13); a proposal is meant for review, so it is sent there.
  const sent = await submitTechnique(user, out.slug);
  return { slug: sent.slug, revision: sent.revision };
}
