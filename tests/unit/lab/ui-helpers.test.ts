import { createElement } from "react";
import { renderToStaticMarkup } from "react-dom/server";
import { describe, expect, it } from "vitest";
import { RecipeField } from "@/components/techniques/recipe-field";
import { errorsForStep } from "@/components/lab/recipe/defaults";
import { previewableMatrices } from "@/components/lab/matrix-preview";
import { copyChannel, matrixInPlace } from "@/lib/lab/kernels";
import type { RecipeStep } from "@/lib/lab/recipe";

/** feColorMatrix per W3C Filter Effects Module Level 1 §15.10: R' = a00·R + a01·G + a02·B + a03·A + a04, … */
function applyFe(values: string, rgb: number[]): number[] {
  const a = values.split(" ").map(Number);
  return [0, 1, 2].map((i) => a[i * 5]! * rgb[0]! + a[i * 5 + 1]! * rgb[1]! + a[i * 5 + 2]! * rgb[2]! + a[i * 5 + 3]! * 1 + a[i * 5 + 4]!);
}

describe("browser preview matches the engine's step semantics", () => {
  it("matrix (row i makes output i, plus offset) and copy steps give the engine's values", () => {
    const steps: RecipeStep[] = [
      { op: "matrix", m: [[0.9, 0.05, 0.02], [0.1, 0.8, 0.1], [-0.1, 0.2, 0.7]], offset: [0.01, -0.02, 0.03] },
      { op: "copy", from: "b", to: "r" },
      { op: "mix", invert: false },
    ];
    const { values, count } = previewableMatrices(steps);
    expect(count).toBe(2);
    const px = [0.2, 0.6, 0.3];
    const viaFe = applyFe(values[1]!, applyFe(values[0]!, px));
    const engine = new Float32Array(px);
    matrixInPlace(engine, (steps[0] as Extract<RecipeStep, { op: "matrix" }>).m, [0.01, -0.02, 0.03]);
    copyChannel(engine, 2, 0);
    for (let c = 0; c < 3; c++) expect(viaFe[c]).toBeCloseTo(engine[c]!, 6);
  });
});

describe("recipe field errors", () => {
  it("finds a step's errors under form, API and bare keys", () => {
    expect(errorsForStep({ "recipe.3.m.0.1": "a", "steps.3.sigma": "b", "3.op": "c", "recipe.2.m": "x" }, 3)).toEqual({ "m.0.1": "a", sigma: "b", op: "c" });
  });

  it("renders labelled fields with the error beside the matrix cell", () => {
    const html = renderToStaticMarkup(
      createElement(RecipeField, {
        value: [{ op: "matrix", m: [[1, 0, 0], [0, 1, 0], [0, 0, 1]] }, { op: "copy", from: "r", to: "g" }],
        onChange: () => undefined,
        errors: { "recipe.0.m.1.2": "must be between -100 and 100" },
      }),
    );
    expect(html).toContain("G out from B in");
    expect(html).toMatch(/aria-invalid="true"[^>]*aria-describedby="[^"]*-m-1-2-error"|aria-describedby="[^"]*-m-1-2-error"[^>]*aria-invalid/);
    expect(html).toContain("must be between -100 and 100");
    expect(html).toContain("Copy as JSON");
    expect(html).toContain("From channel");
  });
});
