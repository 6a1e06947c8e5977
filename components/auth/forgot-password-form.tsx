"use client";

import { useActionState } from "react";
import { forgotPasswordAction, type FormState } from "@/lib/auth/actions";
import { Button } from "@/components/ui/button";
import { Field, TextInput } from "@/components/ui/field";

export function ForgotPasswordForm() {
  const [state, action, pending] = useActionState<FormState, FormData>(forgotPasswordAction, {});
  if (state.ok) return <p role="status" className="text-sm">{state.message}</p>;
  return (
    <form action={action} className="space-y-4">
      <Field id="email" label="E-mail" error={state.fieldErrors?.email}>
        <TextInput id="email" name="email" type="email" autoComplete="username" required />
      </Field>
      {state.message ? (
        <p role="alert" className="rounded border border-bad/50 bg-bad/10 px-3 py-2 text-sm text-bad" data-testid="reset-error">
          {state.message}
        </p>
      ) : null}
      <Button type="submit" variant="primary" className="w-full" disabled={pending}>
        {pending ? "Sending…" : "Mail me a link"}
      </Button>
    </form>
  );
}
