"use client";

import { useQuery } from "@tanstack/react-query";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { ConfirmDialog } from "@/components/ui/confirm-dialog";
import { Select, TextArea } from "@/components/ui/field";
import { ApiError, apiFetch } from "@/lib/api/fetcher";
import { USE_OUTCOME_LABELS, type TechniqueUsesResponse, type UseOutcome } from "@/lib/uses/schemas";
import type { TechniqueListResponse } from "@/lib/techniques/schemas";

/** Retire, optionally naming the approved technique that replaces it; lists shots to follow up first. */
export function RetireDialog({ slug }: { slug: string }) {
  const router = useRouter();
  const [open, setOpen] = useState(false);
  const [replacement, setReplacement] = useState("");
  const [note, setNote] = useState("");
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const candidates = useQuery({
    queryKey: ["techniques", { status: "approved" }],
    queryFn: () => apiFetch<TechniqueListResponse>("/api/techniques?status=approved&limit=200"),
    enabled: open,
  });
  const uses = useQuery({ queryKey: ["uses", slug, "follow-up"], queryFn: () => apiFetch<TechniqueUsesResponse>(`/api/techniques/${slug}/uses?limit=200`), enabled: open });
  // Uses come newest first, so the first one seen per shot carries its latest outcome.
  const latestByShot = new Map<string, UseOutcome>();
  for (const u of uses.data?.items ?? []) if (!latestByShot.has(u.shot.code)) latestByShot.set(u.shot.code, u.outcome);
  const followUp = [...latestByShot].sort(([a], [b]) => a.localeCompare(b));

  async function retire() {
    setBusy(true);
    setError(null);
    try {
      await apiFetch(`/api/techniques/${slug}/retire`, { method: "POST", json: { supersededBy: replacement || undefined, note: note || undefined } });
      setOpen(false);
      router.refresh();
    } catch (e) {
      setError(e instanceof ApiError ? e.message : "Retiring failed; try again.");
    } finally {
      setBusy(false);
    }
  }

  return (
    <>
      <Button variant="danger" onClick={() => setOpen(true)}>
        Retire…
      </Button>
      <ConfirmDialog open={open} title="Retire this technique?" confirmLabel="Retire" danger busy={busy} onConfirm={retire} onClose={() => setOpen(false)}>
        <p>Readers will see it marked retired. Subscribers are told.</p>
        <label htmlFor="replacement" className="block font-medium">
          Replaced by (optional)
        </label>
        <Select id="replacement" value={replacement} onChange={(e) => setReplacement(e.target.value)}>
          <option value="">— none —</option>
          {(candidates.data?.items ?? [])
            .filter((t) => t.slug !== slug)
            .map((t) => (
              <option key={t.slug} value={t.slug}>
                {t.title}
              </option>
            ))}
        </Select>
        <label htmlFor="retire-note" className="block font-medium">
          Why
        </label>
        <TextArea id="retire-note" value={note} onChange={(e) => setNote(e.target.value)} />
        <div>
          <p className="font-medium">Shots that used it ({followUp.length})</p>
          {uses.isLoading ? <p className="text-muted">Loading…</p> : followUp.length ? (
            <ul className="max-h-40 overflow-auto text-xs" data-testid="follow-up-shots">
              {followUp.map(([code, outcome]) => (
                <li key={code}>
                  <span className="font-mono">{code}</span> <span className="text-muted">· last {USE_OUTCOME_LABELS[outcome].toLowerCase()}</span>
                </li>
              ))}
            </ul>
          ) : <p className="text-muted">None logged.</p>}
          {followUp.length ? <p className="text-muted">Each of these shots will show a follow-up note pointing to the replacement.</p> : null}
        </div>
        {error ? <p role="alert" className="text-bad">{error}</p> : null}
      </ConfirmDialog>
    </>
  );
}
