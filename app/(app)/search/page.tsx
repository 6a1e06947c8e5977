import type { Metadata } from "next";
import { FrameDrop } from "@/components/plate-check/frame-drop";
import { FacetPanel } from "@/components/search/facet-panel";
import { RequestOffer } from "@/components/search/request-offer";
import { ResultList } from "@/components/search/result-list";
import { SearchBox } from "@/components/search/search-box";
import { PendingRegion, SearchNavProvider } from "@/components/search/search-nav";
import { SearchSummary } from "@/components/search/search-summary";
import { SortControl } from "@/components/search/sort-control";
import { can } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/session";
import { isWeakMatch } from "@/lib/search-ui/coverage";
import { PAGE_SIZE, parseSearchState } from "@/lib/search-ui/params";
import { runSearch } from "@/lib/search-ui/run";
import { listTags } from "@/lib/tags/queries";

export const metadata: Metadata = { title: "Search" };

export default async function SearchPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const user = await requireUser();
  const { state, invalid } = parseSearchState(await searchParams);
  const tags = await listTags(user);
  const response = await runSearch(user, { ...state, limit: PAGE_SIZE });
  const tagInfo = Object.fromEntries(tags.map((t) => [t.slug, { name: t.name, kind: t.kind }]));
  const asked = response.corrected ?? state.q;
  const approvedCount = response.facets.status.find((s) => s.status === "approved")?.count ?? 0;
  // Nothing usable found: the request comes first. Only partly matching results: they come first (the
  // right page is often among them) and the request follows them, still in full.
  const missingReason = !state.q
    ? null
    : response.total === 0
      ? `No technique matches “${state.q}”${state.tag.length || state.status.length ? " with these filters" : ""}.`
      : approvedCount === 0
        ? `Nothing approved matches “${state.q}” — only drafts or retired techniques.`
        : null;
  const weakReason =
    state.q && !missingReason && isWeakMatch(asked, response.results) ? `Nothing here matches all of “${state.q}”; the results above match only some of its words.` : null;
  return (
    <SearchNavProvider>
      <div className="space-y-5">
        <h1 className="text-2xl font-semibold">Search</h1>
        <SearchBox key={state.q} state={state} userId={user.id} />
        {can(user, "still:check") ? <FrameDrop compact /> : null}
        {invalid.length ? (
          <p role="alert" className="text-sm text-warn">
            Parts of this address were not understood and were left out: {invalid.join(", ")}.
          </p>
        ) : null}
        <div className="grid gap-6 md:grid-cols-[14rem_minmax(0,1fr)]">
          <aside aria-label="Filters">
            <FacetPanel state={state} facets={response.facets} tagInfo={tagInfo} />
          </aside>
          <section aria-labelledby="results-title" className="space-y-4">
            <div className="flex flex-wrap items-center gap-3">
              <SearchSummary state={state} total={response.total} corrected={response.corrected} denials={response.denials} tookMs={response.tookMs} />
              <div className="ml-auto">
                <SortControl state={state} />
              </div>
            </div>
            {missingReason ? <RequestOffer key={`offer-${state.q}`} query={state.q} prominent reason={missingReason} /> : null}
            <PendingRegion>
              <ResultList state={state} response={response} />
            </PendingRegion>
            {weakReason ? <RequestOffer key={`weak-${state.q}`} query={state.q} prominent reason={weakReason} /> : null}
            {state.q && !missingReason && !weakReason ? <RequestOffer key={`more-${state.q}`} query={state.q} prominent={false} /> : null}
          </section>
        </div>
      </div>
    </SearchNavProvider>
  );
}
