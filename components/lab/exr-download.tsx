"use client";

import { useState } from "react";
import { errorText, labSpaceFields, type LabSpaceChoice, type LabStillInfo } from "@/components/lab/lab-api";
import { Choice } from "@/components/lab/recipe/number-input";
import { Button } from "@/components/ui/button";
import type { RecipeStep } from "@/lib/lab/recipe";

/** Downloads the exact float result as OpenEXR: half or float samples, ZIP or no compression, never clipped. */
export function ExrDownload({ still, steps, space }: { still: LabStillInfo; steps: RecipeStep[]; space: LabSpaceChoice }) {
  const [pixelType, setPixelType] = useState<"half" | "float">("half");
  const [compression, setCompression] = useState<"zip" | "none">("zip");
  const [state, setState] = useState<{ busy: boolean; error?: string }>({ busy: false });

  async function download() {
    setState({ busy: true });
    try {
      const res = await fetch("/api/lab/run", {
        method: "POST",
        credentials: "same-origin",
        headers: { "Content-Type": "application/json" },
        body: JSON.stringify({ still: still.id, ...labSpaceFields(space), steps, format: "exr", exr: { pixelType, compression } }),
      });
      if (!res.ok) throw new Error(((await res.json().catch(() => null)) as { error?: { message?: string } } | null)?.error?.message ?? `The render failed (${res.status}).`);
      const url = URL.createObjectURL(await res.blob());
      const a = document.createElement("a");
      a.href = url;
      a.download = `lab-${still.id.slice(0, 8)}-${pixelType}.exr`;
      a.click();
      setTimeout(() => URL.revokeObjectURL(url), 10_000);
      setState({ busy: false });
    } catch (error) {
      setState({ busy: false, error: errorText(error) });
    }
  }

  return (
    <div className="flex flex-wrap items-end gap-2" role="group" aria-label="OpenEXR download">
      <Choice id={`exr-${still.id}-type`} label="OpenEXR samples" value={pixelType} options={[["half", "Half float"], ["float", "Float (32-bit)"]]} onChange={setPixelType} />
      <Choice id={`exr-${still.id}-zip`} label="Compression" value={compression} options={[["zip", "ZIP"], ["none", "None"]]} onChange={setCompression} />
      <Button onClick={() => void download()} disabled={state.busy}>
        {state.busy ? "Rendering OpenEXR…" : "Download OpenEXR"}
      </Button>
      {state.error ? <p className="text-sm text-bad">{state.error}</p> : null}
    </div>
  );
}
