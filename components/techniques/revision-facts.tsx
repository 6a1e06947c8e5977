"use client";

// A client component only to keep the technique page's payload small: the server sends four values
// rather than the card's element tree (issue 19). Its markup is still rendered on the server.
import { Card, CardTitle } from "@/components/ui/card";

/** Which revision the reader sees, which one is approved and which is the newest, with its change note. */
export function RevisionFacts({ shown, approved, newest, changeNote }: { shown: number; approved: number | null; newest: number; changeNote: string | null }) {
  return (
    <Card>
      <CardTitle>Revision</CardTitle>
      <dl className="space-y-1 text-sm">
        <div className="flex justify-between gap-2">
          <dt className="text-muted">Shown</dt>
          <dd>{shown}</dd>
        </div>
        <div className="flex justify-between gap-2">
          <dt className="text-muted">Approved</dt>
          <dd>{approved ?? "—"}</dd>
        </div>
        <div className="flex justify-between gap-2">
          <dt className="text-muted">Newest</dt>
          <dd>{newest}</dd>
        </div>
      </dl>
      {changeNote ? <p className="mt-2 text-sm text-muted">“{changeNote}”</p> : null}
    </Card>
  );
}
