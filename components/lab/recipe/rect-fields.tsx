"use client";

import { NumberInput } from "@/components/lab/recipe/number-input";
import type { Rect } from "@/lib/lab/recipe";

/** An optional rectangle in full-resolution pixels; absent means the whole frame. */
export function RectFields({ id, rect, onChange, errors }: { id: string; rect: Rect | undefined; onChange(next: Rect | undefined): void; errors: Record<string, string> }) {
  const keys = ["x", "y", "w", "h"] as const;
  const labels = { x: "Left", y: "Top", w: "Width", h: "Height" };
  return (
    <fieldset className="space-y-1">
      <legend className="sr-only">Fit region</legend>
      <label className="flex items-center gap-2 text-sm">
        <input type="checkbox" className="h-4 w-4" checked={rect !== undefined}
          onChange={(e) => onChange(e.target.checked ? { x: 0, y: 0, w: 256, h: 256 } : undefined)} />
        Fit over a rectangle only (else the whole frame)
      </label>
      {rect ? (
        <div className="grid grid-cols-4 gap-2 sm:max-w-md">
          {keys.map((k) => (
            <NumberInput key={k} id={`${id}-rect-${k}`} label={labels[k]} unit="px" step={1} min={k === "w" || k === "h" ? 1 : 0} value={rect[k]}
              onChange={(v) => onChange({ ...rect, [k]: Math.max(k === "w" || k === "h" ? 1 : 0, Math.round(v)) })} error={errors[`rect.${k}`] ?? errors.rect} />
          ))}
        </div>
      ) : null}
    </fieldset>
  );
}
