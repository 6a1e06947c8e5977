"use client";

import { useState } from "react";
import { errorText, labSpaceFields, sampleBoxes, solveMatrix, type LabSpaceChoice, type LabStillInfo } from "@/components/lab/lab-api";
import { SampleBoxes, type PickedBox, type SampleKind } from "@/components/lab/sample-boxes";
import { SolverResult } from "@/components/lab/solver-result";
import { CHANNEL_OPTIONS, Choice, NumberInput } from "@/components/lab/recipe/number-input";
import { Button } from "@/components/ui/button";
import type { Channel, LabSolveResponse, MatrixStep } from "@/lib/lab/recipe";
import { stillUrl } from "@/lib/stills/schemas";

/** Pick marker and screen samples, solve one channel's matrix row, apply it to the recipe. */
export function MatrixSolver({ still, space, onApply, applyLabel = "Apply to recipe" }: {
  still: LabStillInfo;
  space: LabSpaceChoice;
  onApply(step: MatrixStep): void;
  applyLabel?: string;
}) {
  const [kind, setKind] = useState<SampleKind>("marker");
  const [boxes, setBoxes] = useState<PickedBox[]>([]);
  const [goal, setGoal] = useState<"hide" | "matte">("hide");
  const [channel, setChannel] = useState<Channel>("r");
  const [manual, setManual] = useState({ x: Math.round(still.width / 2), y: Math.round(still.height / 2), size: 8 });
  const [busy, setBusy] = useState(false);
  const [message, setMessage] = useState<string | null>(null);
  const [result, setResult] = useState<(LabSolveResponse & { samples: [number, number, number][] }) | null>(null);
  const markers = boxes.filter((b) => b.kind === "marker"), screens = boxes.filter((b) => b.kind === "screen");

  const solve = async () => {
    setBusy(true);
    setMessage("Sampling and solving…");
    try {
      const ordered = [...markers, ...screens];
      const { samples } = await sampleBoxes({ still: still.id, ...labSpaceFields(space), boxes: ordered.map(({ x, y, w, h }) => ({ x, y, w, h })) });
      const solved = await solveMatrix({ markers: samples.slice(0, markers.length), screen: samples.slice(markers.length), goal: { kind: goal, channel } });
      setResult({ ...solved, samples });
      setMessage(null);
    } catch (error) {
      setMessage(errorText(error));
    } finally {
      setBusy(false);
    }
  };

  return (
    <div className="space-y-3">
      <div className="flex flex-wrap items-end gap-3" role="group" aria-label="Sample kind and goal">
        <Choice id="solver-kind" label="Next box samples" value={kind} options={[["marker", "A marker"], ["screen", "The screen"]]} onChange={setKind} />
        <Choice id="solver-goal" label="Goal" value={goal} options={[["hide", "Hide markers in a channel"], ["matte", "Matte: markers 1, screen 0"]]} onChange={setGoal} />
        <Choice id="solver-channel" label="Channel" value={channel} options={CHANNEL_OPTIONS} onChange={setChannel} />
      </div>
      <SampleBoxes src={stillUrl(still.id, "preview")} width={still.width} height={still.height} alt={still.alt} kind={kind} boxes={boxes} onAdd={(b) => setBoxes((all) => [...all, b])} />
      <div className="flex flex-wrap items-end gap-2 text-sm" role="group" aria-label="Add a box by numbers">
        <NumberInput id="solver-x" label="Centre x" unit="px" step={1} value={manual.x} onChange={(x) => setManual({ ...manual, x })} className="w-24" />
        <NumberInput id="solver-y" label="Centre y" unit="px" step={1} value={manual.y} onChange={(y) => setManual({ ...manual, y })} className="w-24" />
        <NumberInput id="solver-size" label="Half size" unit="px" step={1} value={manual.size} onChange={(size) => setManual({ ...manual, size })} className="w-24" />
        <Button
          onClick={() => {
            const s = Math.max(1, Math.round(manual.size));
            const x = Math.max(0, Math.round(manual.x) - s), y = Math.max(0, Math.round(manual.y) - s);
            setBoxes((all) => [...all, { kind, x, y, w: Math.min(2 * s + 1, still.width - x), h: Math.min(2 * s + 1, still.height - y) }]);
          }}
        >
          Add {kind} box
        </Button>
      </div>
      <ul className="space-y-1 text-xs" aria-label="Picked samples">
        {boxes.map((b, i) => (
          <li key={i} className="flex items-center gap-2 font-mono">
            <span className={b.kind === "marker" ? "text-accent" : "text-muted"}>{b.kind === "marker" ? "Marker" : "Screen"}</span>
            {b.w}×{b.h} at ({b.x}, {b.y}){result?.samples[i] && i < result.samples.length ? ` → ${result.samples[i].map((v) => v.toFixed(4)).join(", ")}` : ""}
            <Button variant="ghost" className="px-1.5 py-0.5 text-xs" aria-label={`Remove ${b.kind} box ${i + 1}`} onClick={() => { setBoxes((all) => all.filter((_, k) => k !== i)); setResult(null); }}>
              Remove
            </Button>
          </li>
        ))}
      </ul>
      <div className="flex items-center gap-2">
        <Button variant="primary" onClick={solve} disabled={busy || !markers.length || !screens.length}>
          Solve
        </Button>
        <span role="status" className="text-xs text-muted">
          {message ?? (!markers.length || !screens.length ? "Pick at least one marker box and one screen box." : "")}
        </span>
      </div>
      {result ? <SolverResult result={result} channel={channel} goal={goal} onApply={() => onApply({ op: "matrix", m: result.matrix })} applyLabel={applyLabel} /> : null}
    </div>
  );
}
