import type { Metadata } from "next";
import Link from "next/link";
import { EmptyState } from "@/components/ui/empty-state";
import { requirePagePermission } from "@/lib/api/page-guards";
import { requireUser } from "@/lib/auth/session";
import { listReviewQueue } from "@/lib/techniques/queries";
import { formatDateTime } from "@/lib/utils";

export const metadata: Metadata = { title: "Review" };

export default async function ReviewPage() {
  const user = await requireUser();
  requirePagePermission(user, "technique:review");
  const queue = await listReviewQueue(user);
  return (
    <div className="space-y-4">
      <h1 className="text-2xl font-semibold">Waiting for review</h1>
      {queue.length ? (
        <ul className="divide-y divide-line rounded-lg border border-line bg-surface">
          {queue.map((item) => (
            <li key={`${item.slug}-${item.revision}`} className="flex flex-wrap items-center gap-2 px-4 py-3 text-sm">
              <Link href={`/techniques/${item.slug}/review`} className="font-medium hover:text-accent">
                {item.title}
              </Link>
              <span className="text-muted">
                revision {item.revision} · {item.isEdit ? "edit of an approved technique" : "new technique"} · by {item.author?.name ?? "someone"} · {formatDateTime(item.submittedAt)}
              </span>
              <Link href={`/techniques/${item.slug}/review`} className="ml-auto text-accent underline underline-offset-2" aria-label={`Review the changes to ${item.title}`}>
                Review the changes
              </Link>
            </li>
          ))}
        </ul>
      ) : (
        <EmptyState title="Nothing is waiting. Well done." />
      )}
    </div>
  );
}
