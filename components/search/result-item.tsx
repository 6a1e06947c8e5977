import Link from "next/link";
import { HighlightedText } from "@/components/search/highlighted-text";
import { HouseMethodBadge, StatusBadge } from "@/components/techniques/status-badge";
import { TagChips } from "@/components/techniques/tag-chips";
import type { SearchField, SearchMatch, SearchVia, SearchViaSource } from "@/lib/search/types";
import type { SearchResultDto } from "@/lib/search-ui/params";
import { formatDate } from "@/lib/utils";

const FIELD_LABELS: Partial<Record<SearchField, string>> = { aliases: "also called", tags: "tag", parameters: "parameter", shots: "used on" };

/** One search result: highlighted title and summary, a body snippet, badges, tags, and what else matched. */
export function ResultItem({ result }: { result: SearchResultDto }) {
  const byField = (field: SearchField) => result.matches.filter((m) => m.field === field);
  const title = byField("title")[0];
  const summary = byField("summary")[0];
  const body = byField("body")[0];
  const others = result.matches.filter((m) => FIELD_LABELS[m.field]).slice(0, 3);
  const tagName = (slug: string) => result.tags.find((t) => t.slug === slug)?.name;
  return (
    <li className="rounded-lg border border-line bg-surface p-4" data-testid="search-result">
      <div className="flex flex-wrap items-center gap-2">
        <h3 className="text-base font-semibold">
          <Link href={`/techniques/${result.slug}`} className="hover:text-accent">
            <HighlightedText text={result.title} ranges={title?.ranges ?? []} />
          </Link>
        </h3>
        <StatusBadge status={result.status} />
        {result.houseMethodFor.map((slug) => (
          <HouseMethodBadge key={slug} tagName={tagName(slug)} />
        ))}
      </div>
      <p className="mt-1 text-sm">
        <HighlightedText text={result.summary} ranges={summary?.ranges ?? []} />
      </p>
      {body ? (
        <p className="mt-2 border-l-2 border-line pl-3 text-sm text-muted" data-testid="search-snippet">
          <HighlightedText text={body.value} ranges={body.ranges} />
        </p>
      ) : null}
      {others.length ? <OtherMatches matches={others} /> : null}
      {result.via.length ? <RelatedWordsNote via={result.via} /> : null}
      <div className="mt-2 flex flex-wrap items-center gap-3">
        <TagChips tags={result.tags} />
        <span className="ml-auto text-xs text-muted">Updated {formatDate(result.updatedAt)}</span>
      </div>
    </li>
  );
}

function OtherMatches({ matches }: { matches: SearchMatch[] }) {
  return (
    <p className="mt-2 flex flex-wrap gap-x-3 gap-y-1 text-xs text-muted">
      {matches.map((m, i) => (
        <span key={`${m.field}-${i}`}>
          {FIELD_LABELS[m.field]} “<HighlightedText text={m.value} ranges={m.ranges} className="text-ink" />”
        </span>
      ))}
    </p>
  );
}

const SOURCE_LABELS: Record<SearchViaSource, string> = {
  thesaurus: "department thesaurus",
  lexicon: "built-in symptom words",
  wordnet: "everyday English, WordNet",
};

/**
 * Words found only through a word of related meaning, so the reader sees why this page came up and
 * where the link came from (a lead can change only the thesaurus ones).
 */
function RelatedWordsNote({ via }: { via: SearchVia[] }) {
  const sources = (Object.keys(SOURCE_LABELS) as SearchViaSource[]).filter((s) => via.some((v) => v.source === s));
  return (
    <p className="mt-1 text-xs text-muted" data-testid="search-via">
      {sources.map((source, i) => {
        // "tracker" and "dots" both reaching "marker" read as one note.
        const byTerm = new Map<string, string[]>();
        for (const v of via) if (v.source === source) byTerm.set(v.term, [...(byTerm.get(v.term) ?? []), v.word]);
        return (
          <span key={source}>
            {i > 0 ? " · " : null}
            {[...byTerm].map(([term, words], j) => (
              <span key={term}>
                {j > 0 ? "; " : null}
                {words.map((w) => `“${w}”`).join(", ")} found as <span className="text-ink">“{term}”</span>
              </span>
            ))}{" "}
            <span>({SOURCE_LABELS[source]})</span>
          </span>
        );
      })}
    </p>
  );
}
