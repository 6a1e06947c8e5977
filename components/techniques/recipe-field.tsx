"use client";

import { useId, useState } from "react";
import { StepCard } from "@/components/lab/recipe/step-card";
import { defaultStep, errorsForStep, opLabel } from "@/components/lab/recipe/defaults";
import { Button } from "@/components/ui/button";
import { Select } from "@/components/ui/field";
import { MAX_STEPS, RECIPE_OPS, type RecipeOp, type RecipeStep } from "@/lib/lab/recipe";

/**
 * The structured editor of a technique's recipe: ordered step cards with typed fields.
 * `errors` may carry form keys ("recipe.3.m"), API keys ("steps.3.m") or bare ones ("3.m").
 */
export function RecipeField({ value, onChange, errors }: { value: RecipeStep[]; onChange(next: RecipeStep[]): void; errors: Record<string, string> }) {
  const idBase = useId().replace(/:/g, "");
  const [op, setOp] = useState<RecipeOp>("matrix");
  const [copied, setCopied] = useState<string | null>(null);
  const whole = errors.recipe ?? errors.steps;

  const replace = (i: number, step: RecipeStep) => onChange(value.map((s, k) => (k === i ? step : s)));
  const move = (i: number, delta: -1 | 1) => {
    const j = i + delta;
    if (j < 0 || j >= value.length) return;
    const next = [...value];
    [next[i], next[j]] = [next[j]!, next[i]!];
    onChange(next);
  };
  const copy = async () => {
    try {
      await navigator.clipboard.writeText(JSON.stringify(value, null, 2));
      setCopied("Recipe copied as JSON.");
    } catch {
      setCopied("Could not reach the clipboard.");
    }
  };

  return (
    <div role="group" aria-labelledby={`${idBase}-title`} aria-describedby={whole ? `${idBase}-error` : undefined} className="space-y-3">
      <div className="flex flex-wrap items-center gap-2">
        <h3 id={`${idBase}-title`} className="mr-auto text-sm font-medium">
          Recipe <span className="text-muted">({value.length} {value.length === 1 ? "step" : "steps"}, run in order on the still)</span>
        </h3>
        <Button onClick={copy} disabled={!value.length}>
          Copy as JSON
        </Button>
        <span role="status" className="text-xs text-muted">
          {copied}
        </span>
      </div>
      {whole ? (
        <p id={`${idBase}-error`} role="alert" className="text-xs text-bad">
          {whole}
        </p>
      ) : null}
      {value.length ? (
        <ol className="space-y-2">
          {value.map((step, i) => (
            <StepCard
              key={i}
              idBase={idBase}
              index={i}
              count={value.length}
              step={step}
              errors={errorsForStep(errors, i)}
              onChange={(next) => replace(i, next)}
              onMove={(d) => move(i, d)}
              onRemove={() => onChange(value.filter((_, k) => k !== i))}
            />
          ))}
        </ol>
      ) : (
        <p className="text-sm text-muted">No steps yet. A recipe makes the technique runnable on a still.</p>
      )}
      <div className="flex flex-wrap items-end gap-2">
        <div>
          <label htmlFor={`${idBase}-add`} className="block text-xs text-muted">
            New step
          </label>
          <Select id={`${idBase}-add`} value={op} onChange={(e) => setOp(e.target.value as RecipeOp)}>
            {RECIPE_OPS.map((o) => (
              <option key={o} value={o}>
                {opLabel(o)}
              </option>
            ))}
          </Select>
        </div>
        <Button onClick={() => onChange([...value, defaultStep(op)])} disabled={value.length >= MAX_STEPS}>
          Add step
        </Button>
      </div>
    </div>
  );
}
