"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { ApiError, apiFetch } from "@/lib/api/fetcher";

export function SubmitForReviewButton({ slug }: { slug: string }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  return (
    <>
      <Button
        variant="primary"
        disabled={busy}
        onClick={async () => {
          setBusy(true);
          try {
            await apiFetch(`/api/techniques/${slug}/submit`, { method: "POST" });
            router.refresh();
          } catch (e) {
            setError(e instanceof ApiError ? e.message : "Submitting failed; try again.");
          } finally {
            setBusy(false);
          }
        }}
      >
        Submit for review
      </Button>
      {error ? <span role="alert" className="text-sm text-bad">{error}</span> : null}
    </>
  );
}
