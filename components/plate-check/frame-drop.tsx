"use client";

import { useRouter } from "next/navigation";
import { useCallback, useRef, useState } from "react";
import { useDropzone } from "react-dropzone";
import { ConfidentialNotice } from "@/components/stills/confidential-notice";
import { sendStill } from "@/components/stills/upload-request";
import { Button } from "@/components/ui/button";
import { cn } from "@/lib/utils";

type State = { status: "idle" } | { status: "uploading"; name: string; progress: number } | { status: "failed"; message: string };

/**
 * Drop (or pick) one frame: it is uploaded as the reader's private trial and its still page opens,
 * where the plate check runs. `compact` is the search page's one-line form.
 */
export function FrameDrop({ compact = false, maxBytes = 80 * 1024 * 1024 }: { compact?: boolean; maxBytes?: number }) {
  const router = useRouter();
  const [state, setState] = useState<State>({ status: "idle" });
  const abort = useRef<(() => void) | null>(null);

  const onDrop = useCallback(
    async (files: File[]) => {
      const file = files[0];
      if (!file) return;
      if (file.size > maxBytes) {
        setState({ status: "failed", message: `This file is larger than ${Math.round(maxBytes / (1024 * 1024))} MB, the most Plateroom accepts.` });
        return;
      }
      setState({ status: "uploading", name: file.name, progress: 0 });
      const { done, abort: stop } = sendStill(file, { alt: `Frame dropped for a plate check (${file.name})`.slice(0, 300), owner: "trial" }, (progress) =>
        setState({ status: "uploading", name: file.name, progress }),
      );
      abort.current = stop;
      const outcome = await done;
      abort.current = null;
      if (outcome.ok) router.push(`/stills/${outcome.still.id}`);
      else setState(outcome.cancelled ? { status: "idle" } : { status: "failed", message: outcome.message });
    },
    [maxBytes, router],
  );
  const { getRootProps, getInputProps, isDragActive, open } = useDropzone({ onDrop: (files: File[]) => void onDrop(files), multiple: false, noClick: true, noKeyboard: true });
  const busy = state.status === "uploading";

  return (
    <section aria-label="Drop a frame to check it" className="space-y-2">
      <div
        {...getRootProps({
          className: cn(
            "flex items-center gap-3 rounded border-2 border-dashed border-line bg-surface-2 text-sm",
            compact ? "flex-wrap px-3 py-2" : "flex-col px-4 py-8 text-center",
            isDragActive && "border-accent text-accent",
          ),
        })}
      >
        <input {...getInputProps({ "aria-label": "Choose a frame to check" })} />
        <p className={compact ? "" : "text-base"}>
          {isDragActive ? "Drop the frame to check it." : compact ? "Can't put it into words? Or drop a frame here" : "Drop a frame here — PNG, TIFF, JPEG, WebP or OpenEXR — and Plateroom measures what is on it."}
        </p>
        <Button variant={compact ? "secondary" : "primary"} onClick={open} disabled={busy}>
          Choose a frame…
        </Button>
      </div>
      <div role="status" aria-live="polite" className="text-sm">
        {state.status === "uploading" ? (
          <div className="flex items-center gap-3">
            <progress className="h-2 w-48" max={1} value={state.progress} aria-label={`Uploading ${state.name}`} />
            <span className="text-muted">
              Uploading {state.name} as your private trial… {Math.round(state.progress * 100)} %
            </span>
            <Button variant="ghost" onClick={() => abort.current?.()}>
              Cancel
            </Button>
          </div>
        ) : state.status === "failed" ? (
          <p className="text-bad">{state.message}</p>
        ) : null}
      </div>
      {compact ? null : <ConfidentialNotice />}
    </section>
  );
}
