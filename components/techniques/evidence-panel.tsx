"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { CompareView } from "@/components/stills/compare-view";
import { PairEditor } from "@/components/stills/pair-editor";
import { StillUploader } from "@/components/stills/still-uploader";
import { Button } from "@/components/ui/button";
import { ConfirmDialog } from "@/components/ui/confirm-dialog";
import { EmptyState } from "@/components/ui/empty-state";
import { LazyDetails } from "@/components/ui/lazy-details";
import { ApiError, apiFetch } from "@/lib/api/fetcher";
import type { StillPairResponse, StillResponse } from "@/lib/stills/schemas";

type Props = { slug: string; pairs: StillPairResponse[]; stills: StillResponse[]; canUpload: boolean; isApproved: boolean };

const PAIRS_NOTE = "Pairs belong to a revision, like the text. On an approved technique, a changed pair starts a new draft revision; readers see it once a lead approves it.";

/** The technique's before/after pairs in the compare view, and for writers the place to add, pair and remove stills. */
export function EvidencePanel({ slug, pairs, stills, canUpload, isApproved }: Props) {
  const router = useRouter();
  const [removing, setRemoving] = useState<StillPairResponse | null>(null);
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);

  async function remove() {
    if (!removing) return;
    setBusy(true);
    setError(null);
    try {
      await apiFetch(`/api/stills/pairs/${removing.id}`, { method: "DELETE" });
      setRemoving(null);
      router.refresh();
    } catch (e) {
      setError(e instanceof ApiError ? e.message : "Removing failed; the pair is still there.");
    } finally {
      setBusy(false);
    }
  }

  return (
    <div className="space-y-6">
      {pairs.length ? (
        pairs.map((pair) => (
          <div key={pair.id} className="space-y-2">
            <CompareView before={pair.before} after={pair.after} caption={pair.caption} />
            {canUpload ? (
              <Button variant="ghost" onClick={() => setRemoving(pair)}>
                Remove this pair…
              </Button>
            ) : null}
          </div>
        ))
      ) : (
        <EmptyState title="No before/after stills yet." />
      )}
      {stills.length ? (
        <p className="flex flex-wrap gap-x-3 gap-y-1 text-sm">
          <span className="text-muted">Plate check of each still:</span>
          {stills.map((s) => (
            <a key={s.id} href={`/stills/${s.id}`} className="text-accent underline-offset-2 hover:underline">
              {s.alt}
            </a>
          ))}
        </p>
      ) : null}
      {canUpload ? (
        <LazyDetails className="rounded border border-line p-3" summary="Add stills and pair them">
          <div className="mt-3 space-y-4">
            {isApproved ? <p className="text-sm text-muted">{PAIRS_NOTE}</p> : null}
            <StillUploader technique={slug} owner="technique" role="before" onUploaded={() => router.refresh()} />
            {stills.length >= 2 ? <PairEditor technique={slug} stills={stills} onSaved={() => router.refresh()} /> : <p className="text-sm text-muted">Upload two stills to pair them as before and after.</p>}
          </div>
        </LazyDetails>
      ) : null}
      <ConfirmDialog
        open={removing !== null}
        title="Remove this before/after pair?"
        confirmLabel="Remove pair"
        danger
        busy={busy}
        onConfirm={remove}
        onClose={() => {
          setRemoving(null);
          setError(null);
        }}
      >
        <p>The two stills stay with the technique; only the pairing goes. {isApproved ? PAIRS_NOTE : null}</p>
        {error ? (
          <p role="alert" className="text-bad">
            {error}
          </p>
        ) : null}
      </ConfirmDialog>
    </div>
  );
}
