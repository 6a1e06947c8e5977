"use client";

import { useState } from "react";
import { Badge } from "@/components/ui/badge";
import { SHOT_FIELD_LABELS, type ImportShotsResponse, type ShotField } from "@/lib/shots/schemas";
import { cn } from "@/lib/utils";

type Tab = "create" | "update" | "unchanged" | "errors";
type Line = { row: number; code: string; detail: string; tone: "ok" | "accent" | "neutral" | "bad" };

const show = (v: unknown) => (v === null || v === undefined || v === "" ? "—" : String(v));

function linesOf(plan: ImportShotsResponse, tab: Tab): Line[] {
  const p = plan.preview;
  if (tab === "errors") return plan.errors.map((e) => ({ row: e.row, code: e.code ?? "", detail: e.message, tone: "bad" }));
  if (!p) return [];
  if (tab === "create")
    return p.create.map((s) => ({
      row: s.row,
      code: s.code,
      detail: [s.description, s.frameStart !== null ? `${s.frameStart}–${show(s.frameEnd)}` : "", s.state].filter(Boolean).join(" · "),
      tone: "ok",
    }));
  if (tab === "update")
    return p.update.map((u) => ({
      row: u.row,
      code: u.code,
      detail: Object.entries(u.changes)
        .map(([f, to]) => `${SHOT_FIELD_LABELS[f as ShotField]}: ${show(u.previous[f as keyof typeof u.previous])} → ${show(to)}`)
        .join("; "),
      tone: "accent",
    }));
  return p.unchanged.map((u) => ({ row: u.row, code: u.code, detail: "", tone: "neutral" }));
}

/** The dry-run plan as a table with one tab per kind of row; errors carry their reason. */
export function ImportPreview({ plan, errorsOnly = false }: { plan: ImportShotsResponse; errorsOnly?: boolean }) {
  const [tab, setTab] = useState<Tab>(errorsOnly || plan.errors.length ? "errors" : "create");
  const counts: Record<Tab, number> = { create: plan.created, update: plan.updated, unchanged: plan.unchanged, errors: plan.errors.length };
  const labels: Record<Tab, string> = { create: "New", update: "Changed", unchanged: "Unchanged", errors: "Errors" };
  const tabs: Tab[] = errorsOnly ? ["errors"] : ["create", "update", "unchanged", "errors"];
  const lines = linesOf(plan, tab);

  return (
    <div className="space-y-2">
      <div role="tablist" className="flex gap-2">
        {tabs.map((t) => (
          <button
            key={t}
            role="tab"
            type="button"
            aria-selected={tab === t}
            onClick={() => setTab(t)}
            className={cn("rounded px-2 py-1 text-sm", tab === t ? "bg-accent text-accent-ink" : "bg-surface-2 text-muted")}
          >
            {labels[t]} <span className="font-mono">{counts[t]}</span>
          </button>
        ))}
      </div>
      <div role="tabpanel" className="max-h-96 overflow-auto rounded border border-line">
        <table className="w-full text-sm">
          <thead className="sticky top-0 bg-surface-2 text-left text-xs text-muted">
            <tr>
              <th className="px-2 py-1 font-normal">Row</th>
              <th className="px-2 py-1 font-normal">Shot</th>
              <th className="px-2 py-1 font-normal">{tab === "errors" ? "Reason" : "Details"}</th>
            </tr>
          </thead>
          <tbody>
            {lines.slice(0, 1000).map((l) => (
              <tr key={`${tab}-${l.row}`} className="border-t border-line">
                <td className="px-2 py-1 font-mono text-xs">{l.row}</td>
                <td className="px-2 py-1 font-mono text-xs">
                  <Badge tone={l.tone}>{l.code || "—"}</Badge>
                </td>
                <td className={cn("px-2 py-1", tab === "errors" && "text-bad")}>{l.detail}</td>
              </tr>
            ))}
            {lines.length === 0 ? (
              <tr>
                <td colSpan={3} className="px-2 py-3 text-center text-muted">
                  None.
                </td>
              </tr>
            ) : null}
          </tbody>
        </table>
        {lines.length > 1000 ? <p className="p-2 text-xs text-muted">Showing the first 1,000 of {lines.length}.</p> : null}
      </div>
    </div>
  );
}
