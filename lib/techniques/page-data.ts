import "server-only";
import { rememberedPerViewer, rememberedUntilChange } from "@/lib/remembered-reads";
import { listPairsForTechnique, listStillsForTechnique } from "@/lib/stills/queries";
import { countReviewQueue, getTechnique, listDepartmentMethods } from "@/lib/techniques/queries";
import { techniqueUseCounts } from "@/lib/uses/queries";

/*
 * What a technique page and the signed-in shell read, remembered per viewer until the next
 * committed change to anything pages show (lib/remembered-reads.ts). The same functions answer
 * the API uncached. Each one still runs its permission checks on the first read for a viewer,
 * and what it refused (a draft, a private trial) is never remembered: a refusal throws.
 */

/** The technique as this person may see it; 404 (thrown, not remembered) when they may not. */
export const techniqueForPage = rememberedPerViewer("technique", getTechnique);

/** The before/after pairs and the stills of the technique this person may see. */
export const pairsForPage = rememberedPerViewer("pairs", listPairsForTechnique);
export const stillsForPage = rememberedPerViewer("stills", listStillsForTechnique);

/** The shot log's outcome counts; the table's rows are read by the browser (components/shots/technique-uses-table.tsx). */
export const outcomeCountsForPage = rememberedPerViewer("use-counts", techniqueUseCounts);

/** The review queue's size for the navigation badge. */
export const reviewQueueCountForShell = rememberedPerViewer("review-queue", countReviewQueue);

/**
 * The department's method for each of these problem tags, for the house-method picker (shown only
 * to those whose role may set it; the same for everyone, so not keyed by viewer).
 */
export function departmentMethodsForPage(tagSlugs: string[]): ReturnType<typeof listDepartmentMethods> {
  return rememberedUntilChange(JSON.stringify(["house-methods", ...tagSlugs]), 10 * 60_000, () => listDepartmentMethods(tagSlugs));
}
