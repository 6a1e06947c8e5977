"use client";

import { useQuery } from "@tanstack/react-query";
import { useState } from "react";
import { MessagePreview } from "@/components/mail/message-preview";
import { Button } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { EmptyState } from "@/components/ui/empty-state";
import { Skeleton } from "@/components/ui/skeleton";
import { ApiError, apiFetch } from "@/lib/api/fetcher";
import type { InboxMessage } from "@/lib/mail/schemas";
import { cn, formatDateTime } from "@/lib/utils";

const POLL_MS = 5_000;

/** What the local fake SMTP server received, each message as its recipient would see it. */
export function DeliveredPanel() {
  const inbox = useQuery({
    queryKey: ["mail-inbox"],
    queryFn: () => apiFetch<{ items: InboxMessage[] }>("/api/admin/inbox?limit=100"),
    staleTime: 0,
    // The sender runs every few seconds; new mail shows without a reload.
    refetchInterval: POLL_MS,
  });
  const [selectedId, setSelectedId] = useState<string | null>(null);
  const items = inbox.data?.items ?? [];
  const selected = items.find((m) => m.id === selectedId) ?? null;

  return (
    <div className="space-y-3">
      <div className="flex flex-wrap items-center gap-2">
        <p className="text-sm text-muted">
          The local mail server for the demo and tests keeps every message the app sends. Newest first; refreshes every few seconds.
        </p>
        <Button variant="ghost" className="ml-auto" onClick={() => void inbox.refetch()} disabled={inbox.isFetching}>
          {inbox.isFetching ? "Refreshing…" : "Refresh"}
        </Button>
      </div>
      {inbox.isLoading ? <Skeleton className="h-48" /> : null}
      {inbox.error && !inbox.data ? (
        <div role="alert" className="rounded border border-bad/50 bg-bad/10 px-3 py-2 text-sm text-bad">
          {inbox.error instanceof ApiError ? inbox.error.message : "Could not read the local inbox."}{" "}
          <button type="button" className="underline" onClick={() => void inbox.refetch()}>
            Try again
          </button>
        </div>
      ) : null}
      {inbox.data && items.length === 0 ? (
        <EmptyState title="Nothing delivered yet">
          Mail sent to the local mail server shows here. If the outbox has messages waiting, check that the fake SMTP server is running (npm run demo starts it).
        </EmptyState>
      ) : null}
      {items.length > 0 ? (
        <div className="grid gap-4 lg:grid-cols-[minmax(16rem,22rem)_1fr]">
          <ul aria-label="Delivered messages" className="max-h-[48rem] space-y-1 overflow-y-auto" data-testid="inbox-list">
            {items.map((m) => (
              <li key={m.id}>
                <button
                  type="button"
                  aria-current={m.id === selectedId ? "true" : undefined}
                  onClick={() => setSelectedId(m.id)}
                  className={cn(
                    "w-full rounded border px-3 py-2 text-left text-sm",
                    m.id === selectedId ? "border-accent bg-accent/10" : "border-line bg-surface hover:bg-surface-2",
                  )}
                  data-testid="inbox-item"
                >
                  <span className="block font-medium">{m.subject || "(no subject)"}</span>
                  <span className="block truncate text-xs text-muted">To {m.to || m.envelope.to.join(", ")}</span>
                  <span className="block text-xs text-muted">
                    <time dateTime={m.receivedAt}>{formatDateTime(m.receivedAt)}</time>
                  </span>
                </button>
              </li>
            ))}
          </ul>
          {selected ? (
            <DeliveredMessage message={selected} />
          ) : (
            <EmptyState title="Choose a message">Pick one on the left to read it as its recipient would.</EmptyState>
          )}
        </div>
      ) : null}
    </div>
  );
}

const SHOWN_HEADERS: [string, string][] = [
  ["list-unsubscribe", "List-Unsubscribe"],
  ["list-unsubscribe-post", "List-Unsubscribe-Post"],
  ["message-id", "Message-ID"],
];

function DeliveredMessage({ message: m }: { message: InboxMessage }) {
  return (
    <Card aria-label={`Message: ${m.subject}`} data-testid="inbox-message">
      <h2 className="mb-3 text-lg font-semibold">{m.subject || "(no subject)"}</h2>
      <dl className="mb-4 grid grid-cols-[max-content_1fr] gap-x-4 gap-y-1 text-sm">
        <dt className="text-muted">From</dt>
        <dd className="break-all">{m.from}</dd>
        <dt className="text-muted">To</dt>
        <dd className="break-all">{m.to}</dd>
        <dt className="text-muted">Date</dt>
        <dd>{m.date ? <time dateTime={m.date}>{formatDateTime(m.date)}</time> : (m.headers.date ?? "—")}</dd>
        <dt className="text-muted">Subject</dt>
        <dd>{m.subject}</dd>
        {SHOWN_HEADERS.filter(([key]) => m.headers[key] !== undefined).map(([key, label]) => (
          <div key={key} className="contents" data-testid={`header-${key}`}>
            <dt className="text-muted">{label}</dt>
            <dd className="font-mono text-xs break-all">{m.headers[key]}</dd>
          </div>
        ))}
      </dl>
      <MessagePreview key={m.id} html={m.html} text={m.text} subject={m.subject} />
      <p className="mt-3 text-xs">
        <a className="text-accent underline" href={`/api/admin/inbox/${encodeURIComponent(m.id)}`} download>
          Download the raw message (.eml)
        </a>
      </p>
    </Card>
  );
}
