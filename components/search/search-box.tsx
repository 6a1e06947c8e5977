"use client";

import { useState, type FormEvent } from "react";
import { useSearchNav } from "@/components/search/search-nav";
import { Button } from "@/components/ui/button";
import { TextInput } from "@/components/ui/field";
import { searchHref, type SearchState } from "@/lib/search-ui/params";
import { pushRecent } from "@/lib/search-ui/recent";

/** The page's search field. A new query keeps the chosen filters and starts from the first page. */
export function SearchBox({ state, userId }: { state: SearchState; userId: string }) {
  const { navigate, isPending } = useSearchNav();
  const [q, setQ] = useState(state.q);
  function submit(e: FormEvent) {
    e.preventDefault();
    const query = q.trim();
    if (query) pushRecent(userId, query);
    navigate(searchHref({ ...state, q: query, exact: false, offset: 0 }));
  }
  return (
    <form role="search" onSubmit={submit} className="flex gap-2">
      <label htmlFor="search-q" className="sr-only">
        Describe the problem you see
      </label>
      <TextInput
        id="search-q"
        type="search"
        name="q"
        value={q}
        onChange={(e) => setQ(e.target.value)}
        placeholder="Describe the problem, e.g. tracker dots on blue screen"
        autoComplete="off"
        maxLength={200}
        className="py-2 text-base"
      />
      <Button type="submit" variant="primary" disabled={isPending}>
        {isPending ? "Searching…" : "Search"}
      </Button>
    </form>
  );
}
