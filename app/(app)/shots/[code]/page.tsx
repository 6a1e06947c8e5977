import type { Metadata } from "next";
import Link from "next/link";
import { redirect } from "next/navigation";
import { LogUseForm } from "@/components/shots/log-use-form";
import { ShotUses } from "@/components/shots/shot-uses";
import { Badge } from "@/components/ui/badge";
import { Card, CardTitle } from "@/components/ui/card";
import { loadOrNotFound } from "@/lib/api/page-guards";
import { can } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/session";
import { frameRange } from "@/lib/shots/format";
import { getShotWithUses } from "@/lib/shots/queries";
import { SHOT_STATE_LABELS } from "@/lib/shots/schemas";
import { paramValue } from "@/lib/shots/params";

type Props = { params: Promise<{ code: string }> };

export async function generateMetadata({ params }: Props): Promise<Metadata> {
  return { title: paramValue((await params).code).toUpperCase() };
}

export default async function ShotPage({ params }: Props) {
  const user = await requireUser();
  const code = paramValue((await params).code);
  const shot = await loadOrNotFound(() => getShotWithUses(user, code));
  // One address per shot: a code typed in lower case lands on the stored spelling.
  if (shot.code !== code) redirect(`/shots/${encodeURIComponent(shot.code)}`);
  const followUps = shot.uses.filter((u) => u.followUp).length;
  return (
    <div className="space-y-6">
      <nav aria-label="Breadcrumb" className="text-sm text-muted">
        <Link href="/shows" className="hover:text-ink">
          Shows
        </Link>{" "}
        /{" "}
        <Link href={`/shows/${shot.show.code}`} className="hover:text-ink">
          {shot.show.code} · {shot.show.name}
        </Link>
      </nav>
      <header className="flex flex-wrap items-center gap-3">
        <h1 className="font-mono text-2xl font-semibold">{shot.code}</h1>
        <Badge tone={shot.state === "cleaned" ? "ok" : shot.state === "on_hold" ? "warn" : shot.state === "in_prep" ? "accent" : "neutral"}>
          {SHOT_STATE_LABELS[shot.state]}
        </Badge>
        {followUps ? <Badge tone="warn">{followUps === 1 ? "1 use to follow up" : `${followUps} uses to follow up`}</Badge> : null}
      </header>

      <Card>
        <dl className="grid gap-3 text-sm sm:grid-cols-4">
          <div>
            <dt className="text-muted">Show</dt>
            <dd>
              <Link href={`/shows/${shot.show.code}`} className="hover:text-accent">
                {shot.show.name}
              </Link>
              {shot.show.state === "wrapped" ? <span className="text-muted"> (wrapped)</span> : null}
            </dd>
          </div>
          <div>
            <dt className="text-muted">Sequence</dt>
            <dd className="font-mono">{shot.sequence || "—"}</dd>
          </div>
          <div>
            <dt className="text-muted">Frames</dt>
            <dd className="font-mono">{frameRange(shot)}</dd>
          </div>
          <div>
            <dt className="text-muted">State</dt>
            <dd>{SHOT_STATE_LABELS[shot.state]}</dd>
          </div>
          <div className="sm:col-span-4">
            <dt className="text-muted">Description</dt>
            <dd className="whitespace-pre-line">{shot.description || "—"}</dd>
          </div>
        </dl>
      </Card>

      <Card aria-labelledby="uses-title">
        <CardTitle>
          <span id="uses-title">
            Techniques used on this shot <span className="font-normal text-muted">({shot.uses.length})</span>
          </span>
        </CardTitle>
        <ShotUses uses={shot.uses} />
        {can(user, "use:log") ? (
          <details className="mt-4 rounded border border-line p-3">
            <summary className="cursor-pointer text-sm font-medium">Log a use on this shot</summary>
            <LogUseForm shot={shot.code} />
          </details>
        ) : null}
      </Card>
    </div>
  );
}
