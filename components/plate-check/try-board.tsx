"use client";

import { useState } from "react";
import { runTries } from "@/components/plate-check/check-api";
import { KeptList } from "@/components/plate-check/kept-list";
import { TryColumn } from "@/components/plate-check/try-column";
import { Button } from "@/components/ui/button";
import { EmptyState } from "@/components/ui/empty-state";
import { ApiError } from "@/lib/api/fetcher";
import type { KeptRecipeDto, SuggestedMethod, TryResult } from "@/lib/plate-check/schemas";

type Props = { stillId: string; suggestions: SuggestedMethod[]; initialTries: TryResult[]; initialKept: KeptRecipeDto[]; canPropose: boolean };

/** Up to three suggested methods run on this very frame, side by side, with what each did. */
export function TryBoard({ stillId, suggestions, initialTries, initialKept, canPropose }: Props) {
  const [tries, setTries] = useState(initialTries);
  const [kept, setKept] = useState(initialKept);
  const [state, setState] = useState<{ status: "idle" } | { status: "running"; started: number } | { status: "error"; message: string }>({ status: "idle" });
  const [picked, setPicked] = useState<string | null>(null);
  const runnable = suggestions.filter((s) => s.hasRecipe).slice(0, 3);

  async function start() {
    setState({ status: "running", started: Date.now() });
    try {
      setTries((await runTries(stillId)).tries);
      setPicked(null);
      setState({ status: "idle" });
    } catch (error) {
      setState({ status: "error", message: error instanceof ApiError ? error.message : "The tries did not run. Try again." });
    }
  }

  return (
    <section aria-labelledby="tries-title" className="space-y-3">
      <div className="flex flex-wrap items-center gap-3">
        <h2 id="tries-title" className="text-lg font-semibold">
          Try them side by side
        </h2>
        {runnable.length ? (
          <Button variant="primary" onClick={start} disabled={state.status === "running"}>
            {tries.length ? "Try again" : `Try ${runnable.length === 1 ? "it" : `these ${runnable.length}`} on this frame`}
          </Button>
        ) : null}
      </div>
      {runnable.length ? (
        <p className="text-sm text-muted">
          {runnable.map((s) => s.title).join(", ")}: each recipe is filled from the findings (markers and screen sampled for the matrix, the screen colour for flattening), solved, and rendered on this frame as a proxy; render any one exactly on request.
        </p>
      ) : (
        <EmptyState title="None of the suggested methods carries a runnable recipe.">Read the suggested methods above and apply them by hand.</EmptyState>
      )}
      <div role="status" aria-live="polite">
        {state.status === "running" ? (
          <div className="space-y-1">
            <div className="h-1.5 overflow-hidden rounded bg-surface-2">
              <div className="h-full w-1/3 animate-pulse rounded bg-accent" />
            </div>
            <p className="text-xs text-muted">Filling, solving and rendering each recipe in floating point…</p>
          </div>
        ) : state.status === "error" ? (
          <p className="text-sm text-bad">{state.message}</p>
        ) : null}
      </div>
      {tries.length ? (
        <div className="grid gap-3 lg:grid-cols-3">
          {tries.map((t) => (
            <TryColumn key={`${t.slug}-${t.revision}`} stillId={stillId} result={t} canPropose={canPropose} picked={picked === t.slug} onPick={() => setPicked(picked === t.slug ? null : t.slug)} onKept={(k) => setKept([k, ...kept])} />
          ))}
        </div>
      ) : null}
      <KeptList items={kept} />
    </section>
  );
}
