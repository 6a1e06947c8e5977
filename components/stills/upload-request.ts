import type { StillCreatedResponse, StillOwner, StillRole } from "@/lib/stills/schemas";

type UploadFields = { alt: string; caption?: string; credit?: string; technique?: string; role?: StillRole; owner: StillOwner };

type UploadOutcome =
  | { ok: true; still: StillCreatedResponse }
  | { ok: false; cancelled: boolean; status: number; message: string; fields?: Record<string, string> };

/**
 * POST /api/stills through XMLHttpRequest, because fetch has no upload progress events.
 * `abort()` cancels the transfer; the server removes whatever it had received.
 */
export function sendStill(file: File, fields: UploadFields, onProgress: (fraction: number) => void): { done: Promise<UploadOutcome>; abort: () => void } {
  const xhr = new XMLHttpRequest();
  const form = new FormData();
  form.set("alt", fields.alt);
  form.set("owner", fields.owner);
  if (fields.caption) form.set("caption", fields.caption);
  if (fields.credit) form.set("credit", fields.credit);
  if (fields.technique) form.set("technique", fields.technique);
  if (fields.role) form.set("role", fields.role);
  form.set("file", file, file.name);

  const done = new Promise<UploadOutcome>((resolve) => {
    xhr.upload.onprogress = (e) => {
      if (e.lengthComputable) onProgress(e.loaded / e.total);
    };
    xhr.onload = () => {
      let body: unknown;
      try {
        body = JSON.parse(xhr.responseText);
      } catch {
        body = undefined;
      }
      if (xhr.status === 201) return resolve({ ok: true, still: body as StillCreatedResponse });
      const error = (body as { error?: { message?: string; fields?: Record<string, string> } } | undefined)?.error;
      resolve({ ok: false, cancelled: false, status: xhr.status, message: error?.message ?? `The server answered ${xhr.status}.`, fields: error?.fields });
    };
    xhr.onerror = () => resolve({ ok: false, cancelled: false, status: 0, message: "The upload was interrupted. Check your connection and try again." });
    xhr.onabort = () => resolve({ ok: false, cancelled: true, status: 0, message: "Cancelled." });
  });
  xhr.open("POST", "/api/stills");
  xhr.withCredentials = true;
  xhr.send(form);
  return { done, abort: () => xhr.abort() };
}
