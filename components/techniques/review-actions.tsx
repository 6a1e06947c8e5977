"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { ConfirmDialog } from "@/components/ui/confirm-dialog";
import { TextArea } from "@/components/ui/field";
import { ApiError, apiFetch } from "@/lib/api/fetcher";

/** A lead's decision on the waiting revision: approve, or send back with a note the author sees. */
export function ReviewActions({ slug, revision }: { slug: string; revision: number }) {
  const router = useRouter();
  const [dialog, setDialog] = useState<"approve" | "return" | null>(null);
  const [note, setNote] = useState("");
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  async function decide(decision: "approve" | "return") {
    setBusy(true);
    setError(null);
    try {
      await apiFetch(`/api/techniques/${slug}/review`, { method: "POST", json: { revision, decision, note: note || undefined } });
      setDialog(null);
      router.refresh();
    } catch (e) {
      setError(e instanceof ApiError ? e.message : "That did not work; try again.");
    } finally {
      setBusy(false);
    }
  }

  return (
    <>
      <Button variant="primary" onClick={() => setDialog("approve")}>
        Approve revision {revision}
      </Button>
      <Button onClick={() => setDialog("return")}>Send back</Button>
      <ConfirmDialog
        open={dialog !== null}
        title={dialog === "approve" ? `Approve revision ${revision}?` : `Send revision ${revision} back?`}
        confirmLabel={dialog === "approve" ? "Approve" : "Send back"}
        busy={busy}
        onConfirm={() => decide(dialog!)}
        onClose={() => setDialog(null)}
      >
        <p>{dialog === "approve" ? "Readers will see this revision from now on, and subscribers are told." : "The author sees your note and can revise."}</p>
        <label className="block text-sm font-medium" htmlFor="review-note">
          {dialog === "approve" ? "Note (optional)" : "What should change"}
        </label>
        <TextArea id="review-note" value={note} onChange={(e) => setNote(e.target.value)} />
        {error ? <p role="alert" className="text-bad">{error}</p> : null}
      </ConfirmDialog>
    </>
  );
}
