"use client";

import { useOptimistic } from "react";
import { useSearchNav } from "@/components/search/search-nav";
import { Select } from "@/components/ui/field";
import { searchHref, type SearchSort, type SearchState } from "@/lib/search-ui/params";

export function SortControl({ state }: { state: SearchState }) {
  const { navigate } = useSearchNav();
  const [sort, setSort] = useOptimistic(state.sort);
  return (
    <div className="flex items-center gap-2 text-sm">
      <label htmlFor="search-sort" className="text-muted">
        Sort by
      </label>
      <Select
        id="search-sort"
        value={sort}
        onChange={(e) => {
          const next = e.target.value as SearchSort;
          navigate(searchHref({ ...state, sort: next, offset: 0 }), () => setSort(next));
        }}
        className="w-auto py-1"
      >
        <option value="relevance">Best match</option>
        <option value="recent">Recently updated</option>
      </Select>
    </div>
  );
}
