/**
 * The page sets written apart from the engine and never tuned on, each with the query sets written
 * for it. bench/search.ts, bench/search-quality.ts (`--unseen`) and bench/search-live.ts all read this
 * list, so a new set is added here once. Held out whole: benches print numbers only, never misses.
 */
import type { SearchDocument } from "@/lib/search/types";
import type { QualityQuery } from "./queries";
import { UNSEEN_PAGES } from "./unseen-pages";
import { UNSEEN_PAGES_SECOND } from "./unseen-pages-second";
import { UNSEEN_PAGES_SECOND_QUERIES } from "./unseen-pages-second-queries";
import { UNSEEN_PAGES_THIRD } from "./unseen-pages-third";
import { UNSEEN_PAGES_THIRD_QUERIES } from "./unseen-pages-third-queries";
import { UNSEEN_PAGES_FOURTH } from "./unseen-pages-fourth";
import { UNSEEN_PAGES_FOURTH_QUERIES } from "./unseen-pages-fourth-queries";
import { UNSEEN_QUERIES } from "./unseen-queries";
import { UNSEEN_QUERIES_SECOND } from "./unseen-queries-second";
import { UNSEEN_QUERIES_THIRD } from "./unseen-queries-third";

/** One writer's queries over a set's pages; `writer` says who wrote them and from what. */
export type UnseenWriter = { writer: string; queries: QualityQuery[] };
export type UnseenSet = { name: string; pages: SearchDocument[]; writers: UnseenWriter[] };

export const UNSEEN_SETS: readonly UnseenSet[] = [
  {
    name: "unseen pages (written apart on 2026-12-04)",
    pages: UNSEEN_PAGES,
    writers: [
      { writer: "the pages' writer", queries: UNSEEN_QUERIES },
      { writer: "a second writer, from titles and summaries only", queries: UNSEEN_QUERIES_SECOND },
      { writer: "a third writer, from titles and summaries only", queries: UNSEEN_QUERIES_THIRD },
    ],
  },
  {
    name: "second unseen pages (written apart on 2026-12-05)",
    pages: UNSEEN_PAGES_SECOND,
    writers: [{ writer: "a writer who saw only the pages' titles and summaries", queries: UNSEEN_PAGES_SECOND_QUERIES }],
  },
  {
    // Written after the engine's last change of 2026-12-05 morning, to measure it afresh; in the problem
    // areas the demo's own pages cover, as an outside checker's pages would be.
    name: "third unseen pages (written apart on 2026-12-05)",
    pages: UNSEEN_PAGES_THIRD,
    writers: [{ writer: "a writer who saw only the pages' titles and summaries", queries: UNSEEN_PAGES_THIRD_QUERIES }],
  },
  {
    // Written after the engine's last change of 2026-12-05 night, to measure it afresh; lens and camera
    // problems (the areas issue 16 added to the demo), in look-alike groups.
    name: "fourth unseen pages (written apart on 2026-12-06)",
    pages: UNSEEN_PAGES_FOURTH,
    writers: [{ writer: "a writer who saw only the pages' titles and summaries", queries: UNSEEN_PAGES_FOURTH_QUERIES }],
  },
];
