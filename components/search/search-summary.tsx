import type { SearchState } from "@/lib/search-ui/params";

/** The results heading, and what was actually searched when the engine corrected misspelt words. */
export function SearchSummary({ state, total, corrected, tookMs }: { state: SearchState; total: number; corrected?: string; tookMs: number }) {
  const count = `${total} ${total === 1 ? "technique" : "techniques"}`;
  return (
    <div>
      <h2 id="results-title" className="font-semibold">
        {state.q ? `${count} for “${state.q}”` : `${count}, newest first`}
      </h2>
      {corrected ? (
        <p className="text-sm text-muted" data-testid="search-corrected">
          Searched for <strong className="text-ink">{corrected}</strong> — some words looked misspelt.
        </p>
      ) : null}
      <p className="sr-only">Search took {Math.round(tookMs)} milliseconds.</p>
    </div>
  );
}
