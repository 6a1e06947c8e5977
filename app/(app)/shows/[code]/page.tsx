import type { Metadata } from "next";
import Link from "next/link";
import { redirect } from "next/navigation";
import { ShowEditForm } from "@/components/shots/show-forms";
import { ShowImportPanel } from "@/components/shots/show-import-panel";
import { ShowShotsTable } from "@/components/shots/show-shots-table";
import { SubscribeButton } from "@/components/subscriptions/subscribe-button";
import { Badge } from "@/components/ui/badge";
import { buttonClasses } from "@/components/ui/button";
import { Card, CardTitle } from "@/components/ui/card";
import { loadOrNotFound } from "@/lib/api/page-guards";
import { can } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/session";
import { SHOTS_PAGE_SIZE } from "@/lib/shots/format";
import { listShots } from "@/lib/shots/queries";
import { getShow } from "@/lib/shows/queries";
import { paramValue } from "@/lib/shots/params";
import { SHOW_KIND_LABELS, SHOW_STATE_LABELS } from "@/lib/shows/schemas";

type Props = { params: Promise<{ code: string }> };

export async function generateMetadata({ params }: Props): Promise<Metadata> {
  return { title: paramValue((await params).code).toUpperCase() };
}

export default async function ShowPage({ params }: Props) {
  const user = await requireUser();
  const code = paramValue((await params).code);
  const show = await loadOrNotFound(() => getShow(user, code));
  // One address per show: codes are stored in capitals.
  if (show.code !== code) redirect(`/shows/${show.code}`);
  const shots = await listShots(user, show.code, { limit: SHOTS_PAGE_SIZE });
  // Counted by the same query as the table below, so the title and the table always agree.
  const shotCount = shots.total;
  const canManage = can(user, "show:manage");
  return (
    <div className="space-y-6">
      <Link href="/shows" className="text-sm text-muted hover:text-ink">
        ← All shows
      </Link>
      <header className="flex flex-wrap items-center gap-3">
        <h1 className="text-2xl font-semibold">
          <span className="font-mono">{show.code}</span> <span className="text-muted">·</span> {show.name}
        </h1>
        <Badge>{SHOW_KIND_LABELS[show.kind]}</Badge>
        <Badge tone={show.state === "active" ? "ok" : "neutral"}>{SHOW_STATE_LABELS[show.state]}</Badge>
        <div className="ml-auto">
          <SubscribeButton target={{ kind: "show", key: show.code }} />
        </div>
      </header>

      <Card aria-labelledby="shots-title">
        <CardTitle
          action={
            shotCount ? (
              <a href={`/api/shows/${show.code}/shots?format=csv`} className={buttonClasses("secondary")} download>
                Export CSV
              </a>
            ) : undefined
          }
        >
          <span id="shots-title">
            Shots <span className="font-normal text-muted">({shotCount})</span>
          </span>
        </CardTitle>
        <ShowShotsTable showCode={show.code} initial={shots} />
      </Card>

      {canManage ? (
        <>
          <Card aria-labelledby="import-title">
            <CardTitle>
              <span id="import-title">Import a shot list</span>
            </CardTitle>
            <p className="mb-3 text-sm text-muted">
              Shots are matched by code: new codes are added, known ones updated, and blank cells keep what is stored. Nothing is written until you
              have read the preview.
            </p>
            <ShowImportPanel showCode={show.code} />
          </Card>
          <Card aria-labelledby="edit-title">
            <CardTitle>
              <span id="edit-title">Edit show</span>
            </CardTitle>
            <ShowEditForm show={show} />
          </Card>
        </>
      ) : null}
    </div>
  );
}
