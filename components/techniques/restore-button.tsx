"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { ConfirmDialog } from "@/components/ui/confirm-dialog";
import { ApiError, apiFetch } from "@/lib/api/fetcher";

export function RestoreButton({ slug, number, latest }: { slug: string; number: number; latest: number }) {
  const router = useRouter();
  const [open, setOpen] = useState(false);
  const [error, setError] = useState<string | null>(null);
  return (
    <>
      <Button variant="ghost" onClick={() => setOpen(true)}>
        Restore
      </Button>
      <ConfirmDialog
        open={open}
        title={`Restore revision ${number}?`}
        confirmLabel="Restore as a new revision"
        onClose={() => setOpen(false)}
        onConfirm={async () => {
          try {
            const r = await apiFetch<{ slug: string }>(`/api/techniques/${slug}/revisions/${number}/restore`, { method: "POST", json: { baseRevision: latest } });
            setOpen(false);
            router.push(`/techniques/${r.slug}`);
            router.refresh();
          } catch (e) {
            setError(e instanceof ApiError ? e.message : "Restoring failed.");
          }
        }}
      >
        <p>Its content becomes revision {latest + 1}. Nothing is deleted; the history keeps every revision.</p>
        {error ? <p role="alert" className="text-bad">{error}</p> : null}
      </ConfirmDialog>
    </>
  );
}
