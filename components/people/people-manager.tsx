"use client";

import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { useState } from "react";
import { InviteForm } from "@/components/people/invite-form";
import { Button } from "@/components/ui/button";
import { ConfirmDialog } from "@/components/ui/confirm-dialog";
import { DataTable } from "@/components/ui/data-table";
import { Select } from "@/components/ui/field";
import { Skeleton } from "@/components/ui/skeleton";
import { ApiError, apiFetch } from "@/lib/api/fetcher";
import { queryKeys } from "@/lib/api/query-keys";
import { ROLE_LABELS, ROLES, type Role } from "@/lib/auth/roles";
import type { PeopleResponse, PersonResponse } from "@/lib/people/schemas";

/** The admin's list of people: invite, change role, disable — every change audited on the server. */
export function PeopleManager({ currentUserId }: { currentUserId: string }) {
  const client = useQueryClient();
  const people = useQuery({ queryKey: queryKeys.people, queryFn: () => apiFetch<PeopleResponse>("/api/people") });
  const [confirm, setConfirm] = useState<PersonResponse | null>(null);
  const update = useMutation({
    mutationFn: ({ id, patch }: { id: string; patch: { role?: Role; disabled?: boolean } }) => apiFetch<PersonResponse>(`/api/people/${id}`, { method: "PATCH", json: patch }),
    onSettled: () => client.invalidateQueries({ queryKey: queryKeys.people }),
  });
  return (
    <div className="space-y-6">
      <InviteForm />
      {update.error ? (
        <p role="alert" className="rounded border border-bad/50 bg-bad/10 px-3 py-2 text-sm text-bad">
          {update.error instanceof ApiError ? update.error.message : "That change failed."}
        </p>
      ) : null}
      {people.isLoading ? <Skeleton className="h-40" /> : null}
      {people.error ? <p role="alert" className="text-bad">{people.error.message}</p> : null}
      {people.data ? (
        <DataTable
          head={
            <>
              <th className="py-2 font-medium">Name</th>
              <th className="font-medium">E-mail</th>
              <th className="font-medium">Role</th>
              <th className="font-medium">State</th>
              <th />
            </>
          }
        >
          {people.data.items.map((p) => (
            <tr key={p.id} className="border-b border-line">
              <td className="py-2">
                {p.name}
                {p.id === currentUserId ? <span className="text-muted"> (you)</span> : null}
              </td>
              <td>{p.email}</td>
              <td>
                <Select aria-label={`Role of ${p.name}`} className="w-auto py-1" value={p.role} onChange={(e) => update.mutate({ id: p.id, patch: { role: e.target.value as Role } })}>
                  {ROLES.map((r) => (
                    <option key={r} value={r}>
                      {ROLE_LABELS[r]}
                    </option>
                  ))}
                </Select>
              </td>
              <td className="text-muted">{p.disabled ? "disabled" : p.hasPassword ? "active" : "invited"}</td>
              <td className="text-right">
                {p.disabled ? (
                  <Button variant="ghost" onClick={() => update.mutate({ id: p.id, patch: { disabled: false } })}>
                    Enable
                  </Button>
                ) : (
                  <Button variant="danger" onClick={() => setConfirm(p)}>
                    Disable
                  </Button>
                )}
              </td>
            </tr>
          ))}
        </DataTable>
      ) : null}
      <ConfirmDialog
        open={confirm !== null}
        title={`Disable ${confirm?.name ?? ""}?`}
        confirmLabel="Disable"
        danger
        onClose={() => setConfirm(null)}
        onConfirm={() => {
          if (confirm) update.mutate({ id: confirm.id, patch: { disabled: true } });
          setConfirm(null);
        }}
      >
        <p>They are signed out at once and their API tokens stop working. Their techniques and logs stay.</p>
      </ConfirmDialog>
    </div>
  );
}
