import type { Metadata } from "next";
import Link from "next/link";
import { DiffView } from "@/components/techniques/diff-view";
import { RestoreButton } from "@/components/techniques/restore-button";
import { Badge } from "@/components/ui/badge";
import { buttonClasses } from "@/components/ui/button";
import { loadOrNotFound } from "@/lib/api/page-guards";
import { can } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/session";
import { revisionDiff } from "@/lib/techniques/history";
import { listRevisions } from "@/lib/techniques/queries";
import { formatDateTime } from "@/lib/utils";

export const metadata: Metadata = { title: "History" };

const STATE_LABEL = { draft: "draft", in_review: "waiting for review", approved: "approved", returned: "sent back" } as const;

export default async function HistoryPage({ params, searchParams }: { params: Promise<{ slug: string }>; searchParams: Promise<{ from?: string; to?: string }> }) {
  const user = await requireUser();
  const { slug } = await params;
  const sp = await searchParams;
  const history = await loadOrNotFound(() => listRevisions(user, slug));
  const numbers = history.items.map((r) => r.number);
  const latest = numbers[0] ?? 1;
  // By default: the newest against what readers see (the approved revision), else against the one before it.
  const approved = history.items.find((r) => r.state === "approved")?.number;
  const to = Number(sp.to ?? latest);
  const from = Number(sp.from ?? (approved !== undefined && approved !== to ? approved : (numbers.find((n) => n < to) ?? to)));
  const canCompare = numbers.length > 1 && from !== to && numbers.includes(from) && numbers.includes(to);
  const diff = canCompare ? await loadOrNotFound(() => revisionDiff(user, slug, Math.min(from, to), Math.max(from, to))) : null;
  return (
    <div className="space-y-6">
      <div>
        <Link href={`/techniques/${history.slug}`} className="text-sm text-muted hover:text-ink">
          ← {history.title}
        </Link>
        <h1 className="text-2xl font-semibold">History</h1>
      </div>
      {numbers.length < 2 ? <p className="text-sm text-muted">There is one revision so far: nothing to compare yet.</p> : null}
      {numbers.length > 1 ? (
        <form className="flex flex-wrap items-end gap-2 text-sm" method="get">
          <label className="space-y-1">
            <span className="block text-muted">From</span>
            <select name="from" defaultValue={from} className="rounded border border-line bg-surface-2 px-2 py-1">
              {numbers.map((n) => (
                <option key={n}>{n}</option>
              ))}
            </select>
          </label>
          <label className="space-y-1">
            <span className="block text-muted">To</span>
            <select name="to" defaultValue={to} className="rounded border border-line bg-surface-2 px-2 py-1">
              {numbers.map((n) => (
                <option key={n}>{n}</option>
              ))}
            </select>
          </label>
          <button className={buttonClasses("secondary")}>Compare</button>
        </form>
      ) : null}
      {numbers.length > 1 && from === to ? <p className="text-sm text-muted">Pick two different revisions to see what changed.</p> : null}
      {diff ? (
        <section aria-label={`Changes from revision ${diff.from} to ${diff.to}`}>
          <h2 className="mb-2 font-semibold">
            Revision {diff.from} → {diff.to}
          </h2>
          <DiffView fields={diff.fields} pairs={diff.pairs} />
        </section>
      ) : null}
      <ol className="divide-y divide-line rounded-lg border border-line bg-surface">
        {history.items.map((r) => (
          <li key={r.number} className="flex flex-wrap items-center gap-2 px-4 py-3 text-sm">
            <span className="font-medium">Revision {r.number}</span>
            <Badge tone={r.state === "approved" ? "ok" : r.state === "in_review" ? "warn" : "neutral"}>{STATE_LABEL[r.state]}</Badge>
            <span className="text-muted">
              {r.author?.name ?? "someone"} · {formatDateTime(r.createdAt)}
            </span>
            {r.reviewedBy ? (
              <span className="text-muted">
                · {r.state === "approved" ? "approved" : "reviewed"} by {r.reviewedBy.name}
                {r.reviewedAt ? ` ${formatDateTime(r.reviewedAt)}` : ""}
              </span>
            ) : null}
            <span className="w-full text-muted">“{r.changeNote}”</span>
            {r.reviewNote ? <span className="w-full text-xs">Review note: {r.reviewNote}</span> : null}
            {can(user, "technique:write") && r.number !== latest ? <RestoreButton slug={history.slug} number={r.number} latest={latest} /> : null}
          </li>
        ))}
      </ol>
    </div>
  );
}
