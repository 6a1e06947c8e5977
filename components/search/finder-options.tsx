"use client";

import { useEffect, useRef } from "react";
import { HighlightedText } from "@/components/search/highlighted-text";
import { StatusBadge } from "@/components/techniques/status-badge";
import type { SuggestItem } from "@/lib/search-ui/params";
import { cn } from "@/lib/utils";

export type FinderOption = { kind: "technique"; item: SuggestItem } | { kind: "recent"; text: string } | { kind: "all"; text: string };

/** The finder's listbox. Options take no focus: the input keeps it and points at the active one. */
export function FinderOptions({ options, active, onHover, onChoose }: { options: FinderOption[]; active: number; onHover(i: number): void; onChoose(o: FinderOption): void }) {
  const listRef = useRef<HTMLUListElement>(null);
  useEffect(() => {
    listRef.current?.querySelector(`#finder-option-${active}`)?.scrollIntoView({ block: "nearest" });
  }, [active]);
  return (
    <ul ref={listRef} id="finder-listbox" role="listbox" aria-label="Techniques" className="max-h-[50vh] overflow-y-auto p-1.5">
      {options.map((o, i) => (
        <li
          key={o.kind === "technique" ? `t-${o.item.slug}` : `${o.kind}-${o.text}`}
          id={`finder-option-${i}`}
          role="option"
          aria-selected={i === active}
          onMouseMove={() => i !== active && onHover(i)}
          // Keep focus in the input when a row is clicked.
          onMouseDown={(e) => e.preventDefault()}
          onClick={() => onChoose(o)}
          className={cn("flex cursor-pointer items-center gap-2 rounded px-2.5 py-2 text-sm", i === active ? "bg-surface-3 text-ink" : "text-ink")}
        >
          <OptionBody option={o} />
        </li>
      ))}
    </ul>
  );
}

function OptionBody({ option }: { option: FinderOption }) {
  if (option.kind === "recent") {
    return (
      <>
        <span aria-hidden className="text-muted">
          ↺
        </span>
        <span>{option.text}</span>
      </>
    );
  }
  if (option.kind === "all") {
    return (
      <span className="text-accent">
        See all results for “{option.text}” <span aria-hidden>→</span>
      </span>
    );
  }
  const { item } = option;
  return (
    <>
      <HighlightedText text={item.title} ranges={item.ranges} className="flex-1" />
      {item.isHouseMethod ? <span className="text-xs text-accent">Department method</span> : null}
      {item.status !== "approved" ? <StatusBadge status={item.status} /> : null}
    </>
  );
}
