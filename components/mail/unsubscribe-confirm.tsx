"use client";

import Link from "next/link";
import { useActionState } from "react";
import { confirmUnsubscribeAction, type UnsubscribeState } from "@/components/mail/unsubscribe-action";
import { Button } from "@/components/ui/button";

/** Says what will stop and asks once; nothing changes until the button is pressed (link scanners only GET). */
export function UnsubscribeConfirm({ token, what }: { token: string; what: string }) {
  const [state, action, pending] = useActionState<UnsubscribeState, FormData>(confirmUnsubscribeAction, { status: "idle" });
  if (state.status === "done") {
    return (
      <div role="status" className="space-y-3 text-sm" data-testid="unsubscribe-done">
        <p className="text-base font-semibold">Done</p>
        <p>
          {state.removed > 0 ? "You will no longer get mail about " : "You were already unsubscribed from mail about "}
          {what}.
        </p>
        <p className="text-muted">
          To follow it again, or to choose a daily digest instead, see <Link href="/settings" className="text-accent underline">your settings</Link>.
        </p>
      </div>
    );
  }
  return (
    <form action={action} className="space-y-4 text-sm">
      <p>
        Press the button and you will no longer get mail about <strong>{what}</strong>.
      </p>
      <input type="hidden" name="token" value={token} />
      {state.status === "error" ? (
        <p role="alert" className="rounded border border-bad/50 bg-bad/10 px-3 py-2 text-bad">
          {state.message}
        </p>
      ) : null}
      <Button type="submit" variant="primary" className="w-full" disabled={pending}>
        {pending ? "Unsubscribing…" : "Unsubscribe"}
      </Button>
      <p className="text-xs text-muted">No sign-in needed: the link in your mail is proof enough.</p>
    </form>
  );
}
