"use client";

import { useState } from "react";
import { Histogram } from "@/components/lab/histogram";
import type { LabSpaceChoice, LabStillInfo } from "@/components/lab/lab-api";
import { LineProfile } from "@/components/lab/line-profile";
import { MatrixPreview } from "@/components/lab/matrix-preview";
import { MatrixSliders } from "@/components/lab/matrix-sliders";
import { MatrixSolver } from "@/components/lab/matrix-solver";
import { RecipeHelp } from "@/components/lab/recipe-help";
import { RenderPanel } from "@/components/lab/render-panel";
import { StillChoice } from "@/components/lab/still-choice";
import { LabTabs, type LabTab } from "@/components/lab/lab-tabs";
import { Choice } from "@/components/lab/recipe/number-input";
import { Button } from "@/components/ui/button";
import { IDENTITY3, type MatrixStep, type RecipeStep } from "@/lib/lab/recipe";
import { spaceChoices } from "@/components/lab/space-choices";
import { stillUrl } from "@/lib/stills/schemas";

type TechniqueLabProps = {
  slug: string;
  recipe: RecipeStep[];
  /** The technique's (before) stills. */
  stills: LabStillInfo[];
  canEditRecipe: boolean;
  /** Called with a solved or hand-tuned matrix step when someone with edit rights applies it. */
  onApplyMatrix?(step: MatrixStep): void;
};

/** The still lab on a technique page: live matrix preview, exact render, solver and plots on a working copy of the recipe. */
export function TechniqueLab({ slug, recipe, stills, canEditRecipe, onApplyMatrix }: TechniqueLabProps) {
  const [still, setStill] = useState<LabStillInfo | null>(stills[0] ?? null);
  const [space, setSpace] = useState<LabSpaceChoice>("linear");
  const [tab, setTab] = useState<LabTab>("preview");
  const [steps, setSteps] = useState<RecipeStep[]>(recipe);
  const [source, setSource] = useState(recipe);
  if (recipe !== source) {
    // The technique's recipe changed (edited or applied): start the working copy from it again.
    setSource(recipe);
    setSteps(recipe);
  }
  const mi = steps.findIndex((s) => s.op === "matrix");
  const matrix = mi >= 0 ? (steps[mi] as MatrixStep) : null;
  const setMatrix = (m: MatrixStep) => setSteps(mi >= 0 ? steps.map((s, i) => (i === mi ? m : s)) : [m, ...steps]);
  const canApply = canEditRecipe && onApplyMatrix !== undefined;

  return (
    <section aria-labelledby={`lab-${slug}`} className="space-y-3 rounded-lg border border-line bg-surface p-4">
      <div className="flex flex-wrap items-end gap-3">
        <h2 id={`lab-${slug}`} className="mr-auto text-base font-semibold">
          Still lab
        </h2>
        <Choice id={`lab-${slug}-space`} label="Work in" value={space} options={spaceChoices(still)} onChange={setSpace} />
        {steps !== recipe ? (
          <Button variant="ghost" onClick={() => setSteps(recipe)}>
            Back to the technique&apos;s recipe
          </Button>
        ) : null}
      </div>
      <StillChoice stills={stills} value={still?.id ?? ""} onChange={setStill} />
      {!still ? (
        <p className="text-sm text-muted">This technique has no stills yet. Try the recipe on a still of your own.</p>
      ) : (
        <LabTabs tab={tab} onTab={setTab} idBase={`lab-${slug}`}>
          {tab === "preview" ? (
            <div className="space-y-3">
              <MatrixPreview src={stillUrl(still.id, "preview")} width={still.width} height={still.height} alt={still.alt} steps={steps} space={space === "stored" ? "stored" : "linear"} />
              {matrix ? (
                <details open className="rounded border border-line p-2">
                  <summary className="cursor-pointer text-sm font-medium">Colour matrix (step {mi + 1})</summary>
                  <div className="mt-2 space-y-2">
                    <MatrixSliders step={matrix} onChange={setMatrix} />
                    {canApply ? <Button onClick={() => onApplyMatrix(matrix)}>Use this matrix in the recipe</Button> : null}
                  </div>
                </details>
              ) : (
                <Button onClick={() => setMatrix({ op: "matrix", m: IDENTITY3.map((r) => [...r]) as MatrixStep["m"] })}>Try a colour matrix first</Button>
              )}
              <RecipeHelp steps={steps} />
              <RenderPanel key={`${still.id}-${space}`} still={still} steps={steps} space={space} />
            </div>
          ) : tab === "solver" ? (
            <MatrixSolver
              key={still.id}
              still={still}
              space={space}
              applyLabel={canApply ? "Apply to recipe" : "Try it in the lab"}
              onApply={(m) => {
                setMatrix(m);
                if (canApply) onApplyMatrix(m);
                setTab("preview");
              }}
            />
          ) : tab === "profile" ? (
            <LineProfile key={still.id} still={still} space={space} steps={steps} />
          ) : (
            <Histogram key={still.id} still={still} space={space} steps={steps} />
          )}
        </LabTabs>
      )}
    </section>
  );
}
