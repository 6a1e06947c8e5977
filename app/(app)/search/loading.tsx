import { SearchSkeleton } from "@/components/search/skeletons";

export default function Loading() {
  return <SearchSkeleton />;
}
