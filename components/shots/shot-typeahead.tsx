"use client";

import { useQuery } from "@tanstack/react-query";
import { useId, useState } from "react";
import { TextInput } from "@/components/ui/field";
import { apiFetch } from "@/lib/api/fetcher";
import type { ShotSearchResponse } from "@/lib/shots/schemas";
import { cn } from "@/lib/utils";

/** A shot-code field that suggests codes as you type (combobox pattern, arrow keys and Enter). */
export function ShotTypeahead({ id, value, onChange }: { id: string; value: string; onChange(code: string): void }) {
  const listId = useId();
  const [open, setOpen] = useState(false);
  const [active, setActive] = useState(0);
  const q = value.trim().toUpperCase();
  const suggestions = useQuery({
    queryKey: ["shots", q],
    queryFn: () => apiFetch<ShotSearchResponse>(`/api/shots?q=${encodeURIComponent(q)}&limit=8`),
    enabled: q.length >= 2,
  });
  const items = suggestions.data?.items ?? [];
  return (
    <div className="relative">
      <TextInput
        id={id}
        role="combobox"
        aria-expanded={open && items.length > 0}
        aria-controls={listId}
        aria-autocomplete="list"
        autoComplete="off"
        placeholder="SLM_040_0120"
        className="font-mono"
        value={value}
        onChange={(e) => {
          onChange(e.target.value.toUpperCase());
          setOpen(true);
          setActive(0);
        }}
        onBlur={() => setTimeout(() => setOpen(false), 150)}
        onKeyDown={(e) => {
          if (!items.length) return;
          if (e.key === "ArrowDown") {
            e.preventDefault();
            setActive((a) => Math.min(items.length - 1, a + 1));
          } else if (e.key === "ArrowUp") {
            e.preventDefault();
            setActive((a) => Math.max(0, a - 1));
          } else if (e.key === "Enter" && open) {
            e.preventDefault();
            onChange(items[active]!.code);
            setOpen(false);
          }
        }}
      />
      {open && items.length ? (
        <ul id={listId} role="listbox" className="absolute z-10 mt-1 w-full rounded border border-line bg-surface-2 text-sm shadow-lg">
          {items.map((s, i) => (
            <li
              key={s.code}
              role="option"
              aria-selected={i === active}
              className={cn("cursor-pointer px-2 py-1", i === active && "bg-surface-3")}
              onMouseDown={() => {
                onChange(s.code);
                setOpen(false);
              }}
            >
              <span className="font-mono">{s.code}</span> <span className="text-muted">{s.description}</span>
            </li>
          ))}
        </ul>
      ) : null}
    </div>
  );
}
