"use client";

import { useCallback, useEffect, useRef, useState } from "react";
import { errorText, renderLab, type LabRender } from "@/components/lab/lab-api";
import type { LabRunRequestInput } from "@/lib/lab/recipe";

type RenderMode = "proxy" | "full";
type RenderState =
  | { status: "idle" }
  | { status: "running"; mode: RenderMode; elapsed: number }
  | { status: "done"; mode: RenderMode; result: LabRender; seconds: number }
  | { status: "error"; mode: RenderMode; message: string; fields?: Record<string, string> };

/** One exact render at a time: start (cancels the previous), cancel, and the object URL's lifetime. */
export function useLabRender() {
  const [state, setState] = useState<RenderState>({ status: "idle" });
  const abort = useRef<AbortController | null>(null);
  const url = useRef<string | null>(null);

  const dropUrl = () => {
    if (url.current) URL.revokeObjectURL(url.current);
    url.current = null;
  };
  useEffect(() => () => {
    abort.current?.abort();
    dropUrl();
  }, []);

  const start = useCallback(async (body: LabRunRequestInput, mode: RenderMode) => {
    abort.current?.abort();
    const controller = new AbortController();
    abort.current = controller;
    const t0 = performance.now();
    setState({ status: "running", mode, elapsed: 0 });
    // Elapsed time is the honest progress: the server sends the image only when it is done.
    const timer = setInterval(() => setState((s) => (s.status === "running" && abort.current === controller ? { ...s, elapsed: (performance.now() - t0) / 1000 } : s)), 200);
    try {
      const result = await renderLab(body, controller.signal);
      dropUrl();
      url.current = result.url;
      if (abort.current === controller) setState({ status: "done", mode, result, seconds: (performance.now() - t0) / 1000 });
      else URL.revokeObjectURL(result.url);
    } catch (error) {
      if (abort.current !== controller) return;
      const fields = (error as { fields?: Record<string, string> }).fields;
      setState(controller.signal.aborted ? { status: "idle" } : { status: "error", mode, message: errorText(error), fields });
    } finally {
      clearInterval(timer);
    }
  }, []);

  const cancel = useCallback(() => {
    abort.current?.abort();
    setState({ status: "idle" });
  }, []);

  const reset = useCallback(() => {
    abort.current?.abort();
    abort.current = null;
    dropUrl();
    setState({ status: "idle" });
  }, []);

  return { state, start, cancel, reset };
}
