"use client";

import type { KeyboardEvent, ReactNode } from "react";
import { cn } from "@/lib/utils";

export type LabTab = "preview" | "solver" | "profile" | "histogram";
const TABS: [LabTab, string][] = [
  ["preview", "Preview and render"],
  ["solver", "Matrix solver"],
  ["profile", "Line profile"],
  ["histogram", "Histograms"],
];

/** Tabs with arrow-key movement (WAI-ARIA Authoring Practices, tabs pattern). */
export function LabTabs({ tab, onTab, idBase, children }: { tab: LabTab; onTab(t: LabTab): void; idBase: string; children: ReactNode }) {
  const onKey = (e: KeyboardEvent<HTMLDivElement>) => {
    const i = TABS.findIndex(([t]) => t === tab);
    const step = e.key === "ArrowRight" ? 1 : e.key === "ArrowLeft" ? -1 : 0;
    if (!step) return;
    e.preventDefault();
    const next = TABS[(i + step + TABS.length) % TABS.length]![0];
    onTab(next);
    document.getElementById(`${idBase}-tab-${next}`)?.focus();
  };
  return (
    <div>
      <div role="tablist" aria-label="Lab tools" className="mb-3 flex flex-wrap gap-1 border-b border-line" onKeyDown={onKey}>
        {TABS.map(([t, label]) => (
          <button
            key={t}
            id={`${idBase}-tab-${t}`}
            type="button"
            role="tab"
            aria-selected={tab === t}
            aria-controls={`${idBase}-panel`}
            tabIndex={tab === t ? 0 : -1}
            onClick={() => onTab(t)}
            className={cn("-mb-px border-b-2 px-3 py-1.5 text-sm", tab === t ? "border-accent text-accent" : "border-transparent text-muted hover:text-ink")}
          >
            {label}
          </button>
        ))}
      </div>
      <div id={`${idBase}-panel`} role="tabpanel" aria-labelledby={`${idBase}-tab-${tab}`}>
        {children}
      </div>
    </div>
  );
}
