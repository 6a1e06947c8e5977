import { ApiError, apiFetch } from "@/lib/api/fetcher";
import type { ErrorBody } from "@/lib/api/errors";
import type { CheckDto, KeptRecipeDto, TryResult } from "@/lib/plate-check/schemas";

/*
 * The plate check's calls from the browser. The check streams its stages (NDJSON) so the page can
 * show real progress; everything else is plain JSON through apiFetch.
 */

export type CheckProgress = { stage: string; done: number; total: number };

export async function runCheck(stillId: string, force: boolean, onProgress: (p: CheckProgress) => void, signal?: AbortSignal): Promise<CheckDto> {
  let res: Response;
  try {
    res = await fetch(`/api/stills/${stillId}/check`, {
      method: "POST",
      headers: { "Content-Type": "application/json", Accept: "application/x-ndjson" },
      body: JSON.stringify({ force }),
      credentials: "same-origin",
      signal,
    });
  } catch {
    throw new ApiError(0, "network", "Could not reach Plateroom. Check your connection and try again.");
  }
  if (!res.ok || !res.body) {
    const body = (await res.json().catch(() => null)) as ErrorBody | null;
    throw new ApiError(res.status, body?.error.code ?? "internal", body?.error.message ?? `The check failed (${res.status}).`);
  }
  const reader = res.body.pipeThrough(new TextDecoderStream()).getReader();
  let buffered = "";
  for (;;) {
    const { value, done } = await reader.read();
    if (value) buffered += value;
    let nl: number;
    while ((nl = buffered.indexOf("\n")) >= 0) {
      const line = buffered.slice(0, nl).trim();
      buffered = buffered.slice(nl + 1);
      if (!line) continue;
      const msg = JSON.parse(line) as { stage?: string; done?: number; total?: number; check?: CheckDto } & Partial<ErrorBody>;
      if (msg.error) throw new ApiError(500, msg.error.code, msg.error.message);
      if (msg.check) return msg.check;
      if (msg.stage) onProgress({ stage: msg.stage, done: msg.done ?? 0, total: msg.total ?? 1 });
    }
    if (done) break;
  }
  throw new ApiError(500, "internal", "The check ended without an answer. Try again.");
}

export function runTries(stillId: string, techniques?: string[]): Promise<{ tries: TryResult[] }> {
  return apiFetch(`/api/stills/${stillId}/check/tries`, { method: "POST", json: techniques ? { techniques } : {} });
}

export function keepTry(stillId: string, slug: string, note: string): Promise<KeptRecipeDto> {
  return apiFetch(`/api/stills/${stillId}/check/tries/${encodeURIComponent(slug)}/keep`, { method: "POST", json: { note } });
}

export function proposeTry(stillId: string, slug: string, changeNote: string): Promise<{ slug: string; revision: number }> {
  return apiFetch(`/api/stills/${stillId}/check/tries/${encodeURIComponent(slug)}/propose`, { method: "POST", json: { changeNote } });
}

export function tryImageUrl(stillId: string, slug: string, exact: boolean): string {
  return `/api/stills/${stillId}/check/tries/${encodeURIComponent(slug)}/image${exact ? "?size=exact" : ""}`;
}
