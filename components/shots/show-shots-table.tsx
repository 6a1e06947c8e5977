"use client";

import { keepPreviousData, useQuery } from "@tanstack/react-query";
import Link from "next/link";
import { useEffect, useState } from "react";
import { Badge } from "@/components/ui/badge";
import { Button } from "@/components/ui/button";
import { DataTable } from "@/components/ui/data-table";
import { EmptyState } from "@/components/ui/empty-state";
import { TextInput } from "@/components/ui/field";
import { apiFetch } from "@/lib/api/fetcher";
import { frameRange, SHOTS_PAGE_SIZE } from "@/lib/shots/format";
import { SHOT_STATE_LABELS, type ShotsResponse, type ShotState } from "@/lib/shots/schemas";

const STATE_TONE: Record<ShotState, "neutral" | "accent" | "ok" | "warn"> = { waiting: "neutral", in_prep: "accent", cleaned: "ok", on_hold: "warn" };

export const showShotsKey = (showCode: string) => ["show-shots", showCode] as const;

/**
 * A show's shots, paged on the server and filtered by part of a code or description. The first
 * page comes from the server render; later pages and filters are fetched as you go.
 */
export function ShowShotsTable({ showCode, initial }: { showCode: string; initial: ShotsResponse }) {
  const [text, setText] = useState("");
  const [q, setQ] = useState("");
  const [page, setPage] = useState(0);
  useEffect(() => {
    // Wait for a pause in typing before asking the server.
    const t = setTimeout(() => {
      setQ(text.trim());
      setPage(0);
    }, 250);
    return () => clearTimeout(t);
  }, [text]);

  const query = useQuery({
    queryKey: [...showShotsKey(showCode), q, page],
    queryFn: () =>
      apiFetch<ShotsResponse>(
        `/api/shows/${encodeURIComponent(showCode)}/shots?${new URLSearchParams({ ...(q ? { q } : {}), limit: String(SHOTS_PAGE_SIZE), offset: String(page * SHOTS_PAGE_SIZE) })}`,
      ),
    initialData: q === "" && page === 0 ? initial : undefined,
    placeholderData: keepPreviousData,
  });
  const data = query.data ?? { items: [], total: 0 };
  const pages = Math.max(1, Math.ceil(data.total / SHOTS_PAGE_SIZE));
  const first = data.total ? page * SHOTS_PAGE_SIZE + 1 : 0;
  const last = Math.min(data.total, (page + 1) * SHOTS_PAGE_SIZE);

  return (
    <div className="space-y-2">
      <div className="flex flex-wrap items-center gap-2">
        <TextInput aria-label="Filter shots" className="max-w-xs" placeholder="Filter by code or description" value={text} onChange={(e) => setText(e.target.value)} />
        <span className="text-sm text-muted" aria-live="polite">
          {query.isFetching ? "Loading…" : data.total ? `${first}–${last} of ${data.total}` : null}
        </span>
      </div>
      {query.isError ? (
        <p role="alert" className="text-sm text-bad">
          Could not load the shots. Try again in a moment.
        </p>
      ) : null}
      {data.items.length === 0 && !query.isFetching ? (
        <EmptyState title={q ? "No shot matches this filter." : "No shots in this show yet."}>{q ? null : "Leads add them by importing a shot list."}</EmptyState>
      ) : (
        <DataTable
          data-testid="show-shots"
          head={
            <>
              <th className="py-1.5 pr-3 font-medium">Shot</th>
              <th className="py-1.5 pr-3 font-medium">Sequence</th>
              <th className="py-1.5 pr-3 font-medium">Description</th>
              <th className="py-1.5 pr-3 font-medium">Frames</th>
              <th className="py-1.5 font-medium">State</th>
            </>
          }
        >
          {data.items.map((s) => (
            <tr key={s.id} className="border-b border-line align-top">
              <td className="py-1.5 pr-3">
                <Link href={`/shots/${encodeURIComponent(s.code)}`} className="font-mono hover:text-accent">
                  {s.code}
                </Link>
              </td>
              <td className="py-1.5 pr-3 font-mono">{s.sequence || "—"}</td>
              <td className="py-1.5 pr-3">{s.description}</td>
              <td className="py-1.5 pr-3 whitespace-nowrap font-mono text-xs">{frameRange(s)}</td>
              <td className="py-1.5">
                <Badge tone={STATE_TONE[s.state]}>{SHOT_STATE_LABELS[s.state]}</Badge>
              </td>
            </tr>
          ))}
        </DataTable>
      )}
      {pages > 1 ? (
        <nav aria-label="Shot pages" className="flex items-center gap-2 text-sm">
          <Button onClick={() => setPage((p) => Math.max(0, p - 1))} disabled={page === 0}>
            Previous
          </Button>
          <span className="text-muted">
            page {page + 1} of {pages}
          </span>
          <Button onClick={() => setPage((p) => Math.min(pages - 1, p + 1))} disabled={page >= pages - 1}>
            Next
          </Button>
        </nav>
      ) : null}
    </div>
  );
}
