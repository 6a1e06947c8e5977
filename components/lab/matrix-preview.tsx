"use client";

import { useId } from "react";
import { StillStage } from "@/components/lab/still-stage";
import { CHANNEL_INDEX, type LabSpace, type RecipeStep } from "@/lib/lab/recipe";

/** Row-major 3×3 + offset as the 4×5 `values` of feColorMatrix (W3C Filter Effects Module Level 1, §15.10). */
function feValues(m: readonly (readonly number[])[], offset: readonly number[] = [0, 0, 0]): string {
  const rows = [0, 1, 2].map((i) => [m[i]![0]!, m[i]![1]!, m[i]![2]!, 0, offset[i]!]);
  return [...rows.flat(), 0, 0, 0, 1, 0].join(" ");
}

/** The leading matrix and copy steps as matrices (a copy is a matrix too); the browser can show only these. */
export function previewableMatrices(steps: readonly RecipeStep[]): { values: string[]; count: number } {
  const values: string[] = [];
  for (const step of steps) {
    if (step.op === "matrix") values.push(feValues(step.m, step.offset));
    else if (step.op === "copy") {
      const m = [[1, 0, 0], [0, 1, 0], [0, 0, 1]];
      m[CHANNEL_INDEX[step.to]] = [0, 1, 2].map((j) => (j === CHANNEL_INDEX[step.from] ? 1 : 0));
      values.push(feValues(m));
    } else break;
  }
  return { values, count: values.length };
}

/**
 * Live preview of the recipe's leading matrix steps through an SVG filter. The browser clamps
 * to 0..1 between primitives and works on the 8-bit preview, so it is a guide; "Render exact"
 * is the float result. colour-interpolation-filters follows `space` (linearRGB for linear light).
 */
export function MatrixPreview({ src, width, height, alt, steps, space, enabled = true }: {
  src: string;
  width: number;
  height: number;
  alt: string;
  steps: readonly RecipeStep[];
  space: LabSpace;
  enabled?: boolean;
}) {
  const id = `lab-preview-${useId().replace(/:/g, "")}`;
  const { values, count } = previewableMatrices(steps);
  const on = enabled && count > 0;
  return (
    <figure className="space-y-1">
      <StillStage
        width={width}
        height={height}
        label={on ? `${alt}, previewing ${count} matrix step${count === 1 ? "" : "s"}` : alt}
        defs={
          on ? (
            <filter id={id} colorInterpolationFilters={space === "linear" ? "linearRGB" : "sRGB"} x="0" y="0" width="100%" height="100%">
              {values.map((v, i) => (
                <feColorMatrix key={i} type="matrix" values={v} />
              ))}
            </filter>
          ) : undefined
        }
      >
        <image href={src} width={width} height={height} preserveAspectRatio="none" filter={on ? `url(#${id})` : undefined} />
      </StillStage>
      <figcaption className="text-xs text-muted">
        {on
          ? `Browser preview of step${count === 1 ? "" : "s"} 1${count > 1 ? `–${count}` : ""} (${space === "linear" ? "linear light" : "stored values"}, 8-bit, clipped between steps). Render exact for the float result${count < steps.length ? " of every step" : ""}.`
          : steps.length
            ? "The first step is not a colour matrix or copy, so the browser cannot preview it. Render exact to see the result."
            : "The plate as stored."}
      </figcaption>
    </figure>
  );
}
