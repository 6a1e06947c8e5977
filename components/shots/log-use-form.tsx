"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { ShotTypeahead } from "@/components/shots/shot-typeahead";
import { ConfidentialNotice } from "@/components/stills/confidential-notice";
import { Button } from "@/components/ui/button";
import { Field, TextArea } from "@/components/ui/field";
import { ApiError, apiFetch } from "@/lib/api/fetcher";

type Outcome = "clean" | "touch-up" | "failed";

async function uploadUseStill(file: File, role: "before" | "after", shot: string): Promise<string> {
  const form = new FormData();
  form.set("file", file);
  form.set("alt", `${role === "before" ? "Before" : "After"} cleanup on ${shot}`);
  form.set("owner", "use");
  form.set("role", role);
  const res = await fetch("/api/stills", { method: "POST", body: form, credentials: "same-origin" });
  const body = (await res.json().catch(() => null)) as { id?: string; error?: { message?: string } } | null;
  if (!res.ok || !body?.id) throw new ApiError(res.status, "bad_request", body?.error?.message ?? `Upload failed (${res.status}).`);
  return body.id;
}

/** Log that this technique was used on a shot: outcome, note, optional before/after stills. */
export function LogUseForm({ slug }: { slug: string }) {
  const router = useRouter();
  const [shot, setShot] = useState("");
  const [outcome, setOutcome] = useState<Outcome>("clean");
  const [note, setNote] = useState("");
  const [before, setBefore] = useState<File | null>(null);
  const [after, setAfter] = useState<File | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const [done, setDone] = useState(false);

  async function submit(e: React.FormEvent) {
    e.preventDefault();
    setBusy(true);
    setError(null);
    try {
      const beforeStill = before ? await uploadUseStill(before, "before", shot) : undefined;
      const afterStill = after ? await uploadUseStill(after, "after", shot) : undefined;
      await apiFetch(`/api/techniques/${slug}/uses`, { method: "POST", json: { shot, outcome, note: note || undefined, beforeStill, afterStill } });
      setDone(true);
      setShot("");
      setNote("");
      setBefore(null);
      setAfter(null);
      router.refresh();
    } catch (err) {
      setError(err instanceof ApiError ? err.message : "Logging failed; nothing was saved.");
    } finally {
      setBusy(false);
    }
  }

  return (
    <form onSubmit={submit} className="mt-3 grid gap-3 sm:grid-cols-2">
      <Field id="use-shot" label="Shot">
        <ShotTypeahead id="use-shot" value={shot} onChange={setShot} />
      </Field>
      <fieldset>
        <legend className="mb-1 text-sm font-medium">How did it go?</legend>
        <div className="flex flex-wrap gap-3 text-sm">
          {(["clean", "touch-up", "failed"] as const).map((o) => (
            <label key={o} className="flex items-center gap-1.5">
              <input type="radio" name="outcome" value={o} checked={outcome === o} onChange={() => setOutcome(o)} />
              {o === "clean" ? "Clean" : o === "touch-up" ? "Needed touch-up" : "Failed"}
            </label>
          ))}
        </div>
      </fieldset>
      <div className="sm:col-span-2">
        <Field id="use-note" label="Note">
          <TextArea id="use-note" value={note} onChange={(e) => setNote(e.target.value)} placeholder="What worked, what you changed" />
        </Field>
      </div>
      <label className="text-sm">
        <span className="mb-1 block font-medium">Before still (optional)</span>
        <input type="file" accept="image/png,image/jpeg,image/tiff,image/webp" onChange={(e) => setBefore(e.target.files?.[0] ?? null)} />
      </label>
      <label className="text-sm">
        <span className="mb-1 block font-medium">After still (optional)</span>
        <input type="file" accept="image/png,image/jpeg,image/tiff,image/webp" onChange={(e) => setAfter(e.target.files?.[0] ?? null)} />
      </label>
      <div className="sm:col-span-2">
        <ConfidentialNotice />
      </div>
      {error ? <p role="alert" className="text-sm text-bad sm:col-span-2">{error}</p> : null}
      {done ? <p role="status" className="text-sm text-ok sm:col-span-2">Logged. Thank you — it helps the next person.</p> : null}
      <div>
        <Button type="submit" variant="primary" disabled={busy || !shot}>
          {busy ? "Saving…" : "Log use"}
        </Button>
      </div>
    </form>
  );
}
