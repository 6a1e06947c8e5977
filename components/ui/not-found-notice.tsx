"use client";

// A client component only to keep page payloads small: the server sends a reference to it instead
// of its whole element tree, and Next.js sends the not-found and forbidden pages' trees with every
// page (issue 19). It has no state; its markup is still rendered on the server.

import Link from "next/link";

/** The one "nothing here" page, for addresses that do not exist and for what a person may not see (answered with 404). */
export function NotFoundNotice() {
  return (
    <div className="mx-auto flex max-w-lg flex-col items-center gap-3 py-10 text-center" data-testid="not-found">
      <h1 className="text-2xl font-semibold">Nothing here</h1>
      <p className="text-muted">This address shows nothing you can see. It may have moved, been mistyped, or never existed.</p>
      <p className="text-sm text-muted">
        Try the{" "}
        <Link href="/search" className="text-accent underline underline-offset-2">
          search
        </Link>
        , the{" "}
        <Link href="/problems" className="text-accent underline underline-offset-2">
          list of problems
        </Link>{" "}
        or the{" "}
        <Link href="/shows" className="text-accent underline underline-offset-2">
          shows
        </Link>
        .
      </p>
      <Link href="/" className="text-accent underline underline-offset-2">
        Back to the start page
      </Link>
    </div>
  );
}
