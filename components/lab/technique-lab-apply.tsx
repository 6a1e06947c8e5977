"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { errorText, type LabStillInfo } from "@/components/lab/lab-api";
import { TechniqueLab } from "@/components/lab/technique-lab";
import { apiFetch } from "@/lib/api/fetcher";
import type { MatrixStep, RecipeStep } from "@/lib/lab/recipe";
import type { TechniqueResponse } from "@/lib/techniques/schemas";

/** What the page gives the lab; the rest of the revision (write-up, aliases, tags) is read when saving. */
type ApplyTechnique = { slug: string; recipe: RecipeStep[]; latestRevision: number; approved: boolean };

/**
 * The lab for people who may edit the technique: "Apply to recipe" saves the solved or tuned
 * matrix into the technique's recipe as a new revision (PUT /api/techniques/{slug}), replacing
 * the recipe's first matrix step (or adding one in front), the same step the lab previews.
 * The revision's other fields are read from the API only when saving, so every page render does
 * not carry the whole write-up a second time; `baseRevision` stays the page's, so a page that is
 * out of date gets the API's 409 rather than overwriting a newer revision.
 */
export function TechniqueLabWithApply({ technique, stills }: { technique: ApplyTechnique; stills: LabStillInfo[] }) {
  const router = useRouter();
  const [status, setStatus] = useState<string | null>(null);
  const apply = async (step: MatrixStep) => {
    const { recipe } = technique;
    const mi = recipe.findIndex((s) => s.op === "matrix");
    const next = mi >= 0 ? recipe.map((s, i) => (i === mi ? step : s)) : [step, ...recipe];
    setStatus("Saving the matrix into the recipe…");
    try {
      const current = await apiFetch<TechniqueResponse>(`/api/techniques/${technique.slug}`);
      const saved = await apiFetch<{ slug: string; revision: number }>(`/api/techniques/${technique.slug}`, {
        method: "PUT",
        json: {
          title: current.title,
          summary: current.summary,
          aliases: current.aliases,
          tags: current.tags.map((t) => t.slug),
          body: current.body,
          recipe: next,
          baseRevision: technique.latestRevision,
          changeNote: `Colour matrix (step ${mi >= 0 ? mi + 1 : 1}) set from the still lab.`,
        },
      });
      setStatus(`Saved into the recipe as revision ${saved.revision}${technique.approved ? ", a draft: submit it for review (top of the page) so readers see it" : ""}.`);
      router.refresh();
    } catch (error) {
      setStatus(`Not saved: ${errorText(error)}`);
    }
  };
  return (
    <div className="space-y-2">
      <TechniqueLab slug={technique.slug} recipe={technique.recipe} stills={stills} canEditRecipe onApplyMatrix={apply} />
      <p role="status" className="text-xs text-muted">
        {status}
      </p>
    </div>
  );
}
