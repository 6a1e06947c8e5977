"use client";

import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { useState } from "react";
import { MessagePreview } from "@/components/mail/message-preview";
import { Badge } from "@/components/ui/badge";
import { Button } from "@/components/ui/button";
import { Card, CardTitle } from "@/components/ui/card";
import { DataTable } from "@/components/ui/data-table";
import { EmptyState } from "@/components/ui/empty-state";
import { Skeleton } from "@/components/ui/skeleton";
import { ApiError, apiFetch } from "@/lib/api/fetcher";
import { OUTBOX_STATES, type OutboxItemResponse, type OutboxListResponse, type OutboxState } from "@/lib/mail/schemas";
import { cn, formatDateTime } from "@/lib/utils";

const PAGE = 50;
const BUSY_POLL_MS = 3_000;
const IDLE_POLL_MS = 20_000;

const STATE_TONE: Record<OutboxState, "neutral" | "accent" | "ok" | "bad"> = { queued: "neutral", sending: "accent", sent: "ok", failed: "bad" };
const STATE_LABEL: Record<OutboxState, string> = { queued: "Queued", sending: "Sending", sent: "Sent", failed: "Failed" };

/** Failed messages, and waiting ones that were refused or could not be delivered, can be sent again. */
function canRetry(item: OutboxItemResponse): boolean {
  return item.state === "failed" || (item.state === "queued" && item.lastError !== null);
}

function errorText(error: unknown): string {
  return error instanceof ApiError ? error.message : "Could not load the outbox.";
}

/** The outbox: counts per state, a filterable table, retry, and each message as it will be sent. */
export function OutboxPanel() {
  const client = useQueryClient();
  const [filter, setFilter] = useState<OutboxState | "all">("all");
  const [offset, setOffset] = useState(0);
  const [selected, setSelected] = useState<number | null>(null);

  const list = useQuery({
    queryKey: ["outbox", filter, offset],
    queryFn: () => {
      const q = new URLSearchParams({ limit: String(PAGE), offset: String(offset) });
      if (filter !== "all") q.set("state", filter);
      return apiFetch<OutboxListResponse>(`/api/admin/outbox?${q}`);
    },
    staleTime: 0,
    // Quick while the sender has work (so states change before one's eyes), slow otherwise.
    refetchInterval: (query) => {
      const c = query.state.data?.counts;
      return c && c.queued + c.sending > 0 ? BUSY_POLL_MS : IDLE_POLL_MS;
    },
  });

  const retry = useMutation({
    mutationFn: (id: number) => apiFetch<OutboxItemResponse>(`/api/admin/outbox/${id}/retry`, { method: "POST" }),
    onSettled: (_data, _error, id) => {
      void client.invalidateQueries({ queryKey: ["outbox"] });
      void client.invalidateQueries({ queryKey: ["outbox-item", id] });
    },
  });

  const counts = list.data?.counts;
  const all = counts ? OUTBOX_STATES.reduce((n, s) => n + counts[s], 0) : undefined;
  const choose = (next: OutboxState | "all") => {
    setFilter(next);
    setOffset(0);
  };

  return (
    <div className="space-y-4">
      <div className="flex flex-wrap items-center gap-2">
        <div role="group" aria-label="Show messages in state" className="flex flex-wrap gap-2">
          {(["all", ...OUTBOX_STATES] as const).map((s) => (
            <button
              key={s}
              type="button"
              aria-pressed={filter === s}
              onClick={() => choose(s)}
              data-testid={`outbox-count-${s}`}
              className={cn(
                "min-w-24 rounded border px-3 py-1.5 text-left text-sm transition",
                filter === s ? "border-accent bg-accent/10" : "border-line bg-surface hover:bg-surface-2",
              )}
            >
              <span className="block text-xs text-muted">{s === "all" ? "All" : STATE_LABEL[s]}</span>
              <span className="block text-lg font-semibold tabular-nums">{s === "all" ? (all ?? "–") : (counts?.[s] ?? "–")}</span>
            </button>
          ))}
        </div>
        <Button variant="ghost" className="ml-auto" onClick={() => void list.refetch()} disabled={list.isFetching}>
          {list.isFetching ? "Refreshing…" : "Refresh"}
        </Button>
      </div>

      {retry.error ? (
        <p role="alert" className="rounded border border-bad/50 bg-bad/10 px-3 py-2 text-sm text-bad">
          {errorText(retry.error)}
        </p>
      ) : null}

      {list.isLoading ? <Skeleton className="h-48" /> : null}
      {list.error && !list.data ? (
        <div role="alert" className="rounded border border-bad/50 bg-bad/10 px-3 py-2 text-sm text-bad">
          {errorText(list.error)}{" "}
          <button type="button" className="underline" onClick={() => void list.refetch()}>
            Try again
          </button>
        </div>
      ) : null}

      {list.data && list.data.items.length === 0 ? (
        <EmptyState title={filter === "all" ? "The outbox is empty" : `No ${STATE_LABEL[filter].toLowerCase()} messages`}>
          Messages appear here when an approval, retirement, invitation or digest causes mail.
        </EmptyState>
      ) : null}

      {list.data && list.data.items.length > 0 ? (
        <div>
          <DataTable
            data-testid="outbox-table"
            caption="Outbox messages, newest first"
            head={
              <>
                <th scope="col" className="py-2 pr-3 font-medium">Recipient</th>
                <th scope="col" className="pr-3 font-medium">Subject</th>
                <th scope="col" className="pr-3 font-medium">State</th>
                <th scope="col" className="pr-3 text-right font-medium">Attempts</th>
                <th scope="col" className="pr-3 font-medium">Last error</th>
                <th scope="col" className="pr-3 font-medium">Queued</th>
                <th scope="col" className="pr-3 font-medium">Sent / next try</th>
                <th scope="col">
                  <span className="sr-only">Actions</span>
                </th>
              </>
            }
          >
            {list.data.items.map((item) => (
              <tr
                key={item.id}
                onClick={() => setSelected(item.id)}
                className={cn("cursor-pointer border-b border-line align-top hover:bg-surface-2", selected === item.id && "bg-accent/10")}
                data-testid="outbox-row"
              >
                <td className="py-2 pr-3 break-all">{item.to}</td>
                <td className="py-2 pr-3">
                  {/* The row is clickable for the mouse; this button is the keyboard's way in. */}
                  <button type="button" className="text-left hover:underline focus-visible:underline" aria-expanded={selected === item.id} onClick={() => setSelected(item.id)}>
                    {item.subject}
                  </button>
                  <span className="block text-xs text-muted">{item.kind}</span>
                </td>
                <td className="py-2 pr-3">
                  <Badge tone={STATE_TONE[item.state]}>{STATE_LABEL[item.state]}</Badge>
                </td>
                <td className="py-2 pr-3 text-right tabular-nums">{item.attempts}</td>
                <td className="max-w-64 py-2 pr-3 text-xs break-words text-bad">{item.lastError ?? <span className="text-muted">—</span>}</td>
                <td className="py-2 pr-3 text-xs whitespace-nowrap text-muted">
                  <time dateTime={item.createdAt}>{formatDateTime(item.createdAt)}</time>
                </td>
                <td className="py-2 pr-3 text-xs whitespace-nowrap text-muted">
                  {item.sentAt ? (
                    <time dateTime={item.sentAt}>{formatDateTime(item.sentAt)}</time>
                  ) : item.state === "queued" ? (
                    <>
                      next <time dateTime={item.nextAttemptAt}>{formatDateTime(item.nextAttemptAt)}</time>
                    </>
                  ) : (
                    "—"
                  )}
                </td>
                <td className="py-2 text-right">
                  {canRetry(item) ? (
                    <Button
                      variant={item.state === "failed" ? "primary" : "secondary"}
                      disabled={retry.isPending && retry.variables === item.id}
                      onClick={(e) => {
                        e.stopPropagation();
                        retry.mutate(item.id);
                      }}
                      aria-label={`Retry the message to ${item.to}: ${item.subject}`}
                    >
                      {retry.isPending && retry.variables === item.id ? "Queuing…" : item.state === "failed" ? "Retry" : "Retry now"}
                    </Button>
                  ) : null}
                </td>
              </tr>
            ))}
          </DataTable>
          <div className="mt-2 flex items-center justify-between text-sm text-muted">
            <span>
              {offset + 1}–{offset + list.data.items.length} of {list.data.total}
            </span>
            <div className="flex gap-2">
              <Button disabled={offset === 0} onClick={() => setOffset(Math.max(0, offset - PAGE))}>
                Newer
              </Button>
              <Button disabled={offset + PAGE >= list.data.total} onClick={() => setOffset(offset + PAGE)}>
                Older
              </Button>
            </div>
          </div>
        </div>
      ) : null}

      {selected !== null ? (
        <OutboxMessage
          id={selected}
          initial={list.data?.items.find((i) => i.id === selected)}
          onClose={() => setSelected(null)}
          onRetry={(id) => retry.mutate(id)}
          retrying={retry.isPending}
        />
      ) : null}
    </div>
  );
}

function OutboxMessage({
  id,
  initial,
  onClose,
  onRetry,
  retrying,
}: {
  id: number;
  initial?: OutboxItemResponse;
  onClose(): void;
  onRetry(id: number): void;
  retrying: boolean;
}) {
  const item = useQuery({
    queryKey: ["outbox-item", id],
    queryFn: () => apiFetch<OutboxItemResponse>(`/api/admin/outbox/${id}`),
    placeholderData: initial,
    staleTime: 0,
    refetchInterval: (query) => (query.state.data && (query.state.data.state === "queued" || query.state.data.state === "sending") ? BUSY_POLL_MS : false),
  });
  const m = item.data;
  return (
    <Card aria-labelledby="outbox-message-title" data-testid="outbox-message">
      <CardTitle
        action={
          <div className="flex gap-2">
            {m && canRetry(m) ? (
              <Button variant="primary" disabled={retrying} onClick={() => onRetry(m.id)}>
                Retry
              </Button>
            ) : null}
            <Button variant="ghost" onClick={onClose}>
              Close
            </Button>
          </div>
        }
      >
        <span id="outbox-message-title">{m ? m.subject : "Message"}</span>
      </CardTitle>
      {item.error && !m ? <p role="alert" className="text-sm text-bad">{errorText(item.error)}</p> : null}
      {!m && item.isLoading ? <Skeleton className="h-40" /> : null}
      {m ? (
        <div className="space-y-4">
          <dl className="grid grid-cols-[max-content_1fr] gap-x-4 gap-y-1 text-sm">
            <dt className="text-muted">To</dt>
            <dd className="break-all">{m.to}</dd>
            <dt className="text-muted">State</dt>
            <dd>
              <Badge tone={STATE_TONE[m.state]}>{STATE_LABEL[m.state]}</Badge> after {m.attempts} {m.attempts === 1 ? "attempt" : "attempts"}
            </dd>
            {m.lastError ? (
              <>
                <dt className="text-muted">Last error</dt>
                <dd className="break-words text-bad">{m.lastError}</dd>
              </>
            ) : null}
            <dt className="text-muted">Queued</dt>
            <dd>{formatDateTime(m.createdAt)}</dd>
            <dt className="text-muted">{m.sentAt ? "Sent" : "Next try"}</dt>
            <dd>{formatDateTime(m.sentAt ?? m.nextAttemptAt)}</dd>
            <dt className="text-muted">Message-ID</dt>
            <dd className="font-mono text-xs break-all">{m.messageId}</dd>
            {Object.entries(m.headers).map(([k, v]) => (
              <HeaderRow key={k} name={k} value={v} />
            ))}
          </dl>
          <MessagePreview html={m.html} text={m.text} subject={m.subject} />
        </div>
      ) : null}
    </Card>
  );
}

function HeaderRow({ name, value }: { name: string; value: string }) {
  return (
    <>
      <dt className="text-muted">{name}</dt>
      <dd className="font-mono text-xs break-all">{value}</dd>
    </>
  );
}
