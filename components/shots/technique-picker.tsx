"use client";

import { useQuery } from "@tanstack/react-query";
import { useId, useMemo, useState } from "react";
import { TextInput } from "@/components/ui/field";
import { apiFetch } from "@/lib/api/fetcher";
import type { TechniqueListResponse } from "@/lib/techniques/schemas";
import { cn } from "@/lib/utils";

export type PickedTechnique = { slug: string; title: string };

/** Words of the query all found in the title or summary, any case: enough for a list of a few hundred. */
export function matchesTechnique(t: { title: string; summary: string; slug: string }, query: string): boolean {
  const hay = `${t.title} ${t.summary} ${t.slug}`.toLowerCase();
  return query
    .toLowerCase()
    .split(/\s+/)
    .filter(Boolean)
    .every((w) => hay.includes(w));
}

/**
 * Choose an approved technique by typing part of its title (combobox pattern: arrow keys, Enter,
 * Escape). The list is fetched once; filtering happens as you type.
 */
export function TechniquePicker({ id, value, onChange }: { id: string; value: PickedTechnique | null; onChange(t: PickedTechnique | null): void }) {
  const listId = useId();
  const [text, setText] = useState(value?.title ?? "");
  const [open, setOpen] = useState(false);
  const [active, setActive] = useState(0);
  const list = useQuery({
    queryKey: ["techniques", "approved"],
    queryFn: () => apiFetch<TechniqueListResponse>("/api/techniques?status=approved&limit=200"),
    staleTime: 60_000,
  });
  const items = useMemo(() => (list.data?.items ?? []).filter((t) => matchesTechnique(t, text)).slice(0, 12), [list.data, text]);

  function pick(t: PickedTechnique) {
    onChange({ slug: t.slug, title: t.title });
    setText(t.title);
    setOpen(false);
  }

  return (
    <div className="relative">
      <TextInput
        id={id}
        role="combobox"
        aria-expanded={open && items.length > 0}
        aria-controls={listId}
        aria-autocomplete="list"
        aria-activedescendant={open && items[active] ? `${listId}-${active}` : undefined}
        autoComplete="off"
        placeholder={list.isLoading ? "Loading techniques…" : "Type part of a technique's title"}
        value={text}
        onChange={(e) => {
          setText(e.target.value);
          // Typing after a choice undoes it, so the form never posts a title it no longer shows.
          if (value) onChange(null);
          setOpen(true);
          setActive(0);
        }}
        onFocus={() => setOpen(true)}
        onBlur={() => setTimeout(() => setOpen(false), 150)}
        onKeyDown={(e) => {
          if (e.key === "Escape") {
            setOpen(false);
            return;
          }
          if (!items.length) return;
          if (e.key === "ArrowDown") {
            e.preventDefault();
            setOpen(true);
            setActive((a) => Math.min(items.length - 1, a + 1));
          } else if (e.key === "ArrowUp") {
            e.preventDefault();
            setActive((a) => Math.max(0, a - 1));
          } else if (e.key === "Enter" && open) {
            e.preventDefault();
            pick(items[active]!);
          }
        }}
      />
      {list.isError ? (
        <p role="alert" className="mt-1 text-xs text-bad">
          Could not load the techniques.
        </p>
      ) : null}
      {open && items.length ? (
        <ul id={listId} role="listbox" aria-label="Approved techniques" className="absolute z-10 mt-1 max-h-72 w-full overflow-auto rounded border border-line bg-surface-2 text-sm shadow-lg">
          {items.map((t, i) => (
            <li
              key={t.slug}
              id={`${listId}-${i}`}
              role="option"
              aria-selected={i === active}
              className={cn("cursor-pointer px-2 py-1", i === active && "bg-surface-3")}
              onMouseDown={() => pick(t)}
            >
              <span className="block">{t.title}</span>
              {t.summary ? <span className="block truncate text-xs text-muted">{t.summary}</span> : null}
            </li>
          ))}
        </ul>
      ) : null}
      {open && text.trim() && list.isSuccess && !items.length ? <p className="mt-1 text-xs text-muted">No approved technique matches.</p> : null}
    </div>
  );
}
