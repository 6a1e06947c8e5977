"use client";

import { createContext, useContext, type ReactNode } from "react";
import { StillThumbChoice } from "@/components/stills/still-thumb-choice";

/** A still a recipe step may name, with what is needed to show it as a thumbnail. */
export type RecipeStill = { id: string; alt: string; role?: string };

const RecipeStillsContext = createContext<RecipeStill[] | null>(null);

/** The stills a recipe editor may pick from (a technique's own), for steps that name a still. */
export function RecipeStillsProvider({ stills, children }: { stills: RecipeStill[]; children: ReactNode }) {
  return <RecipeStillsContext.Provider value={stills}>{children}</RecipeStillsContext.Provider>;
}

/** The grain step's denoised plate, picked by thumbnail from the technique's stills. */
export function DenoisedStillPicker({ id, value, onChange, error }: { id: string; value: string; onChange(id: string): void; error?: string }) {
  const stills = useContext(RecipeStillsContext) ?? [];
  const known = stills.some((s) => s.id === value);
  return (
    <fieldset className="space-y-2" aria-describedby={error ? `${id}-denoised-error` : `${id}-denoised-hint`}>
      <legend className="text-xs text-muted">Denoised plate (the grain is the plate minus this still)</legend>
      {stills.length ? (
        <div className="grid grid-cols-3 gap-2 sm:grid-cols-5">
          {stills.map((s) => (
            <StillThumbChoice key={s.id} name={`${id}-denoised`} still={s} checked={value === s.id} onChoose={onChange} />
          ))}
        </div>
      ) : null}
      <p id={`${id}-denoised-hint`} className="text-xs text-muted">
        {stills.length
          ? value && !known
            ? "The still chosen before is not among this technique's stills; pick one above."
            : "Pick the denoised copy of the plate."
          : "Add the denoised copy of the plate to this technique's stills first (Before and after → Add stills), then pick it here."}
      </p>
      {error ? (
        <p id={`${id}-denoised-error`} role="alert" className="text-xs text-bad">
          {error}
        </p>
      ) : null}
    </fieldset>
  );
}
