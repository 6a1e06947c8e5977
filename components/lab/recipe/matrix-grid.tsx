"use client";

import { NumberInput } from "@/components/lab/recipe/number-input";

type Vec3 = [number, number, number];
type Mat3 = [Vec3, Vec3, Vec3];
const NAMES = ["R", "G", "B"] as const;

/** 3×3 colour matrix as a grid of number fields; row i makes output channel i. */
export function MatrixGrid({ id, m, onChange, errors }: { id: string; m: Mat3; onChange(next: Mat3): void; errors: Record<string, string> }) {
  const set = (i: number, j: number, v: number) => {
    const next = m.map((row) => [...row]) as Mat3;
    next[i]![j] = v;
    onChange(next);
  };
  return (
    <fieldset>
      <legend className="text-xs text-muted">Matrix (row = output channel, column = input channel)</legend>
      <div className="mt-1 grid grid-cols-[auto_repeat(3,minmax(0,5.5rem))] items-center gap-1 text-xs" role="group">
        <span />
        {NAMES.map((n) => (
          <span key={n} className="text-center text-muted" aria-hidden>
            from {n}
          </span>
        ))}
        {m.map((row, i) => [
          <span key={`h${i}`} className="pr-1 text-muted" aria-hidden>
            {NAMES[i]} out
          </span>,
          ...row.map((v, j) => (
            <NumberInput
              key={`${i}${j}`}
              id={`${id}-m-${i}-${j}`}
              label={`${NAMES[i]} out from ${NAMES[j]} in`}
              hideLabel
              value={v}
              min={-100}
              max={100}
              onChange={(n) => set(i, j, n)}
              error={errors[`m.${i}.${j}`]}
            />
          )),
        ])}
      </div>
    </fieldset>
  );
}

/** Three labelled numbers (offset, colour, weights). */
export function Vec3Inputs({ id, legend, v, onChange, errors, field, min = -100, max = 100 }: {
  id: string;
  legend: string;
  v: Vec3;
  onChange(next: Vec3): void;
  errors: Record<string, string>;
  field: string;
  min?: number;
  max?: number;
}) {
  return (
    <fieldset>
      <legend className="text-xs text-muted">{legend}</legend>
      <div className="mt-1 grid grid-cols-3 gap-1 sm:max-w-80">
        {v.map((value, k) => (
          <NumberInput
            key={k}
            id={`${id}-${field}-${k}`}
            label={NAMES[k]!}
            value={value}
            min={min}
            max={max}
            onChange={(n) => {
              const next = [...v] as Vec3;
              next[k] = n;
              onChange(next);
            }}
            error={errors[`${field}.${k}`]}
          />
        ))}
      </div>
    </fieldset>
  );
}
