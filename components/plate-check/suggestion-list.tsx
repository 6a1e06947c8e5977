import Link from "next/link";
import { Badge } from "@/components/ui/badge";
import { EmptyState } from "@/components/ui/empty-state";
import type { SuggestedMethod } from "@/lib/plate-check/schemas";

/** The department's approved methods for what was found, its method for each problem first. */
export function SuggestionList({ items, tagNames, hasProblems }: { items: SuggestedMethod[]; tagNames: Record<string, string>; hasProblems: boolean }) {
  if (!items.length) {
    return (
      <EmptyState title={hasProblems ? "No approved method covers these problems yet." : "Nothing found that points to a method."}>
        {hasProblems ? (
          <Link href="/search" className="text-accent">
            Search in your own words, or ask for a write-up
          </Link>
        ) : (
          "The frame looks clean to the check; see each finding for what was measured."
        )}
      </EmptyState>
    );
  }
  return (
    <ol className="space-y-2">
      {items.map((m) => (
        <li key={m.slug} className="rounded border border-line bg-surface p-3">
          <div className="flex flex-wrap items-center gap-2">
            <Link href={`/techniques/${m.slug}`} className="font-medium hover:text-accent">
              {m.title}
            </Link>
            {m.isHouseMethod ? <Badge tone="ok">Department method</Badge> : null}
            {m.hasRecipe ? <Badge tone="neutral">Runnable recipe</Badge> : null}
          </div>
          <p className="mt-1 text-sm text-muted">{m.summary}</p>
          <p className="mt-1 text-xs text-muted">For: {m.problems.map((p) => tagNames[p] ?? p).join(", ")}</p>
        </li>
      ))}
    </ol>
  );
}
