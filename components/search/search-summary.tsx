import Link from "next/link";
import { searchHref, type SearchState } from "@/lib/search-ui/params";

/**
 * The results heading, and what was actually searched when the engine corrected misspelt words,
 * with a way to search for exactly what was typed (and back); and what the query was read to say
 * the plate lacks, since that moves pages up and down.
 */
export function SearchSummary({ state, total, corrected, denials, tookMs }: { state: SearchState; total: number; corrected?: string; denials?: string[]; tookMs: number }) {
  const count = `${total} ${total === 1 ? "technique" : "techniques"}`;
  return (
    <div>
      <h2 id="results-title" className="font-semibold">
        {state.q ? `${count} for “${state.q}”` : `${count}, newest first`}
      </h2>
      {corrected ? (
        <p className="text-sm text-muted" data-testid="search-corrected">
          Searched for <strong className="text-ink">{corrected}</strong> — some words looked misspelt.{" "}
          <Link href={searchHref({ ...state, exact: true, offset: 0 })} className="text-accent underline" data-testid="search-exact">
            Search for exactly what I typed
          </Link>
        </p>
      ) : null}
      {denials?.length ? (
        <p className="text-sm text-muted" data-testid="search-denials">
          Read{" "}
          {denials.map((d, i) => (
            <span key={i}>
              {i > 0 ? " and " : ""}“<strong className="text-ink">{d}</strong>”
            </span>
          ))}{" "}
          as something the plate lacks: techniques for that case rank higher, techniques that rely on it lower.
        </p>
      ) : null}
      {state.exact && state.q ? (
        <p className="text-sm text-muted" data-testid="search-exact-note">
          Searched for exactly what you typed.{" "}
          <Link href={searchHref({ ...state, exact: false, offset: 0 })} className="text-accent underline">
            Let search correct spelling
          </Link>
        </p>
      ) : null}
      <p className="sr-only">Search took {Math.round(tookMs)} milliseconds.</p>
    </div>
  );
}
