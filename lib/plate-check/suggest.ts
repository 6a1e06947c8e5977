import "server-only";
import type { SessionUser } from "@/lib/auth/roles";
import type { RecipeStep } from "@/lib/lab/recipe";
import type { Findings, SuggestedMethod } from "@/lib/plate-check/schemas";
import { runSearch } from "@/lib/search-ui/run";
import { getRevisionsByNumber, getTechnique } from "@/lib/techniques/queries";

/*
 * Methods for what the check found, through the search engine's public entry point: for each
 * problem tag the findings point to, the approved techniques carrying that tag. The department's
 * method for a problem comes first (problems in the order the findings rank them), then the other
 * approved techniques, those answering more of the frame's problems — and its screen colour —
 * before the rest, keeping the engine's order otherwise.
 */

const PER_PROBLEM = 10;
const MAX_SUGGESTIONS = 12;

export async function suggestMethods(user: SessionUser, findings: Findings): Promise<SuggestedMethod[]> {
  const byslug = new Map<string, { title: string; summary: string; problems: string[]; house: number; plate: boolean; rank: number }>();
  let rank = 0;
  for (const [problemIndex, { slug: problem }] of findings.problemTags.entries()) {
    const res = await runSearch(user, { q: "", tag: [problem], status: ["approved"], sort: "relevance", retired: false, exact: false, offset: 0, limit: PER_PROBLEM });
    for (const r of res.results) {
      const entry = byslug.get(r.slug) ?? { title: r.title, summary: r.summary, problems: [], house: Infinity, plate: false, rank: rank++ };
      entry.problems.push(problem);
      if (r.houseMethodFor.includes(problem)) entry.house = Math.min(entry.house, problemIndex);
      if (r.tags.some((t) => findings.plateTags.includes(t.slug))) entry.plate = true;
      byslug.set(r.slug, entry);
    }
  }
  const ordered = [...byslug.entries()]
    .sort(([, a], [, b]) => a.house - b.house || b.problems.length - a.problems.length || Number(b.plate) - Number(a.plate) || a.rank - b.rank)
    .slice(0, MAX_SUGGESTIONS);
  const out: SuggestedMethod[] = [];
  for (const [slug, e] of ordered) {
    const approved = await approvedRecipe(user, slug);
    out.push({ slug, title: e.title, summary: e.summary, problems: e.problems, isHouseMethod: Number.isFinite(e.house), hasRecipe: (approved?.recipe.length ?? 0) > 0 });
  }
  return out;
}

export type ApprovedRecipe = { techniqueId: string; slug: string; title: string; revision: number; recipe: RecipeStep[]; isHouseMethodFor: string[] };

/**
 * A technique's approved recipe — what the department vouches for, even for writers who see a
 * newer draft — or null when it has no approved revision or this person may not see it.
 */
export async function approvedRecipe(user: SessionUser, slug: string): Promise<ApprovedRecipe | null> {
  try {
    const t = await getTechnique(user, slug);
    if (t.approvedRevision === null || t.status === "retired") return null;
    const base = { techniqueId: t.id, slug: t.slug, title: t.title, revision: t.approvedRevision, isHouseMethodFor: t.isHouseMethodFor.map((x) => x.slug) };
    if (t.revision.number === t.approvedRevision) return { ...base, recipe: t.recipe };
    const [r] = await getRevisionsByNumber(user, t.slug, [t.approvedRevision]);
    return { ...base, title: r!.title, recipe: r!.recipe as RecipeStep[] };
  } catch {
    return null;
  }
}
