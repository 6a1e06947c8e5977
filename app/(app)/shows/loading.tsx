import { Skeleton } from "@/components/ui/skeleton";

export default function ShowsLoading() {
  return (
    <div className="space-y-4" aria-busy="true" aria-label="Loading shows">
      <Skeleton className="h-8 w-40" />
      <Skeleton className="h-6" />
      <Skeleton className="h-6" />
      <Skeleton className="h-6" />
    </div>
  );
}
