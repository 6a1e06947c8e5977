"use client";

// A client component only to keep the page's payload small: the server sends the recipe (which the
// lab and the JSON button need anyway) rather than every card's element tree (issue 19). Its markup
// is still rendered on the server.
import type { RecipeStep } from "@/lib/lab/recipe";
import { RECIPE_PARAMETER_LABELS } from "@/lib/techniques/recipe-labels";
import { CopyJsonButton } from "@/components/techniques/copy-json-button";

const fmt = (v: number) => (Number.isInteger(v) ? String(v) : v.toFixed(4).replace(/0+$/, ""));
const ch = (c: string) => c.toUpperCase();

function describe(step: RecipeStep, stillAlt: (id: string) => string): Array<[string, string]> {
  switch (step.op) {
    case "matrix":
      return [
        ["rows (R, G, B out)", step.m.map((row) => `[${row.map(fmt).join(", ")}]`).join("  ")],
        ...(step.offset ? ([["offset", `[${step.offset.map(fmt).join(", ")}]`]] as Array<[string, string]>) : []),
      ];
    case "copy":
      return [["route", `${ch(step.from)} → ${ch(step.to)}`]];
    case "level":
      return [["fit", `${ch(step.channel)} to plate ${ch(step.ref)} (${step.fit})`], ["area", step.rect ? `${step.rect.w}×${step.rect.h} at ${step.rect.x},${step.rect.y}` : "whole frame"]];
    case "matte":
      return [
        ["from", Array.isArray(step.channel) ? `weights [${step.channel.map(fmt).join(", ")}]` : ch(step.channel)],
        ["black / white", `${fmt(step.black)} / ${fmt(step.white)}`],
        ["source", step.source],
      ];
    case "grow":
      return [[step.px >= 0 ? "grow" : "shrink", `${Math.abs(step.px)} px`]];
    case "soften":
      return [["sigma", `${fmt(step.sigma)} px`], ["applies to", step.target === "matte" ? "matte" : `channel ${ch(step.target)}`]];
    case "mix":
      return [["result", step.invert ? "cleaned outside the matte" : "cleaned inside the matte, plate outside"]];
    case "flatten":
      return [["sigma", `${fmt(step.sigma)} px`], ["target colour", `[${step.color.map(fmt).join(", ")}]`], ["screen sampled", step.weight]];
    case "grain":
      return [["denoised plate", stillAlt(step.denoised)]];
  }
}

/** A recipe as readable cards, with the exact JSON one click away. `stills` names the stills a step refers to. */
export function RecipeCards({ recipe, stills = [] }: { recipe: RecipeStep[]; stills?: { id: string; alt: string }[] }) {
  // A still is named by its description, never by its id.
  const stillAlt = (id: string) => stills.find((s) => s.id === id)?.alt ?? "a still of this technique";
  if (!recipe.length) return <p className="text-sm text-muted">This technique has no runnable parameters yet.</p>;
  return (
    <div className="space-y-3">
      <ol className="grid gap-2 sm:grid-cols-2 lg:grid-cols-3">
        {recipe.map((step, i) => (
          <li key={i} className="rounded border border-line bg-surface-2 p-3 text-sm">
            <p className="mb-1 font-medium">
              <span className="mr-1 text-muted">{i + 1}.</span>
              {RECIPE_PARAMETER_LABELS[step.op] ?? step.op}
            </p>
            <dl className="space-y-0.5">
              {describe(step, stillAlt).map(([k, v]) => (
                <div key={k} className="flex gap-2">
                  <dt className="text-muted">{k}</dt>
                  <dd className="font-mono text-xs leading-5 break-all">{v}</dd>
                </div>
              ))}
            </dl>
          </li>
        ))}
      </ol>
      <CopyJsonButton value={recipe} label="Copy recipe as JSON" />
    </div>
  );
}
