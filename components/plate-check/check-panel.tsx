"use client";

import { useCallback, useEffect, useRef, useState } from "react";
import { runCheck, type CheckProgress } from "@/components/plate-check/check-api";
import { FindingCards } from "@/components/plate-check/finding-cards";
import { StillOverlay } from "@/components/plate-check/still-overlay";
import { SuggestionList } from "@/components/plate-check/suggestion-list";
import { TryBoard } from "@/components/plate-check/try-board";
import { Button } from "@/components/ui/button";
import { Skeleton } from "@/components/ui/skeleton";
import { ApiError } from "@/lib/api/fetcher";
import { utcTime } from "@/lib/plate-check/format";
import type { CheckDto } from "@/lib/plate-check/schemas";

type Props = { stillId: string; alt: string; initial: CheckDto | null; tagNames: Record<string, string>; canPropose: boolean };

type RunState = { status: "idle" } | { status: "running"; progress: CheckProgress | null } | { status: "error"; message: string };

/**
 * The plate check on a still's page: runs it when the still has none (or an older detector made
 * it), with the detector stages as progress, then the findings over the still, the suggested
 * methods and the side-by-side tries.
 */
export function CheckPanel({ stillId, alt, initial, tagNames, canPropose }: Props) {
  const [dto, setDto] = useState(initial);
  const [run, setRun] = useState<RunState>({ status: "idle" });
  const started = useRef(false);

  const start = useCallback(
    async (force: boolean) => {
      setRun({ status: "running", progress: null });
      try {
        setDto(await runCheck(stillId, force, (progress) => setRun({ status: "running", progress })));
        setRun({ status: "idle" });
      } catch (error) {
        setRun({ status: "error", message: error instanceof ApiError ? error.message : "The check did not finish. Try again." });
      }
    },
    [stillId],
  );

  useEffect(() => {
    if (started.current || (initial && !initial.stale)) return;
    started.current = true;
    void start(false);
  }, [initial, start]);

  const running = run.status === "running";
  return (
    <div className="space-y-6">
      <div className="flex flex-wrap items-center gap-3">
        <h2 className="text-lg font-semibold">What the plate check measured</h2>
        {dto ? <span className="text-xs text-muted">Checked {utcTime(dto.checkedAt)} · detector version {dto.findings.detectorVersion}</span> : null}
        <Button className="ml-auto" onClick={() => start(true)} disabled={running}>
          {dto ? "Check again" : "Check this plate"}
        </Button>
      </div>
      <div role="status" aria-live="polite">
        {running ? (
          <div className="space-y-1">
            <progress className="h-2 w-full" max={run.progress?.total ?? 1} value={run.progress?.done ?? 0} aria-label="Plate check progress" />
            <p className="text-sm text-muted">{run.progress ? `Measured: ${run.progress.stage} (${run.progress.done} of ${run.progress.total})` : "Reading the frame…"}</p>
          </div>
        ) : run.status === "error" ? (
          <p className="text-sm text-bad">{run.message}</p>
        ) : dto?.stale ? (
          <p className="text-sm text-warn">These findings come from an older version of the check.</p>
        ) : null}
      </div>
      {dto ? (
        <>
          <div className="grid gap-6 lg:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
            <StillOverlay stillId={stillId} alt={alt} findings={dto.findings} />
            <FindingCards findings={dto.findings} tagNames={tagNames} />
          </div>
          <section aria-labelledby="suggested-title" className="space-y-2">
            <h2 id="suggested-title" className="text-lg font-semibold">
              Methods for what was found
            </h2>
            <SuggestionList items={dto.suggestions} tagNames={tagNames} hasProblems={dto.findings.problemTags.length > 0} />
          </section>
          <TryBoard key={dto.checkedAt} stillId={stillId} suggestions={dto.suggestions} initialTries={dto.tries} initialKept={dto.kept} canPropose={canPropose} />
        </>
      ) : running ? (
        <div className="grid gap-6 lg:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]" aria-hidden>
          <Skeleton className="aspect-video w-full" />
          <div className="space-y-3">
            <Skeleton className="h-20 w-full" />
            <Skeleton className="h-20 w-full" />
            <Skeleton className="h-20 w-full" />
          </div>
        </div>
      ) : null}
    </div>
  );
}
