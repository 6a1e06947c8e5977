"use client";

import { useMutation } from "@tanstack/react-query";
import Link from "next/link";
import { useState, type FormEvent } from "react";
import { Button } from "@/components/ui/button";
import { describedBy, Field, TextArea, TextInput } from "@/components/ui/field";
import { ApiError, apiFetch } from "@/lib/api/fetcher";
import { cn } from "@/lib/utils";

/**
 * Turns a search into a technique request. `prominent` when the search found nothing usable: the
 * form is open at once; otherwise it waits behind a "not what you need?" button.
 */
export function RequestOffer({ query, prominent, reason }: { query: string; prominent: boolean; reason?: string }) {
  const [isOpen, setIsOpen] = useState(prominent);
  const [text, setText] = useState(query);
  const [note, setNote] = useState("");
  const send = useMutation({
    mutationFn: (input: { query: string; note: string }) => apiFetch<{ id: string }>("/api/requests", { method: "POST", json: input }),
  });
  const fields = send.error instanceof ApiError ? (send.error.fields ?? {}) : {};
  function submit(e: FormEvent) {
    e.preventDefault();
    send.mutate({ query: text.trim(), note: note.trim() });
  }
  if (send.isSuccess) {
    return (
      <div role="status" className="rounded-lg border border-ok/50 bg-ok/10 p-4 text-sm" data-testid="request-sent">
        <p className="font-medium">Request sent: “{text.trim()}”.</p>
        <p className="text-muted">
          Seniors will see your request on their home page. You can follow it under “My requests” on <Link href="/" className="text-accent underline">your home page</Link>.
        </p>
      </div>
    );
  }
  if (!isOpen) {
    return (
      <p className="text-sm text-muted">
        Not what you need?{" "}
        <button type="button" className="text-accent underline underline-offset-2" onClick={() => setIsOpen(true)}>
          Ask for a write-up
        </button>
      </p>
    );
  }
  return (
    <section aria-labelledby="request-title" className={cn("rounded-lg border p-4", prominent ? "border-accent/50 bg-accent/5" : "border-line bg-surface")} data-testid="request-offer">
      <h2 id="request-title" className="font-semibold">
        Nobody has written this up yet — ask for a write-up
      </h2>
      {reason ? <p className="mt-1 text-sm text-muted">{reason}</p> : null}
      <form onSubmit={submit} className="mt-3 space-y-3">
        <Field id="request-query" label="What do you need a method for?" error={fields.query}>
          <TextInput id="request-query" value={text} onChange={(e) => setText(e.target.value)} maxLength={200} required aria-describedby={describedBy("request-query", fields.query)} aria-invalid={Boolean(fields.query)} />
        </Field>
        <Field id="request-note" label="Note (optional)" hint="Shot code, what you tried, how soon you need it." error={fields.note}>
          <TextArea id="request-note" value={note} onChange={(e) => setNote(e.target.value)} maxLength={2000} aria-describedby={describedBy("request-note", fields.note, "hint")} />
        </Field>
        {send.error && !Object.keys(fields).length ? (
          <p role="alert" className="text-sm text-bad">
            {send.error.message}
          </p>
        ) : null}
        <Button type="submit" variant="primary" disabled={send.isPending || text.trim().length < 2}>
          {send.isPending ? "Sending…" : "Send the request"}
        </Button>
      </form>
    </section>
  );
}
