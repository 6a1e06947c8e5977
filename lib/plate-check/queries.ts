import "server-only";
import { and, asc, desc, eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { keptRecipes, plateCheckTries, plateChecks, stills, type KeptRecipe, type Still } from "@/db/schema";
import { assertCan, can } from "@/lib/auth/permissions";
import type { SessionUser } from "@/lib/auth/roles";
import type { RecipeStep } from "@/lib/lab/recipe";
import { DETECTOR_VERSION } from "@/lib/plate-check/check";
import type { CheckDto, Findings, KeptRecipeDto, TryResult } from "@/lib/plate-check/schemas";
import { suggestMethods } from "@/lib/plate-check/suggest";
import { getStillForRead } from "@/lib/stills/queries";

/*
 * Reading stored plate checks. Everything follows the still's own visibility (getStillForRead:
 * someone else's private trial is a 404), kept recipes their keeper's alone.
 */

export type StoredCheck = { findings: Findings; checkedAt: Date; detectorVersion: number };

export async function storedCheck(stillId: string): Promise<StoredCheck | null> {
  const [row] = await getDb().select().from(plateChecks).where(eq(plateChecks.stillId, stillId)).limit(1);
  return row ? { findings: row.findings as Findings, checkedAt: row.checkedAt, detectorVersion: row.detectorVersion } : null;
}

/** Tries made against the current findings, in the order they were made. */
export async function storedTries(stillId: string): Promise<TryResult[]> {
  const rows = await getDb()
    .select()
    .from(plateCheckTries)
    .where(and(eq(plateCheckTries.stillId, stillId), eq(plateCheckTries.detectorVersion, DETECTOR_VERSION)))
    .orderBy(asc(plateCheckTries.position), asc(plateCheckTries.createdAt));
  return rows.map((r) => r.result as TryResult);
}

export function toKeptDto(k: KeptRecipe): KeptRecipeDto {
  return { id: k.id, slug: k.techniqueSlug, title: k.techniqueTitle, revision: k.revisionNumber, recipe: k.recipe as RecipeStep[], note: k.note, createdAt: k.createdAt.toISOString() };
}

async function keptFor(user: SessionUser, stillId: string): Promise<KeptRecipeDto[]> {
  const rows = await getDb().select().from(keptRecipes).where(eq(keptRecipes.stillId, stillId)).orderBy(desc(keptRecipes.createdAt));
  return rows.filter((k) => can(user, "recipe:read-kept", { ownerId: k.ownerId })).map(toKeptDto);
}

/**
 * The still's check as its page and GET /api/stills/{id}/check show it: the stored findings
 * (flagged stale when an older detector made them), suggested methods, tries and kept recipes.
 * Null when the still has never been checked.
 */
export async function getPlateCheck(user: SessionUser, stillId: string): Promise<CheckDto | null> {
  assertCan(user, "still:check");
  const still = await getStillForRead(user, stillId);
  return checkDtoFor(user, still);
}

export async function checkDtoFor(user: SessionUser, still: Still): Promise<CheckDto | null> {
  const stored = await storedCheck(still.id);
  if (!stored) return null;
  const [suggestions, tries, kept] = await Promise.all([suggestMethods(user, stored.findings), storedTries(still.id), keptFor(user, still.id)]);
  return {
    stillId: still.id,
    findings: stored.findings,
    checkedAt: stored.checkedAt.toISOString(),
    stale: stored.detectorVersion !== DETECTOR_VERSION,
    suggestions,
    tries: stored.detectorVersion === DETECTOR_VERSION ? tries : [],
    kept,
  };
}

export type MyCheckItem = { stillId: string; alt: string; width: number; height: number; checkedAt: string; summary: string };

/** The reader's own recently checked stills (their trials and uploads), newest first. */
export async function listMyChecks(user: SessionUser, limit = 12): Promise<MyCheckItem[]> {
  assertCan(user, "still:check");
  const rows = await getDb()
    .select({ still: stills, check: plateChecks })
    .from(plateChecks)
    .innerJoin(stills, eq(stills.id, plateChecks.stillId))
    .where(eq(stills.uploaderId, user.id))
    .orderBy(desc(plateChecks.checkedAt))
    .limit(limit);
  return rows.map(({ still, check }) => {
    const f = check.findings as Findings;
    const problems = f.problemTags.map((t) => t.because);
    return {
      stillId: still.id,
      alt: still.alt,
      width: still.width,
      height: still.height,
      checkedAt: check.checkedAt.toISOString(),
      summary: problems.length ? problems.join("; ") : "Nothing found that points to a method.",
    };
  });
}
