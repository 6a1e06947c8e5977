"use client";

import { useQuery } from "@tanstack/react-query";
import { techniqueUsesKey } from "@/components/shots/query-keys";
import { UsesTable } from "@/components/shots/uses-table";
import { Button } from "@/components/ui/button";
import { Skeleton } from "@/components/ui/skeleton";
import { apiFetch } from "@/lib/api/fetcher";
import type { TechniqueUsesResponse, UseResponse } from "@/lib/uses/schemas";

/** The API's largest page, and how many rows the table holds at most (newest first). */
const PAGE = 200;
const MOST_ROWS = 1000;

async function fetchUses(slug: string): Promise<{ rows: UseResponse[]; total: number }> {
  const rows: UseResponse[] = [];
  let total = 0;
  for (let offset = 0; offset < MOST_ROWS; offset += PAGE) {
    const page = await apiFetch<TechniqueUsesResponse>(`/api/techniques/${encodeURIComponent(slug)}/uses?limit=${PAGE}&offset=${offset}`);
    rows.push(...page.items);
    total = page.total;
    if (rows.length >= total || page.items.length < PAGE) break;
  }
  return { rows, total };
}

/**
 * A technique's shot table, read in the browser: the page's server render carries only the
 * outcome counts, so a technique logged on hundreds of shots costs its page render no more than
 * one logged on five (issue 19).
 */
export function TechniqueUsesTable({ slug }: { slug: string }) {
  const query = useQuery({ queryKey: techniqueUsesKey(slug), queryFn: () => fetchUses(slug) });
  if (query.isPending) {
    return (
      <div role="status" aria-label="Loading the shot table" className="space-y-2">
        <Skeleton className="h-8 w-full" />
        <Skeleton className="h-64 w-full" />
      </div>
    );
  }
  if (query.isError) {
    return (
      <div role="alert" className="space-y-2 text-sm text-bad">
        <p>Could not load the shot table: {query.error.message}</p>
        <Button type="button" onClick={() => void query.refetch()}>
          Try again
        </Button>
      </div>
    );
  }
  const { rows, total } = query.data;
  return (
    <div className="space-y-2">
      {total > rows.length ? (
        <p className="text-sm text-muted">
          The newest {rows.length.toLocaleString("en-GB")} of {total.toLocaleString("en-GB")} logged uses; the outcome counts cover them all.
        </p>
      ) : null}
      <UsesTable initial={rows} />
    </div>
  );
}
