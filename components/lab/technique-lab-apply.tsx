"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { errorText, type LabStillInfo } from "@/components/lab/lab-api";
import { TechniqueLab } from "@/components/lab/technique-lab";
import { apiFetch } from "@/lib/api/fetcher";
import type { MatrixStep, RecipeStep } from "@/lib/lab/recipe";
import type { TechniqueDocument } from "@/lib/techniques/document";

type ApplyTechnique = {
  slug: string;
  title: string;
  summary: string;
  aliases: string[];
  tags: string[];
  body: TechniqueDocument;
  recipe: RecipeStep[];
  latestRevision: number;
  approved: boolean;
};

/**
 * The lab for people who may edit the technique: "Apply to recipe" saves the solved or tuned
 * matrix into the technique's recipe as a new revision (PUT /api/techniques/{slug}), replacing
 * the recipe's first matrix step (or adding one in front), the same step the lab previews.
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
      const saved = await apiFetch<{ slug: string; revision: number }>(`/api/techniques/${technique.slug}`, {
        method: "PUT",
        json: {
          title: technique.title,
          summary: technique.summary,
          aliases: technique.aliases,
          tags: technique.tags,
          body: technique.body,
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
