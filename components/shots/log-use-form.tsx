"use client";

import { useQueryClient } from "@tanstack/react-query";
import { useRouter } from "next/navigation";
import { useId, useState } from "react";
import { TECHNIQUE_USES } from "@/components/shots/query-keys";
import { ShotTypeahead } from "@/components/shots/shot-typeahead";
import { TechniquePicker, type PickedTechnique } from "@/components/shots/technique-picker";
import { ConfidentialNotice } from "@/components/stills/confidential-notice";
import { Button } from "@/components/ui/button";
import { Field, TextArea } from "@/components/ui/field";
import { ApiError, apiFetch } from "@/lib/api/fetcher";
import type { UseOutcome } from "@/lib/uses/schemas";
import { OutcomeRadios } from "@/components/shots/outcome-radios";

type Outcome = UseOutcome;

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

/**
 * Log that a technique was used on a shot: outcome, note, optional before/after stills.
 * On a technique page pass `slug` (the shot is typed); on a shot page pass `shot` (the
 * technique is picked from the approved ones).
 */
export function LogUseForm({ slug, shot: fixedShot }: { slug?: string; shot?: string }) {
  const router = useRouter();
  const uid = useId();
  const [typedShot, setShot] = useState("");
  const shot = fixedShot ?? typedShot;
  const [picked, setPicked] = useState<PickedTechnique | null>(null);
  const techniqueSlug = slug ?? picked?.slug ?? "";
  const [outcome, setOutcome] = useState<Outcome>("clean");
  const [note, setNote] = useState("");
  const [before, setBefore] = useState<File | null>(null);
  const [after, setAfter] = useState<File | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const [done, setDone] = useState(false);
  const queryClient = useQueryClient();

  async function submit(e: React.FormEvent) {
    e.preventDefault();
    setBusy(true);
    setError(null);
    try {
      const beforeStill = before ? await uploadUseStill(before, "before", shot) : undefined;
      const afterStill = after ? await uploadUseStill(after, "after", shot) : undefined;
      await apiFetch(`/api/techniques/${encodeURIComponent(techniqueSlug)}/uses`, {
        method: "POST",
        json: { shot, outcome, note: note || undefined, beforeStill, afterStill },
      });
      setDone(true);
      setShot("");
      if (!slug) setPicked(null);
      setNote("");
      setBefore(null);
      setAfter(null);
      router.refresh();
      // The technique page's shot table reads its rows in the browser: read them again.
      void queryClient.invalidateQueries({ queryKey: [TECHNIQUE_USES] });
    } catch (err) {
      setError(err instanceof ApiError ? err.message : "Logging failed; nothing was saved.");
    } finally {
      setBusy(false);
    }
  }

  return (
    <form onSubmit={submit} className="mt-3 grid gap-3 sm:grid-cols-2">
      {slug ? null : (
        <Field id={`${uid}-technique`} label="Technique">
          <TechniquePicker
            id={`${uid}-technique`}
            value={picked}
            onChange={(t) => {
              setPicked(t);
              setDone(false);
            }}
          />
        </Field>
      )}
      {fixedShot ? (
        <div className="space-y-1">
          <p className="text-sm font-medium">Shot</p>
          <p className="py-1.5 font-mono text-sm" data-testid="use-fixed-shot">
            {fixedShot}
          </p>
        </div>
      ) : (
        <Field id="use-shot" label="Shot">
          <ShotTypeahead id="use-shot" value={typedShot} onChange={setShot} />
        </Field>
      )}
      <OutcomeRadios name={`${uid}-outcome`} value={outcome} onChange={setOutcome} />
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
        <Button type="submit" variant="primary" disabled={busy || !shot || !techniqueSlug}>
          {busy ? "Saving…" : "Log use"}
        </Button>
      </div>
    </form>
  );
}
