import { apiFetch, ApiError } from "@/lib/api/fetcher";
import type { ErrorBody } from "@/lib/api/errors";
import type { LabRunRequestInput, LabSolveRequest, LabSolveResponse, LabSpace, StepReport } from "@/lib/lab/recipe";
import { COLOUR_SPACE_SHORT, type ColourSpace, type LinearSpace } from "@/lib/colour/spaces";
import type { LabAnalyseRequest, LabAnalyseResponse, LabSampleRequest, LabSampleResponse } from "@/lib/lab/analysis-schemas";

/** Client calls of the lab routes (app/api/lab). */

export type LabStillInfo = { id: string; alt: string; width: number; height: number; bitDepth: number; colourSpace?: ColourSpace; format?: string };

/** The lab's "work in" choice: stored values, linear light of the still's own space, or a linear space picked. */
export type LabSpaceChoice = LabSpace | `linear:${LinearSpace}`;

/** Request fields of a choice: `space`, and `workingSpace` when one was picked. */
export function labSpaceFields(choice: LabSpaceChoice): { space: LabSpace; workingSpace?: LinearSpace } {
  const [space, working] = choice.split(":") as [LabSpace, LinearSpace | undefined];
  return working ? { space, workingSpace: working } : { space };
}

/** The choice in words, for captions under plots. */
export function labSpaceWords(choice: LabSpaceChoice): string {
  const { space, workingSpace } = labSpaceFields(choice);
  return space === "stored" ? "stored values" : workingSpace ? `linear light, ${COLOUR_SPACE_SHORT[workingSpace]}` : "linear light";
}
/** `approximate`: a proxy render (resized, fast blur approximations), from the X-Lab-Render header. */
export type LabRender = { url: string; width: number; height: number; reports: StepReport[]; cached: string; approximate: boolean };
export type Box = { x: number; y: number; w: number; h: number };

/** POST /api/lab/run; the image comes back as an object URL the caller must revoke. */
export async function renderLab(body: LabRunRequestInput, signal?: AbortSignal): Promise<LabRender> {
  let res: Response;
  try {
    res = await fetch("/api/lab/run", { method: "POST", headers: { "Content-Type": "application/json" }, body: JSON.stringify(body), signal, credentials: "same-origin" });
  } catch (error) {
    if (signal?.aborted) throw error;
    throw new ApiError(0, "network", "Could not reach Plateroom. Check your connection and try again.");
  }
  if (!res.ok) {
    const err = (await res.json().catch(() => null)) as ErrorBody | null;
    throw new ApiError(res.status, err?.error.code ?? "internal", err?.error.message ?? `The render failed (${res.status}).`, err?.error.fields);
  }
  const blob = await res.blob();
  const header = res.headers.get("X-Lab-Report");
  let reports: StepReport[] = [];
  if (header) {
    try {
      const b64 = header.replace(/-/g, "+").replace(/_/g, "/");
      reports = JSON.parse(new TextDecoder().decode(Uint8Array.from(atob(b64), (c) => c.charCodeAt(0)))) as StepReport[];
    } catch {
      reports = [];
    }
  }
  return {
    url: URL.createObjectURL(blob),
    width: Number(res.headers.get("X-Lab-Width")) || 0,
    height: Number(res.headers.get("X-Lab-Height")) || 0,
    reports,
    cached: res.headers.get("X-Lab-Cache") ?? "miss",
    approximate: res.headers.get("X-Lab-Render") === "approximate",
  };
}

export const sampleBoxes = (body: LabSampleRequest, signal?: AbortSignal) => apiFetch<LabSampleResponse>("/api/lab/sample", { method: "POST", json: body, signal });
export const solveMatrix = (body: LabSolveRequest, signal?: AbortSignal) => apiFetch<LabSolveResponse>("/api/lab/solve", { method: "POST", json: body, signal });
export const analyseLab = (body: LabAnalyseRequest, signal?: AbortSignal) => apiFetch<LabAnalyseResponse>("/api/lab/analyse", { method: "POST", json: body, signal });

export function errorText(error: unknown): string {
  if (error instanceof DOMException && error.name === "AbortError") return "Cancelled.";
  return error instanceof Error ? error.message : "Something went wrong.";
}

/** Channel colours of the plots (plain R, G, B). */
export const CHANNEL_COLOURS = { r: "#e05a5a", g: "#4fb34f", b: "#5a86e0" } as const;
