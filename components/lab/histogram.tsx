"use client";

import { useState } from "react";
import { Area, AreaChart, CartesianGrid, Legend, ResponsiveContainer, Tooltip, XAxis, YAxis } from "recharts";
import { analyseLab, CHANNEL_COLOURS, errorText, labSpaceFields, labSpaceWords, type LabSpaceChoice, type LabStillInfo } from "@/components/lab/lab-api";
import { Choice } from "@/components/lab/recipe/number-input";
import { Button } from "@/components/ui/button";
import type { RecipeStep } from "@/lib/lab/recipe";
import type { HistogramData, LabAnalyseResponse } from "@/lib/lab/analysis-schemas";

/** Per-channel histograms of the plate and of the recipe's float result. */
export function Histogram({ still, space, steps }: { still: LabStillInfo; space: LabSpaceChoice; steps: RecipeStep[] }) {
  const [data, setData] = useState<LabAnalyseResponse | null>(null);
  const [side, setSide] = useState<"before" | "after">("after");
  const [status, setStatus] = useState<string | null>(null);
  const load = async () => {
    setStatus("Counting…");
    try {
      setData(await analyseLab({ still: still.id, ...labSpaceFields(space), steps, line: null, histogram: true, bins: 128, width: Math.min(still.width, 1024) }));
      setStatus(null);
    } catch (error) {
      setStatus(errorText(error));
    }
  };
  const h: HistogramData | null | undefined = side === "after" && data?.after ? data.after.histogram : data?.before.histogram;
  const rows = h ? h.r.map((_, i) => ({ v: Math.round(((h.edges[i]! + h.edges[i + 1]!) / 2) * 1000) / 1000, r: h.r[i], g: h.g[i], b: h.b[i] })) : [];
  return (
    <div className="space-y-3">
      <div className="flex flex-wrap items-end gap-2">
        <Button variant="primary" onClick={load}>
          {data ? "Recount" : "Show histograms"}
        </Button>
        {data?.after ? (
          <Choice id="histogram-side" label="Of" value={side} options={[["before", "The plate"], ["after", "The result"]]} onChange={setSide} />
        ) : null}
        <span role="status" className="text-xs text-muted">{status}</span>
      </div>
      {h ? (
        <figure aria-label={`Histograms of R, G and B, ${side === "after" && data?.after ? "result" : "plate"}`} className="rounded border border-line bg-surface p-2">
          <ResponsiveContainer width="100%" height={220}>
            <AreaChart data={rows} margin={{ top: 8, right: 16, bottom: 8, left: 0 }}>
              <CartesianGrid stroke="var(--color-line)" strokeDasharray="2 4" />
              <XAxis dataKey="v" type="number" domain={[0, 1]} stroke="var(--color-muted)" fontSize={11} />
              <YAxis stroke="var(--color-muted)" fontSize={11} />
              <Tooltip contentStyle={{ background: "var(--color-surface-2)", border: "1px solid var(--color-line)" }} />
              <Legend />
              {(["r", "g", "b"] as const).map((c) => (
                <Area key={c} dataKey={c} name={c.toUpperCase()} type="step" stroke={CHANNEL_COLOURS[c]} fill={CHANNEL_COLOURS[c]} fillOpacity={0.2} isAnimationActive={false} />
              ))}
            </AreaChart>
          </ResponsiveContainer>
          <figcaption className="text-xs text-muted">
            {data!.width}×{data!.height} px in {labSpaceWords(space)}
            {data!.approximate ? " (a resized copy: blurs approximate)" : ""}. Below 0: R {h.below[0]}, G {h.below[1]}, B {h.below[2]}; 1 and
            above: R {h.above[0]}, G {h.above[1]}, B {h.above[2]}.
          </figcaption>
        </figure>
      ) : null}
    </div>
  );
}
