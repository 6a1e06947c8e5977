import Link from "next/link";
import { ResultItem } from "@/components/search/result-item";
import { buttonClasses } from "@/components/ui/button";
import { EmptyState } from "@/components/ui/empty-state";
import { PAGE_SIZE, searchHref, type SearchApiResponse, type SearchState } from "@/lib/search-ui/params";

export function ResultList({ state, response }: { state: SearchState; response: SearchApiResponse }) {
  const { results, total } = response;
  const hasFilters = state.tag.length > 0 || state.status.length > 0;
  if (!results.length) {
    return (
      <EmptyState title={state.q ? "No techniques found." : "No techniques to list."}>
        {hasFilters ? (
          <Link href={searchHref({ q: state.q, sort: state.sort })} className="text-accent underline">
            Clear the filters
          </Link>
        ) : null}
      </EmptyState>
    );
  }
  const from = state.offset + 1;
  const to = state.offset + results.length;
  return (
    <div className="space-y-3">
      <ol className="space-y-3" aria-label="Results">
        {results.map((r) => (
          <ResultItem key={r.slug} result={r} />
        ))}
      </ol>
      {total > PAGE_SIZE ? (
        <nav aria-label="Result pages" className="flex items-center gap-3 text-sm">
          {state.offset > 0 ? (
            <Link className={buttonClasses("secondary")} href={searchHref({ ...state, offset: Math.max(0, state.offset - PAGE_SIZE) })}>
              Previous
            </Link>
          ) : null}
          <span className="text-muted">
            {from}–{to} of {total}
          </span>
          {to < total ? (
            <Link className={buttonClasses("secondary")} href={searchHref({ ...state, offset: state.offset + PAGE_SIZE })}>
              Next
            </Link>
          ) : null}
        </nav>
      ) : null}
    </div>
  );
}
