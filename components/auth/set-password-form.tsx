"use client";

import { useActionState } from "react";
import { setPasswordAction, type FormState } from "@/lib/auth/actions";
import { Button } from "@/components/ui/button";
import { describedBy, Field, TextInput } from "@/components/ui/field";

export function SetPasswordForm({ token }: { token: string }) {
  const [state, action, pending] = useActionState<FormState, FormData>(setPasswordAction, {});
  const errors = state.fieldErrors ?? {};
  return (
    <form action={action} className="space-y-4">
      <input type="hidden" name="token" value={token} />
      <Field id="password" label="New password" error={errors.password} hint="At least 10 characters.">
        <TextInput id="password" name="password" type="password" autoComplete="new-password" required aria-describedby={describedBy("password", errors.password, "At least 10 characters.")} />
      </Field>
      <Field id="confirm" label="Repeat it" error={errors.confirm}>
        <TextInput id="confirm" name="confirm" type="password" autoComplete="new-password" required aria-describedby={describedBy("confirm", errors.confirm)} />
      </Field>
      {state.message || errors.token ? (
        <p role="alert" className="text-sm text-bad">
          {state.message ?? "This link is not valid."}
        </p>
      ) : null}
      <Button type="submit" variant="primary" className="w-full" disabled={pending}>
        {pending ? "Saving…" : "Set password"}
      </Button>
    </form>
  );
}
