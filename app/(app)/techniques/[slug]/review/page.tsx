import type { Metadata } from "next";
import Link from "next/link";
import { redirect } from "next/navigation";
import { DiffView } from "@/components/techniques/diff-view";
import { ReviewActions } from "@/components/techniques/review-actions";
import { EmptyState } from "@/components/ui/empty-state";
import { loadOrNotFound, requirePagePermission } from "@/lib/api/page-guards";
import { requireUser } from "@/lib/auth/session";
import { revisionDiff } from "@/lib/techniques/history";
import { getReviewItem } from "@/lib/techniques/queries";
import { formatDateTime } from "@/lib/utils";

export const metadata: Metadata = { title: "Review" };

/** A lead reviews a waiting revision here: what changed against the approved revision, then the decision. */
export default async function ReviewTechniquePage({ params }: { params: Promise<{ slug: string }> }) {
  const user = await requireUser();
  requirePagePermission(user, "technique:review");
  const { slug } = await params;
  const item = await loadOrNotFound(() => getReviewItem(user, slug));
  if (item.slug !== slug) redirect(`/techniques/${item.slug}/review`);
  const { pending } = item;
  const diff = await revisionDiff(user, item.slug, item.compareWith, pending.number);
  const against =
    item.approvedRevision !== null
      ? `approved revision ${item.approvedRevision}`
      : item.compareWith
        ? `revision ${item.compareWith}, which was sent back`
        : "nothing: it is a new technique, so everything in it is new";
  return (
    <div className="space-y-5">
      <nav aria-label="Breadcrumb" className="text-sm text-muted">
        <Link href="/review" className="hover:text-ink">
          Waiting for review
        </Link>{" "}
        /{" "}
        <Link href={`/techniques/${item.slug}`} className="hover:text-ink">
          {item.title}
        </Link>
      </nav>
      <header className="space-y-1">
        <h1 className="text-2xl font-semibold">Review: {item.title}</h1>
        <p className="text-sm text-muted">
          Revision {pending.number} by {pending.author?.name ?? "someone"}, saved {formatDateTime(pending.createdAt)} ·{" "}
          {item.approvedRevision !== null ? "an edit of an approved technique" : "a new technique"}
        </p>
      </header>
      {item.isWaiting ? (
        <>
          {pending.changeNote ? (
            <blockquote className="rounded border-l-4 border-line bg-surface-2 px-3 py-2 text-sm">
              <span className="block text-xs text-muted">What changed, and why</span>
              {pending.changeNote}
            </blockquote>
          ) : null}
          <div className="flex flex-wrap items-center gap-2">
            <ReviewActions slug={item.slug} revision={pending.number} />
            <Link href={`/techniques/${item.slug}`} className="text-sm text-accent underline underline-offset-2">
              Read revision {pending.number} as a page
            </Link>
          </div>
          <section aria-labelledby="changes-title" className="space-y-2">
            <h2 id="changes-title" className="font-semibold">
              Revision {pending.number} compared with {against}
            </h2>
            <DiffView fields={diff.fields} pairs={diff.pairs} />
          </section>
        </>
      ) : (
        <EmptyState title="Nothing of this technique is waiting for review.">
          Revision {pending.number} is{" "}
          {pending.state === "approved" ? "approved" : pending.state === "returned" ? "sent back to its author" : "a draft nobody has submitted yet"}.{" "}
          <Link href={`/techniques/${item.slug}/history`} className="text-accent underline underline-offset-2">
            See its history
          </Link>
        </EmptyState>
      )}
    </div>
  );
}
