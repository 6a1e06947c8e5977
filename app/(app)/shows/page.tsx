import type { Metadata } from "next";
import Link from "next/link";
import { NewShowForm } from "@/components/shots/show-forms";
import { Badge } from "@/components/ui/badge";
import { Card, CardTitle } from "@/components/ui/card";
import { DataTable } from "@/components/ui/data-table";
import { EmptyState } from "@/components/ui/empty-state";
import { can } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/session";
import { listShows } from "@/lib/shows/queries";
import { SHOW_KIND_LABELS, SHOW_STATE_LABELS } from "@/lib/shows/schemas";

export const metadata: Metadata = { title: "Shows" };

export default async function ShowsPage() {
  const user = await requireUser();
  const shows = await listShows(user);
  const canManage = can(user, "show:manage");
  return (
    <div className="space-y-5">
      <div className="flex flex-wrap items-center gap-3">
        <h1 className="text-2xl font-semibold">Shows</h1>
        <span className="text-sm text-muted">{shows.length} in all</span>
      </div>
      {shows.length ? (
        <DataTable
          data-testid="shows-table"
          head={
            <>
              <th className="py-1.5 pr-3 font-medium">Code</th>
              <th className="py-1.5 pr-3 font-medium">Name</th>
              <th className="py-1.5 pr-3 font-medium">Kind</th>
              <th className="py-1.5 pr-3 font-medium">State</th>
              <th className="py-1.5 text-right font-medium">Shots</th>
            </>
          }
        >
          {shows.map((s) => (
            <tr key={s.id} className="border-b border-line">
              <td className="py-1.5 pr-3">
                <Link href={`/shows/${s.code}`} className="font-mono font-medium hover:text-accent">
                  {s.code}
                </Link>
              </td>
              <td className="py-1.5 pr-3">
                <Link href={`/shows/${s.code}`} className="hover:text-accent">
                  {s.name}
                </Link>
              </td>
              <td className="py-1.5 pr-3">{SHOW_KIND_LABELS[s.kind]}</td>
              <td className="py-1.5 pr-3">
                <Badge tone={s.state === "active" ? "ok" : "neutral"}>{SHOW_STATE_LABELS[s.state]}</Badge>
              </td>
              <td className="py-1.5 text-right font-mono">{s.shotCount}</td>
            </tr>
          ))}
        </DataTable>
      ) : (
        <EmptyState title="No shows yet.">{canManage ? "Create the first one below, then import its shot list." : "Leads add shows and their shot lists."}</EmptyState>
      )}
      {canManage ? (
        <Card aria-labelledby="new-show-title">
          <CardTitle>
            <span id="new-show-title">New show</span>
          </CardTitle>
          <NewShowForm />
        </Card>
      ) : null}
    </div>
  );
}
