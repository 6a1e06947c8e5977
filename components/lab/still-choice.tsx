"use client";

import { useId, useState } from "react";
import { errorText, type LabStillInfo } from "@/components/lab/lab-api";
import { Button } from "@/components/ui/button";
import { Select, TextInput } from "@/components/ui/field";
import type { StillCreatedResponse } from "@/lib/stills/schemas";

/** Picks one of the technique's stills, or uploads a private trial still of one's own. */
export function StillChoice({ stills, value, onChange }: { stills: LabStillInfo[]; value: string; onChange(still: LabStillInfo): void }) {
  const id = useId().replace(/:/g, "");
  const [trials, setTrials] = useState<LabStillInfo[]>([]);
  const [open, setOpen] = useState(stills.length === 0);
  const [file, setFile] = useState<File | null>(null);
  const [alt, setAlt] = useState("");
  const [busy, setBusy] = useState(false);
  const [message, setMessage] = useState<string | null>(null);
  const all = [...stills, ...trials];

  const upload = async () => {
    if (!file || !alt.trim()) return setMessage("Choose a file and describe it.");
    setBusy(true);
    setMessage("Uploading…");
    try {
      const form = new FormData();
      form.set("file", file);
      form.set("alt", alt.trim());
      form.set("owner", "trial");
      const res = await fetch("/api/stills", { method: "POST", body: form, credentials: "same-origin" });
      const body = (await res.json()) as Partial<Pick<StillCreatedResponse, "id" | "width" | "height" | "bitDepth" | "colourSpace" | "format">> & { error?: { message: string } };
      if (!res.ok || !body.id) throw new Error(body.error?.message ?? `Upload failed (${res.status}).`);
      const still = { id: body.id, alt: alt.trim(), width: body.width!, height: body.height!, bitDepth: body.bitDepth!, colourSpace: body.colourSpace, format: body.format };
      setTrials((t) => [...t, still]);
      onChange(still);
      setMessage("Uploaded. It is private to you (and leads).");
      setOpen(false);
    } catch (error) {
      setMessage(errorText(error));
    } finally {
      setBusy(false);
    }
  };

  return (
    <div className="space-y-2">
      <div className="flex flex-wrap items-end gap-2">
        <div className="min-w-48 flex-1">
          <label htmlFor={`${id}-still`} className="block text-xs text-muted">
            Still
          </label>
          <Select id={`${id}-still`} value={value} onChange={(e) => { const s = all.find((x) => x.id === e.target.value); if (s) onChange(s); }} disabled={!all.length}>
            {all.map((s) => (
              <option key={s.id} value={s.id}>
                {s.alt} ({s.width}×{s.height}, {s.format === "exr" ? "OpenEXR" : `${s.bitDepth}-bit`}{trials.includes(s) ? ", my trial" : ""})
              </option>
            ))}
          </Select>
        </div>
        <Button onClick={() => setOpen((o) => !o)} aria-expanded={open} aria-controls={`${id}-trial`}>
          Try on my still
        </Button>
      </div>
      {open ? (
        <div id={`${id}-trial`} className="space-y-2 rounded border border-line bg-surface-2 p-3">
          <p className="text-xs text-muted">
            Upload a still of your own to run this recipe on. It stays private to you and leads. Follow the studio&apos;s content-security policy: only
            upload material you are cleared to handle here.
          </p>
          <div className="grid gap-2 sm:grid-cols-2">
            <div>
              <label htmlFor={`${id}-file`} className="block text-xs text-muted">File (PNG, TIFF, JPEG, WebP or OpenEXR; 16-bit PNG or TIFF and OpenEXR keep full precision)</label>
              <input id={`${id}-file`} type="file" accept="image/png,image/tiff,image/jpeg,image/webp,image/x-exr,.exr" className="text-sm" onChange={(e) => setFile(e.target.files?.[0] ?? null)} />
            </div>
            <div>
              <label htmlFor={`${id}-alt`} className="block text-xs text-muted">Describe it (alt text)</label>
              <TextInput id={`${id}-alt`} value={alt} onChange={(e) => setAlt(e.target.value)} maxLength={300} />
            </div>
          </div>
          <Button variant="primary" onClick={upload} disabled={busy}>
            Upload and use
          </Button>
        </div>
      ) : null}
      <p role="status" className="text-xs text-muted">
        {message}
      </p>
    </div>
  );
}
