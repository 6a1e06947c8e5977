"use client";

// A client component only to keep the technique page's payload small: the server sends the four
// counts rather than the chart's element tree (issue 19). Its markup is still rendered on the server.
import type { OutcomeCounts } from "@/lib/uses/schemas";

const ROWS = [
  { key: "clean", label: "Clean", bar: "bg-ok" },
  { key: "touch-up", label: "Needed touch-up", bar: "bg-warn" },
  { key: "failed", label: "Failed", bar: "bg-bad" },
] as const;

/** Outcome counts as small horizontal bars, each with its number (not colour alone). */
export function OutcomeChart({ counts }: { counts: OutcomeCounts }) {
  const max = Math.max(1, counts.clean, counts["touch-up"], counts.failed);
  return (
    <figure aria-label="Outcomes">
      <dl className="space-y-2 text-sm">
        {ROWS.map((r) => (
          <div key={r.key}>
            <dt className="flex justify-between">
              <span>{r.label}</span>
              <span className="font-mono" data-testid={`outcome-${r.key}`}>
                {counts[r.key]}
              </span>
            </dt>
            <dd className="mt-0.5 h-2 rounded bg-surface-3">
              <div className={`h-2 rounded ${r.bar}`} style={{ width: `${(counts[r.key] / max) * 100}%` }} />
            </dd>
          </div>
        ))}
      </dl>
      <figcaption className="mt-2 text-xs text-muted">{counts.total} logged uses</figcaption>
    </figure>
  );
}
