"use client";

import { useState } from "react";
import { describedBy, FieldError, inputClasses } from "@/components/ui/field";
import type { Channel } from "@/lib/lab/recipe";
import { cn } from "@/lib/utils";

/**
 * A number field that keeps what is being typed ("-", "0.") while only finite numbers reach
 * `onChange`; a new value from outside replaces the text.
 */
export function NumberInput({ id, label, value, onChange, min, max, step = 0.01, unit, error, hideLabel, className }: {
  id: string;
  label: string;
  value: number;
  onChange(next: number): void;
  min?: number;
  max?: number;
  step?: number;
  unit?: string;
  error?: string;
  hideLabel?: boolean;
  className?: string;
}) {
  const [text, setText] = useState(String(value));
  const [seen, setSeen] = useState(value);
  if (value !== seen) {
    setSeen(value);
    if (Number(text) !== value) setText(String(value));
  }
  return (
    <div className={cn("min-w-0", className)}>
      <label htmlFor={id} className={hideLabel ? "sr-only" : "block text-xs text-muted"}>
        {label}
        {unit ? ` (${unit})` : ""}
      </label>
      <input
        id={id}
        type="number"
        inputMode="decimal"
        className={cn(inputClasses, "px-1.5 py-1 font-mono tabular-nums", error && "border-bad")}
        value={text}
        min={min}
        max={max}
        step={step}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy(id, error)}
        onChange={(e) => {
          setText(e.target.value);
          const n = e.target.value.trim() === "" ? NaN : Number(e.target.value);
          if (Number.isFinite(n)) onChange(n);
        }}
      />
      <FieldError id={id} error={error} />
    </div>
  );
}

const CHANNEL_NAMES: Record<Channel, string> = { r: "R (red)", g: "G (green)", b: "B (blue)" };

/** A labelled select with fixed options (channels, fit modes …). */
export function Choice<T extends string>({ id, label, value, options, onChange, error }: {
  id: string;
  label: string;
  value: T;
  options: readonly (readonly [NoInfer<T>, string])[];
  onChange(next: NoInfer<T>): void;
  error?: string;
}) {
  return (
    <div className="min-w-0">
      <label htmlFor={id} className="block text-xs text-muted">
        {label}
      </label>
      <select
        id={id}
        className={cn(inputClasses, "py-1", error && "border-bad")}
        value={value}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy(id, error)}
        onChange={(e) => onChange(e.target.value as T)}
      >
        {options.map(([v, text]) => (
          <option key={v} value={v}>
            {text}
          </option>
        ))}
      </select>
      <FieldError id={id} error={error} />
    </div>
  );
}

export const CHANNEL_OPTIONS = (["r", "g", "b"] as const).map((c) => [c, CHANNEL_NAMES[c]] as const);
