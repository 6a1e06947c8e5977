"use client";

import { Button } from "@/components/ui/button";
import { CHANNEL_INDEX, type Channel, type LabSolveResponse } from "@/lib/lab/recipe";
import { cn } from "@/lib/utils";

const NAMES = ["R", "G", "B"] as const;

/** The solved matrix (changed row highlighted), residual contrast and noise gain. */
export function SolverResult({ result, channel, goal, onApply, applyLabel }: {
  result: LabSolveResponse;
  channel: Channel;
  goal: "hide" | "matte";
  onApply(): void;
  applyLabel: string;
}) {
  const c = CHANNEL_INDEX[channel];
  return (
    <div className="space-y-2 rounded border border-line bg-surface-2 p-3">
      <table className="font-mono text-sm tabular-nums">
        <caption className="mb-1 text-left font-sans text-xs text-muted">Solved matrix (row {NAMES[c]} changed)</caption>
        <tbody>
          {result.matrix.map((row, i) => (
            <tr key={i} className={cn(i === c && "text-accent")}>
              <th scope="row" className="pr-2 text-left font-sans text-xs font-normal text-muted">
                {NAMES[i]} out
              </th>
              {row.map((v, j) => (
                <td key={j} className="px-2 text-right">
                  {v.toFixed(5)}
                </td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
      <dl className="grid grid-cols-[auto_1fr] gap-x-3 text-xs">
        <dt className="text-muted">Residual contrast</dt>
        <dd className={cn("font-mono", result.residual < 1e-3 ? "text-ok" : "text-bad")}>{result.residual.toExponential(2)}</dd>
        <dt className="text-muted">Noise gain ‖row‖</dt>
        <dd className={cn("font-mono", result.noiseGain > 3 && "text-bad")}>
          {result.noiseGain.toFixed(3)}
          {result.noiseGain > 3 ? " (amplifies grain; consider restoring grain after)" : ""}
        </dd>
        <dt className="text-muted">{goal === "hide" ? "Marker − screen per shade" : "Error per shade"}</dt>
        <dd className="font-mono">{result.perShade.map((v) => v.toExponential(1)).join(", ")}</dd>
      </dl>
      <Button variant="primary" onClick={onApply}>
        {applyLabel}
      </Button>
    </div>
  );
}
