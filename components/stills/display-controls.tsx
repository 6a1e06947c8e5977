"use client";

import { useId } from "react";
import { inputClasses } from "@/components/ui/field";
import { EXPOSURE_LIMIT, RANGE_COLOURS, type DisplayOptions } from "@/lib/colour/display";
import { cn } from "@/lib/utils";

const STEP = 0.5;
const swatch = (rgb: readonly number[]) => ({ backgroundColor: `rgb(${rgb.join(",")})` });

/**
 * Exposure in stops (scales the linear values by 2^stops before the sRGB encode) and the
 * out-of-range view. Only the picture changes; the pixel probe keeps reading stored values.
 */
export function DisplayControls({ value, onChange }: { value: DisplayOptions; onChange: (next: DisplayOptions) => void }) {
  const id = useId();
  const set = (exposure: number) => onChange({ ...value, exposure: Math.max(-EXPOSURE_LIMIT, Math.min(EXPOSURE_LIMIT, Math.round(exposure * 100) / 100)) });
  const small = "rounded border border-line bg-surface-2 px-2 py-1 text-xs font-medium hover:bg-surface-3";
  return (
    <div className="flex flex-wrap items-center gap-2" role="group" aria-label="Display">
      <label htmlFor={`${id}-ev`} className="text-xs text-muted">
        Exposure (stops)
      </label>
      <button type="button" className={small} onClick={() => set(value.exposure - STEP)} aria-label={`Exposure down ${STEP} stop`}>
        −
      </button>
      <input
        id={`${id}-ev`}
        type="number"
        step={STEP}
        min={-EXPOSURE_LIMIT}
        max={EXPOSURE_LIMIT}
        value={value.exposure}
        onChange={(e) => set(Number(e.target.value) || 0)}
        className={cn(inputClasses, "w-20 py-1 font-mono text-xs")}
      />
      <button type="button" className={small} onClick={() => set(value.exposure + STEP)} aria-label={`Exposure up ${STEP} stop`}>
        +
      </button>
      {value.exposure !== 0 ? (
        <button type="button" className={small} onClick={() => set(0)}>
          Reset
        </button>
      ) : null}
      <button type="button" aria-pressed={value.view === "range"} className={cn(small, value.view === "range" && "bg-accent text-accent-ink hover:bg-accent hover:brightness-110")} onClick={() => onChange({ ...value, view: value.view === "range" ? "image" : "range" })}>
        Values outside 0–1
      </button>
      {value.view === "range" ? (
        <span className="flex items-center gap-2 text-xs text-muted" aria-live="polite">
          <span className="inline-block h-3 w-3 rounded-sm" style={swatch(RANGE_COLOURS.above)} aria-hidden="true" /> above 1
          <span className="inline-block h-3 w-3 rounded-sm" style={swatch(RANGE_COLOURS.below)} aria-hidden="true" /> below 0
          <span className="inline-block h-3 w-3 rounded-sm" style={swatch(RANGE_COLOURS.both)} aria-hidden="true" /> both (after exposure)
        </span>
      ) : null}
    </div>
  );
}
