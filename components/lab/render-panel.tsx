"use client";

import { LabCompare } from "@/components/lab/lab-compare";
import { useLabRender } from "@/components/lab/use-lab-render";
import { Button } from "@/components/ui/button";
import type { RecipeStep, StepReport } from "@/lib/lab/recipe";
import { stillUrl } from "@/lib/stills/schemas";
import { labSpaceFields, type LabSpaceChoice, type LabStillInfo } from "@/components/lab/lab-api";
import { ExrDownload } from "@/components/lab/exr-download";

const PROXY_WIDTH = 1024;

/** "Render exact": a proxy first, full resolution on request, with progress, cancel and the compare view. */
export function RenderPanel({ still, steps, space }: { still: LabStillInfo; steps: RecipeStep[]; space: LabSpaceChoice }) {
  const { state, start, cancel } = useLabRender();
  const run = async (mode: "proxy" | "full") => {
    const width = mode === "proxy" && still.width > PROXY_WIDTH ? PROXY_WIDTH : undefined;
    // png16 for the exact render keeps the float result's precision for download; webp for a quick look.
    await start({ still: still.id, ...labSpaceFields(space), steps, format: mode === "full" ? "png16" : "webp", width }, mode);
  };
  const running = state.status === "running";
  return (
    <section aria-label="Exact render" className="space-y-3">
      <div className="flex flex-wrap items-center gap-2">
        {/* "Render exact" is always the full-resolution float render; a wide still also offers a quick proxy. */}
        <Button variant="primary" onClick={() => run("full")} disabled={running || !steps.length}>
          Render exact ({still.width}×{still.height})
        </Button>
        {still.width > PROXY_WIDTH ? (
          <Button onClick={() => run("proxy")} disabled={running || !steps.length}>
            Quick preview ({PROXY_WIDTH} px wide)
          </Button>
        ) : null}
        {running ? (
          <Button variant="ghost" onClick={cancel}>
            Cancel
          </Button>
        ) : null}
        {!steps.length ? <span className="text-xs text-muted">Add a step to render.</span> : null}
      </div>
      <div role="status" aria-live="polite" className="text-sm">
        {running ? (
          <div className="space-y-1">
            <div className="h-1.5 overflow-hidden rounded bg-surface-2">
              <div className="h-full w-1/3 animate-pulse rounded bg-accent" />
            </div>
            <p className="text-xs text-muted">
              Rendering {state.mode === "full" ? "at full resolution" : "a preview"} in floating point… {state.elapsed.toFixed(1)} s
            </p>
          </div>
        ) : state.status === "error" ? (
          <div className="text-bad">
            <p>{state.message}</p>
            {state.fields ? (
              <ul className="list-inside list-disc text-xs">
                {Object.entries(state.fields).map(([k, v]) => (
                  <li key={k}>{/^steps\.(\d+)/.test(k) ? `Step ${Number(/^steps\.(\d+)/.exec(k)![1]) + 1} (${k}): ${v}` : `${k}: ${v}`}</li>
                ))}
              </ul>
            ) : null}
          </div>
        ) : state.status === "done" ? (
          <div className="space-y-1">
            <p className="text-xs text-ok">
              {state.result.width}×{state.result.height} {state.result.approximate ? "approximate preview" : "exact render"} in {state.seconds.toFixed(1)} s
              {state.result.cached !== "miss" ? " (from the cache)" : ""}.
            </p>
            {state.result.approximate ? (
              <p className="rounded border border-line bg-surface-2 px-2 py-1 text-xs">
                Approximate: resized to {state.result.width} px wide, and soften and flatten use a fast approximation of the Gaussian.
                Use “Render exact” for the numbers to trust.
              </p>
            ) : null}
          </div>
        ) : null}
      </div>
      {state.status === "done" ? (
        <>
          <LabCompare plateSrc={stillUrl(still.id, "preview")} resultSrc={state.result.url} width={still.width} height={still.height} alt={still.alt} />
          <StepReports reports={state.result.reports} />
          {state.mode === "full" ? (
            <div className="flex flex-wrap items-center gap-4">
              <a className="text-sm text-accent underline" href={state.result.url} download={`lab-${still.id.slice(0, 8)}.png`}>
                Download the 16-bit PNG
              </a>
              <ExrDownload still={still} steps={steps} space={space} />
            </div>
          ) : null}
        </>
      ) : null}
    </section>
  );
}

function StepReports({ reports }: { reports: StepReport[] }) {
  const notable = reports.filter((r) => r.op === "level" || r.op === "matte" || r.op === "flatten");
  if (!notable.length) return null;
  return (
    <ul className="space-y-0.5 text-xs text-muted">
      {notable.map((r) => (
        <li key={r.index} className="font-mono">
          Step {r.index + 1}:{" "}
          {r.op === "level"
            ? `gain ${r.gain.toFixed(4)}, offset ${r.offset.toFixed(4)}, residual ${r.residual.toExponential(2)} over ${r.samples} px`
            : r.op === "matte"
              ? `matte covers ${(r.coverage * 100).toFixed(1)} %`
              : r.op === "flatten"
                ? `${r.thin} px had less than 1 % clean screen within reach (topped up with the frame's mean screen colour)` +
                  (r.leftAsIs ? `; ${r.leftAsIs} px left as they were (no positive screen estimate)` : "")
                : ""}
        </li>
      ))}
    </ul>
  );
}
