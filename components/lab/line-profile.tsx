"use client";

import { useState } from "react";
import { CartesianGrid, Legend, Line, LineChart, ResponsiveContainer, Tooltip, XAxis, YAxis } from "recharts";
import { analyseLab, CHANNEL_COLOURS, errorText, labSpaceFields, labSpaceWords, type LabSpaceChoice, type LabStillInfo } from "@/components/lab/lab-api";
import { StillStage, type StagePoint } from "@/components/lab/still-stage";
import { NumberInput } from "@/components/lab/recipe/number-input";
import { Button } from "@/components/ui/button";
import type { RecipeStep } from "@/lib/lab/recipe";
import { stillUrl } from "@/lib/stills/schemas";
import type { LabAnalyseResponse } from "@/lib/lab/analysis-schemas";

type Line = { x0: number; y0: number; x1: number; y1: number };

/** Draw a line across a marker; plot R, G, B along it for the plate (dashed) and the recipe's result (solid). */
export function LineProfile({ still, space, steps }: { still: LabStillInfo; space: LabSpaceChoice; steps: RecipeStep[] }) {
  const [line, setLine] = useState<Line>({ x0: Math.round(still.width * 0.4), y0: Math.round(still.height / 2), x1: Math.round(still.width * 0.6), y1: Math.round(still.height / 2) });
  const [drag, setDrag] = useState<StagePoint | null>(null);
  const [data, setData] = useState<LabAnalyseResponse | null>(null);
  const [status, setStatus] = useState<string | null>(null);
  const stroke = Math.max(1, still.width / 400);

  const plot = async (l: Line = line) => {
    setStatus("Computing the profile…");
    try {
      setData(await analyseLab({ still: still.id, ...labSpaceFields(space), steps, line: l, histogram: false, width: Math.min(still.width, 2048) }));
      setStatus(null);
    } catch (error) {
      setStatus(errorText(error));
    }
  };
  const rows = data?.before.profile
    ? data.before.profile.t.map((t, i) => ({
        t: Math.round(t * 10) / 10,
        r0: data.before.profile!.r[i], g0: data.before.profile!.g[i], b0: data.before.profile!.b[i],
        r1: data.after?.profile?.r[i], g1: data.after?.profile?.g[i], b1: data.after?.profile?.b[i],
      }))
    : [];

  return (
    <div className="space-y-3">
      <StillStage
        width={still.width}
        height={still.height}
        interactive
        label={`${still.alt}. Drag a line across a marker to profile it.`}
        onDown={(p) => { setDrag(p); setLine({ x0: Math.round(p.x), y0: Math.round(p.y), x1: Math.round(p.x), y1: Math.round(p.y) }); }}
        onMove={(p) => drag && setLine((l) => ({ ...l, x1: Math.round(p.x), y1: Math.round(p.y) }))}
        onUp={(p) => {
          if (!drag) return;
          const l = { ...line, x1: Math.round(p.x), y1: Math.round(p.y) };
          setDrag(null);
          setLine(l);
          if (Math.hypot(l.x1 - l.x0, l.y1 - l.y0) >= 2) void plot(l);
        }}
      >
        <image href={stillUrl(still.id, "preview")} width={still.width} height={still.height} preserveAspectRatio="none" />
        <line x1={line.x0} y1={line.y0} x2={line.x1} y2={line.y1} stroke="#ffe14f" strokeWidth={stroke} />
        <circle cx={line.x0} cy={line.y0} r={stroke * 2.5} fill="#ffe14f" />
      </StillStage>
      <div className="flex flex-wrap items-end gap-2" role="group" aria-label="Line ends in pixels">
        {(["x0", "y0", "x1", "y1"] as const).map((k) => (
          <NumberInput key={k} id={`profile-${k}`} label={k.replace("0", " start").replace("1", " end")} unit="px" step={1} value={line[k]} onChange={(v) => setLine({ ...line, [k]: v })} className="w-24" />
        ))}
        <Button variant="primary" onClick={() => plot()}>
          Plot
        </Button>
        <span role="status" className="text-xs text-muted">{status}</span>
      </div>
      {rows.length ? (
        <figure aria-label="Line profile: R, G, B along the line, plate dashed, result solid" className="rounded border border-line bg-surface p-2">
          <ResponsiveContainer width="100%" height={260}>
            <LineChart data={rows} margin={{ top: 8, right: 16, bottom: 8, left: 0 }}>
              <CartesianGrid stroke="var(--color-line)" strokeDasharray="2 4" />
              <XAxis dataKey="t" type="number" domain={["dataMin", "dataMax"]} unit=" px" stroke="var(--color-muted)" fontSize={11} />
              <YAxis stroke="var(--color-muted)" fontSize={11} domain={["auto", "auto"]} tickFormatter={(v: number) => v.toFixed(2)} />
              <Tooltip formatter={(v) => (typeof v === "number" ? v.toFixed(4) : String(v))} contentStyle={{ background: "var(--color-surface-2)", border: "1px solid var(--color-line)" }} />
              <Legend />
              {(["r", "g", "b"] as const).map((c) => (
                <Line key={`${c}0`} dataKey={`${c}0`} name={`${c.toUpperCase()} plate`} stroke={CHANNEL_COLOURS[c]} strokeDasharray="4 3" dot={false} isAnimationActive={false} />
              ))}
              {data?.after
                ? (["r", "g", "b"] as const).map((c) => (
                    <Line key={`${c}1`} dataKey={`${c}1`} name={`${c.toUpperCase()} result`} stroke={CHANNEL_COLOURS[c]} strokeWidth={2} dot={false} isAnimationActive={false} />
                  ))
                : null}
            </LineChart>
          </ResponsiveContainer>
          <figcaption className="text-xs text-muted">
            Values in {labSpaceWords(space)} (0..1), unclipped; distance along the line in full-resolution pixels.
            {data?.approximate ? " Sampled from a resized copy, so blurs are approximate." : ""}
          </figcaption>
        </figure>
      ) : null}
    </div>
  );
}
