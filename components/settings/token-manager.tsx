"use client";

import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { Card, CardTitle } from "@/components/ui/card";
import { ConfirmDialog } from "@/components/ui/confirm-dialog";
import { EmptyState } from "@/components/ui/empty-state";
import { TextInput } from "@/components/ui/field";
import { ApiError, apiFetch } from "@/lib/api/fetcher";
import { queryKeys } from "@/lib/api/query-keys";
import type { CreatedTokenResponse, TokenResponse } from "@/lib/people/schemas";
import { formatDateTime } from "@/lib/utils";

/** Personal API tokens for pipeline scripts: shown once, stored only as a hash, revocable. */
export function TokenManager() {
  const client = useQueryClient();
  const tokens = useQuery({ queryKey: queryKeys.tokens, queryFn: () => apiFetch<{ items: TokenResponse[] }>("/api/tokens") });
  const [name, setName] = useState("");
  const [revoking, setRevoking] = useState<TokenResponse | null>(null);
  const create = useMutation({
    mutationFn: () => apiFetch<CreatedTokenResponse>("/api/tokens", { method: "POST", json: { name } }),
    onSuccess: () => {
      setName("");
      void client.invalidateQueries({ queryKey: queryKeys.tokens });
    },
  });
  const revoke = useMutation({
    mutationFn: (id: string) => apiFetch(`/api/tokens/${id}`, { method: "DELETE" }),
    onSettled: () => client.invalidateQueries({ queryKey: queryKeys.tokens }),
  });
  return (
    <Card>
      <CardTitle>API tokens</CardTitle>
      <p className="mb-3 text-sm text-muted">
        For scripts: send <code className="font-mono">Authorization: Bearer &lt;token&gt;</code>. A token acts with your role.
      </p>
      <form
        className="flex gap-2"
        onSubmit={(e) => {
          e.preventDefault();
          if (name.trim()) create.mutate();
        }}
      >
        <label htmlFor="token-name" className="sr-only">
          Token name
        </label>
        <TextInput id="token-name" placeholder="What it is for, e.g. shot publish hook" value={name} onChange={(e) => setName(e.target.value)} />
        <Button type="submit" variant="primary" disabled={create.isPending || !name.trim()}>
          Create
        </Button>
      </form>
      {create.error ? <p role="alert" className="mt-2 text-sm text-bad">{create.error instanceof ApiError ? create.error.message : "Could not create."}</p> : null}
      {create.data ? (
        <div role="status" className="mt-3 rounded border border-accent/60 bg-accent/10 p-3 text-sm">
          <p className="font-medium">Copy it now — it is not shown again.</p>
          <code className="mt-1 block font-mono text-xs break-all" data-testid="new-token">
            {create.data.token}
          </code>
        </div>
      ) : null}
      <div className="mt-4">
        {tokens.data && !tokens.data.items.length ? <EmptyState title="No tokens." /> : null}
        <ul className="divide-y divide-line text-sm">
          {tokens.data?.items.map((t) => (
            <li key={t.id} className="flex items-center gap-2 py-2">
              <span className="font-medium">{t.name}</span>
              <span className="text-xs text-muted">
                created {formatDateTime(t.createdAt)}
                {t.lastUsedAt ? ` · last used ${formatDateTime(t.lastUsedAt)}` : " · never used"}
              </span>
              <Button variant="danger" className="ml-auto" onClick={() => setRevoking(t)}>
                Revoke
              </Button>
            </li>
          ))}
        </ul>
      </div>
      <ConfirmDialog
        open={revoking !== null}
        title={`Revoke “${revoking?.name ?? ""}”?`}
        confirmLabel="Revoke"
        danger
        onClose={() => setRevoking(null)}
        onConfirm={() => {
          if (revoking) revoke.mutate(revoking.id);
          setRevoking(null);
        }}
      >
        <p>Scripts using it stop working at once.</p>
      </ConfirmDialog>
    </Card>
  );
}
