"use client";

import { useMutation, useQueryClient } from "@tanstack/react-query";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { Card, CardTitle } from "@/components/ui/card";
import { describedBy, Field, Select, TextInput } from "@/components/ui/field";
import { ApiError, apiFetch } from "@/lib/api/fetcher";
import { queryKeys } from "@/lib/api/query-keys";
import { ROLE_LABELS, ROLES, type Role } from "@/lib/auth/roles";
import type { InviteResponse } from "@/lib/people/schemas";

export function InviteForm() {
  const client = useQueryClient();
  const [form, setForm] = useState({ email: "", name: "", role: "artist" as Role });
  const invite = useMutation({
    mutationFn: () => apiFetch<InviteResponse>("/api/people", { method: "POST", json: form }),
    onSuccess: () => {
      setForm({ email: "", name: "", role: "artist" });
      void client.invalidateQueries({ queryKey: queryKeys.people });
    },
  });
  const fields = invite.error instanceof ApiError ? (invite.error.fields ?? {}) : {};
  return (
    <Card>
      <CardTitle>Invite someone</CardTitle>
      <form
        className="grid gap-3 sm:grid-cols-[1fr_1fr_10rem_auto] sm:items-end"
        onSubmit={(e) => {
          e.preventDefault();
          invite.mutate();
        }}
      >
        <Field id="invite-email" label="E-mail" error={fields.email}>
          <TextInput id="invite-email" type="email" value={form.email} onChange={(e) => setForm({ ...form, email: e.target.value })} aria-describedby={describedBy("invite-email", fields.email)} required />
        </Field>
        <Field id="invite-name" label="Name" error={fields.name}>
          <TextInput id="invite-name" value={form.name} onChange={(e) => setForm({ ...form, name: e.target.value })} aria-describedby={describedBy("invite-name", fields.name)} required />
        </Field>
        <Field id="invite-role" label="Role">
          <Select id="invite-role" value={form.role} onChange={(e) => setForm({ ...form, role: e.target.value as Role })}>
            {ROLES.map((r) => (
              <option key={r} value={r}>
                {ROLE_LABELS[r]}
              </option>
            ))}
          </Select>
        </Field>
        <Button type="submit" variant="primary" disabled={invite.isPending}>
          {invite.isPending ? "Inviting…" : "Invite"}
        </Button>
      </form>
      {invite.error && !Object.keys(fields).length ? <p role="alert" className="mt-2 text-sm text-bad">{invite.error.message}</p> : null}
      {invite.data ? (
        <div role="status" className="mt-3 rounded border border-ok/50 bg-ok/10 p-3 text-sm">
          <p>
            Invitation mailed to {invite.data.person.email}. The set-password link (valid 7 days, single use) is also here in case the mail does not arrive:
          </p>
          <code className="mt-1 block font-mono text-xs break-all" data-testid="invite-link">
            {invite.data.setPasswordUrl}
          </code>
        </div>
      ) : null}
    </Card>
  );
}
