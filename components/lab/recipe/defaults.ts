import { IDENTITY3, type RecipeOp, type RecipeStep } from "@/lib/lab/recipe";
import { RECIPE_PARAMETER_LABELS } from "@/lib/techniques/recipe-labels";

/** Plain label of an op, capitalised for a heading or an option. */
export function opLabel(op: RecipeOp): string {
  const label = RECIPE_PARAMETER_LABELS[op] ?? op;
  return label.charAt(0).toUpperCase() + label.slice(1);
}

/** A new step of this kind that does nothing surprising until edited. */
export function defaultStep(op: RecipeOp): RecipeStep {
  switch (op) {
    case "matrix":
      return { op, m: IDENTITY3.map((r) => [...r]) as typeof IDENTITY3 };
    case "copy":
      return { op, from: "r", to: "g" };
    case "level":
      return { op, channel: "r", ref: "r", fit: "gain+offset" };
    case "matte":
      return { op, channel: "g", source: "current", black: 0, white: 1 };
    case "grow":
      return { op, px: 2 };
    case "soften":
      return { op, sigma: 2, target: "matte" };
    case "mix":
      return { op, invert: false };
    case "flatten":
      return { op, sigma: 40, color: [0.1, 0.5, 0.15], weight: "outside" };
    case "grain":
      return { op, denoised: "" };
  }
}

/**
 * The errors of step `index`, keyed by the field path inside the step ("m.0.1", "sigma", "op").
 * Accepts form keys ("recipe.3.m"), API keys ("steps.3.m") and bare ones ("3.m").
 */
export function errorsForStep(errors: Record<string, string>, index: number): Record<string, string> {
  const out: Record<string, string> = {};
  for (const [key, message] of Object.entries(errors)) {
    const parts = key.split(".");
    if (parts[0] === "recipe" || parts[0] === "steps") parts.shift();
    if (parts[0] !== String(index)) continue;
    const rest = parts.slice(1).join(".") || "op";
    out[rest] ??= message;
  }
  return out;
}

/** The first error at or under `field` ("m" finds "m.1.2"). */
export function fieldError(errors: Record<string, string>, field: string): string | undefined {
  if (errors[field]) return errors[field];
  const hit = Object.entries(errors).find(([k]) => k.startsWith(`${field}.`));
  return hit ? `${hit[0].slice(field.length + 1).replace(/\./g, ",")}: ${hit[1]}` : undefined;
}
