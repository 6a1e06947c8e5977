"use client";

import { useId } from "react";
import { NumberInput } from "@/components/lab/recipe/number-input";
import type { MatrixStep } from "@/lib/lab/recipe";

const NAMES = ["R", "G", "B"] as const;

function Slider({ id, label, value, min, max, onChange }: { id: string; label: string; value: number; min: number; max: number; onChange(v: number): void }) {
  return (
    <div className="flex items-end gap-2">
      <input
        type="range"
        aria-label={label}
        aria-controls={id}
        min={min}
        max={max}
        step={0.001}
        value={Math.min(max, Math.max(min, value))}
        onChange={(e) => onChange(Number(e.target.value))}
        className="mb-2 min-w-0 flex-1 accent-[var(--color-accent)]"
      />
      <NumberInput id={id} label={label} hideLabel value={value} min={-100} max={100} step={0.001} onChange={onChange} className="w-24" />
    </div>
  );
}

/** Sliders and number fields for one matrix step; every change goes straight to the live preview. */
export function MatrixSliders({ step, onChange }: { step: MatrixStep; onChange(next: MatrixStep): void }) {
  const id = useId().replace(/:/g, "");
  const setM = (i: number, j: number, v: number) => {
    const m = step.m.map((r) => [...r]) as MatrixStep["m"];
    m[i]![j] = v;
    onChange({ ...step, m });
  };
  const offset = step.offset ?? [0, 0, 0];
  return (
    <div className="grid gap-3 sm:grid-cols-3">
      {NAMES.map((out, i) => (
        <fieldset key={out} className="space-y-1 rounded border border-line p-2">
          <legend className="px-1 text-xs font-medium">{out} out</legend>
          {NAMES.map((inp, j) => (
            <div key={inp}>
              <span className="text-xs text-muted" aria-hidden>
                × {inp} in
              </span>
              <Slider id={`${id}-${i}-${j}`} label={`${out} out from ${inp} in`} value={step.m[i]![j]!} min={-2} max={2} onChange={(v) => setM(i, j, v)} />
            </div>
          ))}
          <div>
            <span className="text-xs text-muted" aria-hidden>
              + offset
            </span>
            <Slider
              id={`${id}-${i}-o`}
              label={`${out} offset`}
              value={offset[i]!}
              min={-0.5}
              max={0.5}
              onChange={(v) => {
                const o = [...offset] as [number, number, number];
                o[i] = v;
                onChange({ ...step, offset: o });
              }}
            />
          </div>
        </fieldset>
      ))}
    </div>
  );
}
