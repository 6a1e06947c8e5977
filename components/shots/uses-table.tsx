"use client";

import { createColumnHelper, flexRender, getCoreRowModel, getFilteredRowModel, getPaginationRowModel, getSortedRowModel, useReactTable, type SortingState } from "@tanstack/react-table";
import Link from "next/link";
import { useMemo, useState } from "react";
import { Button } from "@/components/ui/button";
import { EmptyState } from "@/components/ui/empty-state";
import { Select, TextInput } from "@/components/ui/field";
import type { UseResponse } from "@/lib/uses/schemas";
import { formatDate } from "@/lib/utils";

const OUTCOME_LABEL = { clean: "clean", "touch-up": "needed touch-up", failed: "failed" } as const;
const col = createColumnHelper<UseResponse>();
const columns = [
  col.accessor((u) => u.shot.code, { id: "shot", header: "Shot", cell: (c) => <Link href={`/shots/${c.getValue()}`} className="font-mono hover:text-accent">{c.getValue()}</Link> }),
  col.accessor("outcome", { header: "Outcome", cell: (c) => OUTCOME_LABEL[c.getValue()], filterFn: "equalsString" }),
  col.accessor((u) => u.user?.name ?? "", { id: "who", header: "Who" }),
  col.accessor("createdAt", { header: "When", cell: (c) => formatDate(c.getValue()) }),
  col.accessor("note", { header: "Note", enableSorting: false }),
];

/** The technique's shot log: sortable, filterable by outcome and text, paged. */
export function UsesTable({ initial }: { initial: UseResponse[] }) {
  const [sorting, setSorting] = useState<SortingState>([{ id: "createdAt", desc: true }]);
  const [globalFilter, setGlobalFilter] = useState("");
  const [outcome, setOutcome] = useState("");
  // The compiler leaves this component unmemoised, which is what TanStack Table needs: its API returns fresh functions each render.
  // A fresh filter array (or a refreshed `initial`) on every render made the table reset its page
  // index on every render, which re-rendered it again: an endless loop after router.refresh().
  const columnFilters = useMemo(() => (outcome ? [{ id: "outcome", value: outcome }] : []), [outcome]);
  // eslint-disable-next-line react-hooks/incompatible-library
  const table = useReactTable({
    autoResetPageIndex: false,
    data: initial,
    columns,
    state: { sorting, globalFilter, columnFilters },
    onSortingChange: setSorting,
    onGlobalFilterChange: setGlobalFilter,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
    getFilteredRowModel: getFilteredRowModel(),
    getPaginationRowModel: getPaginationRowModel(),
    initialState: { pagination: { pageSize: 10 } },
  });
  if (!initial.length) return <EmptyState title="Not logged on any shot yet." />;
  return (
    <div className="space-y-2">
      <div className="flex gap-2">
        <TextInput aria-label="Filter shots" placeholder="Filter by shot, person or note" value={globalFilter} onChange={(e) => {
            setGlobalFilter(e.target.value);
            table.setPageIndex(0);
          }} />
        <Select aria-label="Outcome" className="w-44" value={outcome} onChange={(e) => {
            setOutcome(e.target.value);
            table.setPageIndex(0);
          }}>
          <option value="">all outcomes</option>
          <option value="clean">clean</option>
          <option value="touch-up">needed touch-up</option>
          <option value="failed">failed</option>
        </Select>
      </div>
      <table className="w-full border-collapse text-sm" data-testid="uses-table">
        <thead>
          {table.getHeaderGroups().map((hg) => (
            <tr key={hg.id} className="border-b border-line text-left text-muted">
              {hg.headers.map((h) => (
                <th key={h.id} className="py-1.5 pr-2 font-medium" aria-sort={h.column.getIsSorted() === "asc" ? "ascending" : h.column.getIsSorted() === "desc" ? "descending" : undefined}>
                  {h.column.getCanSort() ? (
                    <button type="button" onClick={h.column.getToggleSortingHandler()} className="hover:text-ink">
                      {flexRender(h.column.columnDef.header, h.getContext())}
                      {h.column.getIsSorted() === "asc" ? " ↑" : h.column.getIsSorted() === "desc" ? " ↓" : ""}
                    </button>
                  ) : (
                    flexRender(h.column.columnDef.header, h.getContext())
                  )}
                </th>
              ))}
            </tr>
          ))}
        </thead>
        <tbody>
          {table.getRowModel().rows.map((row) => (
            <tr key={row.id} className="border-b border-line">
              {row.getVisibleCells().map((cell) => (
                <td key={cell.id} className="py-1.5 pr-2 align-top">
                  {flexRender(cell.column.columnDef.cell, cell.getContext())}
                </td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
      <div className="flex items-center gap-2 text-sm">
        <Button onClick={() => table.previousPage()} disabled={!table.getCanPreviousPage()}>
          Previous
        </Button>
        <span className="text-muted">
          page {table.getState().pagination.pageIndex + 1} of {Math.max(1, table.getPageCount())}
        </span>
        <Button onClick={() => table.nextPage()} disabled={!table.getCanNextPage()}>
          Next
        </Button>
      </div>
    </div>
  );
}
