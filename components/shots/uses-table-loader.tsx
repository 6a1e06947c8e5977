"use client";

import dynamic from "next/dynamic";
import { Skeleton } from "@/components/ui/skeleton";

/*
 * The shot table is built by TanStack Table, which was the largest single part of a technique
 * page's server render (issue 19: ~7 % of the server's CPU per page). It is rendered in the
 * browser only and reads its rows there, with a placeholder of about its height meanwhile.
 */
function UsesTablePlaceholder() {
  return (
    <div role="status" aria-label="Loading the shot table" className="space-y-2">
      <Skeleton className="h-8 w-full" />
      <Skeleton className="h-64 w-full" />
    </div>
  );
}

export const UsesTableLoader = dynamic(() => import("@/components/shots/technique-uses-table").then((m) => m.TechniqueUsesTable), {
  ssr: false,
  loading: UsesTablePlaceholder,
});
