"use client";

import { useState, type KeyboardEvent } from "react";
import { DeliveredPanel } from "@/components/mail/delivered-panel";
import { OutboxPanel } from "@/components/mail/outbox-panel";
import { cn } from "@/lib/utils";

type MailTab = "outbox" | "delivered";
const TABS: [MailTab, string][] = [
  ["outbox", "Outbox"],
  ["delivered", "Delivered"],
];

/** The admin's mail view; tabs follow the WAI-ARIA Authoring Practices tabs pattern (arrow keys, Home, End). */
export function MailView({ initialTab = "outbox" }: { initialTab?: MailTab }) {
  const [tab, setTab] = useState<MailTab>(initialTab);
  const go = (next: MailTab) => {
    setTab(next);
    // Keep the tab in the address so a reload or a shared link opens the same view.
    const url = new URL(window.location.href);
    url.searchParams.set("tab", next);
    window.history.replaceState(null, "", url);
  };
  const onKey = (e: KeyboardEvent<HTMLDivElement>) => {
    const i = TABS.findIndex(([t]) => t === tab);
    let next: number | null = null;
    if (e.key === "ArrowRight") next = (i + 1) % TABS.length;
    else if (e.key === "ArrowLeft") next = (i - 1 + TABS.length) % TABS.length;
    else if (e.key === "Home") next = 0;
    else if (e.key === "End") next = TABS.length - 1;
    if (next === null) return;
    e.preventDefault();
    const t = TABS[next]![0];
    go(t);
    document.getElementById(`mail-tab-${t}`)?.focus();
  };
  return (
    <div>
      <div role="tablist" aria-label="Mail" className="mb-4 flex gap-1 border-b border-line" onKeyDown={onKey}>
        {TABS.map(([t, label]) => (
          <button
            key={t}
            id={`mail-tab-${t}`}
            type="button"
            role="tab"
            aria-selected={tab === t}
            aria-controls={`mail-panel-${t}`}
            tabIndex={tab === t ? 0 : -1}
            onClick={() => go(t)}
            className={cn("-mb-px border-b-2 px-3 py-1.5 text-sm", tab === t ? "border-accent text-accent" : "border-transparent text-muted hover:text-ink")}
          >
            {label}
          </button>
        ))}
      </div>
      {/* Only the open panel is mounted, so only it polls. */}
      <div id={`mail-panel-${tab}`} role="tabpanel" aria-labelledby={`mail-tab-${tab}`} tabIndex={0}>
        {tab === "outbox" ? <OutboxPanel /> : <DeliveredPanel />}
      </div>
    </div>
  );
}
