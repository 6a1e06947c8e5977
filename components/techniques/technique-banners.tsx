import Link from "next/link";
import type { TechniqueResponse } from "@/lib/techniques/schemas";

/** What state the reader is looking at: retired, a pending edit, a returned draft. */
export function TechniqueBanners({ t }: { t: TechniqueResponse }) {
  return (
    <>
      {t.status === "retired" ? (
        <div role="note" className="rounded border border-bad/60 bg-bad/10 px-4 py-3 text-sm">
          <p className="font-medium">Retired{t.retiredAt ? ` on ${t.retiredAt.slice(0, 10)}` : ""}.</p>
          {t.supersededBy ? (
            <p>
              Use{" "}
              <Link href={`/techniques/${t.supersededBy.slug}`} className="font-medium text-accent underline">
                {t.supersededBy.title}
              </Link>{" "}
              instead.
            </p>
          ) : null}
          {t.retireNote ? <p className="mt-1 text-muted">{t.retireNote}</p> : null}
        </div>
      ) : null}
      {t.hasPendingRevision ? (
        <div role="note" className="rounded border border-warn/60 bg-warn/10 px-4 py-3 text-sm" data-testid="pending-banner">
          You are looking at revision {t.revision.number}, which is <strong>{t.revision.state === "in_review" ? "waiting for review" : t.revision.state === "returned" ? "sent back to its author" : "a draft"}</strong>. Readers still see approved revision {t.approvedRevision}.{" "}
          <Link href={`/techniques/${t.slug}/history?from=${t.approvedRevision}&to=${t.revision.number}`} className="underline">
            See what changed
          </Link>
        </div>
      ) : null}
      {t.revision.state === "returned" && t.revision.reviewNote ? (
        <div role="note" className="rounded border border-line bg-surface-2 px-4 py-3 text-sm">
          <p className="font-medium">Sent back by {t.revision.reviewedBy?.name ?? "a lead"}:</p>
          <p className="whitespace-pre-wrap">{t.revision.reviewNote}</p>
        </div>
      ) : null}
    </>
  );
}
