import { Skeleton } from "@/components/ui/skeleton";

export function SearchSkeleton() {
  return (
    <div className="space-y-5" aria-busy="true" aria-label="Searching">
      <Skeleton className="h-8 w-40" />
      <Skeleton className="h-10" />
      <div className="grid gap-6 md:grid-cols-[14rem_minmax(0,1fr)]">
        <div className="space-y-2">
          <Skeleton className="h-4 w-24" />
          <Skeleton className="h-24" />
          <Skeleton className="h-16" />
        </div>
        <div className="space-y-3">
          <Skeleton className="h-28" />
          <Skeleton className="h-28" />
          <Skeleton className="h-28" />
        </div>
      </div>
    </div>
  );
}
