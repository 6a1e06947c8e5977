import { opLabel } from "@/components/lab/recipe/defaults";
import { STEP_HELP } from "@/components/lab/recipe/step-help";
import type { RecipeStep } from "@/lib/lab/recipe";

/** The lab's recipe, each step with what it computes (the same words as the recipe editor's). */
export function RecipeHelp({ steps }: { steps: RecipeStep[] }) {
  if (!steps.length) return null;
  return (
    <details className="rounded border border-line p-2">
      <summary className="cursor-pointer text-sm font-medium">
        The recipe&apos;s {steps.length} {steps.length === 1 ? "step" : "steps"} and what each computes
      </summary>
      <ol className="mt-2 space-y-2 text-xs">
        {steps.map((step, i) => (
          <li key={i}>
            <span className="mr-1 font-mono text-muted">{i + 1}.</span>
            <span className="font-medium">{opLabel(step.op)}</span>
            <p className="mt-0.5 max-w-prose leading-5 text-muted">{STEP_HELP[step.op]}</p>
          </li>
        ))}
      </ol>
    </details>
  );
}
