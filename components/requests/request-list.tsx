"use client";

import Link from "next/link";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { EmptyState } from "@/components/ui/empty-state";
import { ApiError, apiFetch } from "@/lib/api/fetcher";
import type { TechniqueRequestResponse } from "@/lib/requests/schemas";

const STATUS = { open: "open", claimed: "being written", resolved: "answered" } as const;

export function RequestList({ items, canClaim }: { items: TechniqueRequestResponse[]; canClaim: boolean }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  if (!items.length) return <EmptyState title="None." />;
  return (
    <ul className="space-y-2 text-sm">
      {items.map((r) => (
        <li key={r.id} className="rounded border border-line p-2">
          <p className="font-medium">“{r.query}”</p>
          <p className="text-xs text-muted">
            {r.requester?.name ?? "someone"} · {STATUS[r.status]}
            {r.claimedBy ? ` by ${r.claimedBy.name}` : ""}
          </p>
          {r.note ? <p className="text-xs">{r.note}</p> : null}
          {canClaim && r.status === "open" ? (
            <div className="mt-1 flex gap-2">
              <Button
                variant="ghost"
                onClick={async () => {
                  try {
                    await apiFetch(`/api/requests/${r.id}/claim`, { method: "POST" });
                    router.refresh();
                  } catch (e) {
                    setError(e instanceof ApiError ? e.message : "Could not claim.");
                  }
                }}
              >
                I&apos;ll write it
              </Button>
              <Link className="self-center text-xs text-accent" href={`/techniques/new?request=${r.id}&title=${encodeURIComponent(r.query)}`}>
                Start writing
              </Link>
            </div>
          ) : null}
          {canClaim && r.status === "claimed" ? (
            <Link className="text-xs text-accent" href={`/techniques/new?request=${r.id}&title=${encodeURIComponent(r.query)}`}>
              Start writing
            </Link>
          ) : null}
        </li>
      ))}
      {error ? <li role="alert" className="text-bad">{error}</li> : null}
    </ul>
  );
}
