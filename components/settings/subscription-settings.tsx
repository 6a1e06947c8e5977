"use client";

import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { Button } from "@/components/ui/button";
import { Card, CardTitle } from "@/components/ui/card";
import { EmptyState } from "@/components/ui/empty-state";
import { apiFetch } from "@/lib/api/fetcher";
import { queryKeys } from "@/lib/api/query-keys";
import type { MailMode, SubscriptionListResponse } from "@/lib/subscriptions/schemas";

/** What this person follows, and whether mail comes at once or as one daily summary. */
export function SubscriptionSettings() {
  const client = useQueryClient();
  const list = useQuery({ queryKey: queryKeys.subscriptions, queryFn: () => apiFetch<SubscriptionListResponse>("/api/subscriptions") });
  const refresh = () => client.invalidateQueries({ queryKey: queryKeys.subscriptions });
  const mode = useMutation({ mutationFn: (m: MailMode) => apiFetch("/api/subscriptions/mode", { method: "PUT", json: { mode: m } }), onSettled: refresh });
  const remove = useMutation({
    mutationFn: (target: { kind: string; key: string }) => apiFetch("/api/subscriptions", { method: "DELETE", json: { target } }),
    onSettled: refresh,
  });
  return (
    <Card>
      <CardTitle>Following and mail</CardTitle>
      <fieldset className="mb-4 flex flex-wrap gap-4 text-sm">
        <legend className="mb-1 font-medium">Send me mail</legend>
        {(["immediate", "daily"] as const).map((m) => (
          <label key={m} className="flex items-center gap-2">
            <input type="radio" name="mail-mode" checked={list.data?.mailMode === m} onChange={() => mode.mutate(m)} />
            {m === "immediate" ? "as things happen" : "once a day, as a summary"}
          </label>
        ))}
      </fieldset>
      {list.data && !list.data.items.length ? <EmptyState title="You follow nothing yet." /> : null}
      <ul className="divide-y divide-line text-sm">
        {list.data?.items.map((s) => (
          <li key={`${s.target.kind}:${s.target.key}`} className="flex items-center gap-2 py-2">
            <span className="text-muted">{s.target.kind}</span>
            <span>{s.label}</span>
            <Button variant="ghost" className="ml-auto" onClick={() => remove.mutate(s.target)}>
              Stop following
            </Button>
          </li>
        ))}
      </ul>
    </Card>
  );
}
