import type { Metadata } from "next";
import Link from "next/link";
import { AuditFilters } from "@/components/audit/audit-filters";
import { AuditSentence } from "@/components/audit/audit-sentence";
import { EmptyState } from "@/components/ui/empty-state";
import { requirePagePermission } from "@/lib/api/page-guards";
import { listAudit, listAuditActors } from "@/lib/audit/queries";
import { auditFilterSchema, type AuditFilterInput } from "@/lib/audit/schemas";
import { requireUser } from "@/lib/auth/session";
import { formatDateTime } from "@/lib/utils";

export const metadata: Metadata = { title: "Audit log" };
const PAGE_SIZE = 50;

type Search = Record<string, string | string[] | undefined>;

export default async function AuditPage({ searchParams }: { searchParams: Promise<Search> }) {
  const user = await requireUser();
  requirePagePermission(user, "audit:read");
  const sp = await searchParams;
  const one = (k: string) => (typeof sp[k] === "string" ? sp[k] : undefined);
  const parsed = auditFilterSchema.safeParse({ person: one("person"), action: one("action"), from: one("from"), to: one("to") });
  const filter: AuditFilterInput = parsed.success ? parsed.data : {};
  const page = Math.max(1, Math.floor(Number(one("page") ?? 1)) || 1);
  const [{ items, total }, people] = await Promise.all([
    listAudit(user, { actorId: filter.person, actions: filter.action ? [filter.action] : undefined, from: filter.from, to: filter.to, limit: PAGE_SIZE, offset: (page - 1) * PAGE_SIZE }),
    listAuditActors(user),
  ]);
  const pages = Math.max(1, Math.ceil(total / PAGE_SIZE));
  const hrefFor = (n: number) => {
    const q = new URLSearchParams(Object.entries(filter).filter((e): e is [string, string] => typeof e[1] === "string" && e[1] !== ""));
    if (n > 1) q.set("page", String(n));
    const s = q.toString();
    return s ? `/audit?${s}` : "/audit";
  };
  const isFiltered = Object.values(filter).some(Boolean);
  return (
    <div className="space-y-4">
      <div>
        <h1 className="text-2xl font-semibold">Audit log</h1>
        <p className="text-sm text-muted">Every change to people, techniques, tags, shows, shots and stills, newest first. Times are UTC.</p>
      </div>
      <AuditFilters people={people} value={filter} />
      {!parsed.success ? (
        <p role="alert" className="text-sm text-bad">
          {parsed.error.issues[0]?.message ?? "A filter was not understood."} Showing everything instead.
        </p>
      ) : null}
      <p className="text-sm text-muted" role="status">
        {total === 1 ? "1 entry" : `${total} entries`}
        {isFiltered ? " match" : ""}
        {total > PAGE_SIZE ? ` · page ${page} of ${pages}` : ""}
      </p>
      {items.length ? (
        <ol className="divide-y divide-line rounded-lg border border-line bg-surface text-sm" aria-label="Audit entries">
          {items.map((e) => (
            <li key={e.id} className="flex flex-wrap gap-x-4 gap-y-1 px-4 py-2" data-testid="audit-entry">
              <time dateTime={e.at} className="w-44 shrink-0 text-muted tabular-nums">
                {formatDateTime(e.at)}
              </time>
              <span className="min-w-0 flex-1">
                <AuditSentence parts={e.sentence} />
              </span>
            </li>
          ))}
        </ol>
      ) : (
        <EmptyState title={isFiltered ? "Nothing matches these filters." : "Nothing logged yet."} />
      )}
      {pages > 1 ? (
        <nav className="flex items-center gap-4 text-sm" aria-label="Pages of the audit log">
          {page > 1 ? (
            <Link href={hrefFor(page - 1)} className="text-accent underline underline-offset-2" rel="prev">
              ← Newer
            </Link>
          ) : null}
          <span className="text-muted">
            Page {page} of {pages}
          </span>
          {page < pages ? (
            <Link href={hrefFor(page + 1)} className="text-accent underline underline-offset-2" rel="next">
              Older →
            </Link>
          ) : null}
        </nav>
      ) : null}
    </div>
  );
}
