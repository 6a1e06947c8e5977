"use client";

import dynamic from "next/dynamic";
import { Skeleton } from "@/components/ui/skeleton";

/*
 * The shot table is built by TanStack Table, which was the largest single part of a technique
 * page's server render (issue 19: ~7 % of the server's CPU per page). Its rows are already in the
 * page's data, so it is rendered in the browser only, with a placeholder of about its height.
 */
function UsesTablePlaceholder() {
  return (
    <div role="status" aria-label="Loading the shot table" className="space-y-2">
      <Skeleton className="h-8 w-full" />
      <Skeleton className="h-64 w-full" />
    </div>
  );
}

export const UsesTableLoader = dynamic(() => import("@/components/shots/uses-table").then((m) => m.UsesTable), { ssr: false, loading: UsesTablePlaceholder });
