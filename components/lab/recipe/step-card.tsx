"use client";

import { useState } from "react";
import { StepFields } from "@/components/lab/recipe/step-fields";
import { opLabel } from "@/components/lab/recipe/defaults";
import { STEP_HELP } from "@/components/lab/recipe/step-help";
import { Button } from "@/components/ui/button";
import type { RecipeStep } from "@/lib/lab/recipe";
import { cn } from "@/lib/utils";

/** One step of the recipe: heading, move up/down, remove (confirmed), and its fields. */
export function StepCard({ idBase, index, count, step, errors, onChange, onMove, onRemove }: {
  idBase: string;
  index: number;
  count: number;
  step: RecipeStep;
  errors: Record<string, string>;
  onChange(next: RecipeStep): void;
  onMove(delta: -1 | 1): void;
  onRemove(): void;
}) {
  const [confirming, setConfirming] = useState(false);
  const id = `${idBase}-${index}`;
  const stepError = errors.op ?? errors[""];
  return (
    <li className={cn("rounded-lg border border-line bg-surface-2 p-3", Object.keys(errors).length && "border-bad/60")} aria-labelledby={`${id}-title`}>
      <div className="mb-2 flex flex-wrap items-center gap-2">
        <h4 id={`${id}-title`} className="mr-auto text-sm font-semibold">
          <span className="mr-2 font-mono text-muted">{index + 1}.</span>
          {opLabel(step.op)}
        </h4>
        <Button variant="ghost" className="px-2 py-1" onClick={() => onMove(-1)} disabled={index === 0} aria-label={`Move step ${index + 1} up`}>
          ↑
        </Button>
        <Button variant="ghost" className="px-2 py-1" onClick={() => onMove(1)} disabled={index === count - 1} aria-label={`Move step ${index + 1} down`}>
          ↓
        </Button>
        {confirming ? (
          <span className="flex items-center gap-1 text-sm" role="group" aria-label="Confirm removal">
            Remove this step?
            <Button variant="danger" className="px-2 py-1" onClick={onRemove} autoFocus>
              Remove
            </Button>
            <Button variant="ghost" className="px-2 py-1" onClick={() => setConfirming(false)}>
              Keep
            </Button>
          </span>
        ) : (
          <Button variant="ghost" className="px-2 py-1 text-bad" onClick={() => setConfirming(true)} aria-label={`Remove step ${index + 1}`}>
            Remove
          </Button>
        )}
      </div>
      {stepError ? (
        <p role="alert" className="mb-2 text-xs text-bad">
          {stepError}
        </p>
      ) : null}
      <StepFields id={id} step={step} onChange={onChange} errors={errors} />
      <details className="mt-2 text-xs text-muted">
        <summary className="cursor-pointer select-none">What this step computes</summary>
        <p className="mt-1 max-w-prose leading-5">{STEP_HELP[step.op]}</p>
      </details>
    </li>
  );
}
