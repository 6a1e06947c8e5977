import type { Metadata } from "next";
import Link from "next/link";
import { DataTable } from "@/components/ui/data-table";
import { EmptyState } from "@/components/ui/empty-state";
import { listAudit } from "@/lib/audit/queries";
import { requirePagePermission } from "@/lib/api/page-guards";
import { requireUser } from "@/lib/auth/session";
import { formatDateTime } from "@/lib/utils";

export const metadata: Metadata = { title: "Audit log" };
const PAGE = 100;

export default async function AuditPage({ searchParams }: { searchParams: Promise<{ page?: string }> }) {
  const user = await requireUser();
  requirePagePermission(user, "audit:read");
  const page = Math.max(1, Number((await searchParams).page ?? 1) || 1);
  const { items, total } = await listAudit(user, { limit: PAGE, offset: (page - 1) * PAGE });
  return (
    <div className="space-y-4">
      <h1 className="text-2xl font-semibold">Audit log</h1>
      <p className="text-sm text-muted">{total} entries · every change to people, techniques, tags, shots and stills.</p>
      {items.length ? (
        <DataTable
          head={
            <>
              <th className="py-2 font-medium">When</th>
              <th className="font-medium">Who</th>
              <th className="font-medium">What</th>
              <th className="font-medium">On</th>
              <th className="font-medium">Details</th>
            </>
          }
        >
          {items.map((e) => (
            <tr key={e.id} className="border-b border-line align-top">
              <td className="py-1.5 pr-2 whitespace-nowrap">{formatDateTime(e.at)}</td>
              <td className="pr-2">{e.actor?.name ?? "system"}</td>
              <td className="pr-2 font-mono text-xs">{e.action}</td>
              <td className="pr-2 text-xs text-muted">
                {e.targetType} {e.targetId?.slice(0, 8)}
              </td>
              <td className="font-mono text-xs break-all text-muted">{JSON.stringify(e.detail)}</td>
            </tr>
          ))}
        </DataTable>
      ) : (
        <EmptyState title="Nothing logged yet." />
      )}
      <nav className="flex gap-3 text-sm" aria-label="Pages">
        {page > 1 ? <Link href={`/audit?page=${page - 1}`}>← Newer</Link> : null}
        {page * PAGE < total ? <Link href={`/audit?page=${page + 1}`}>Older →</Link> : null}
      </nav>
    </div>
  );
}
