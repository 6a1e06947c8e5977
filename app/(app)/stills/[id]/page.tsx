import type { Metadata } from "next";
import Link from "next/link";
import { CheckPanel } from "@/components/plate-check/check-panel";
import { Badge } from "@/components/ui/badge";
import { loadOrNotFound } from "@/lib/api/page-guards";
import { uuidParam } from "@/lib/api/handler";
import { can } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/session";
import { checkDtoFor } from "@/lib/plate-check/queries";
import { getStillForRead } from "@/lib/stills/queries";
import { listTags } from "@/lib/tags/queries";
import { notFound } from "next/navigation";

export const metadata: Metadata = { title: "Still" };

type Props = { params: Promise<{ id: string }> };

/** A still's own page: what it is, and the plate check of it (run on first visit). */
export default async function StillPage({ params }: Props) {
  const user = await requireUser();
  const id = uuidParam.safeParse((await params).id);
  if (!id.success) notFound();
  const still = await loadOrNotFound(() => getStillForRead(user, id.data));
  const [check, tags] = await Promise.all([can(user, "still:check") ? checkDtoFor(user, still) : null, listTags(user)]);
  const tagNames = Object.fromEntries(tags.map((t) => [t.slug, t.name]));
  return (
    <div className="space-y-6">
      <div className="space-y-1">
        <p className="text-sm text-muted">
          <Link href="/check" className="hover:text-accent">
            Plate check
          </Link>
        </p>
        <h1 className="text-2xl font-semibold">{still.alt}</h1>
        <p className="flex flex-wrap items-center gap-2 text-sm text-muted">
          <span>
            {still.width}×{still.height}, {still.format.toUpperCase()} {still.bitDepth}-bit
          </span>
          {still.owner === "trial" ? <Badge>Private trial: only you see it</Badge> : null}
          {still.caption ? <span>{still.caption}</span> : null}
        </p>
      </div>
      {can(user, "still:check") ? (
        <CheckPanel stillId={still.id} alt={still.alt} initial={check} tagNames={tagNames} canPropose={can(user, "technique:write")} />
      ) : (
        <p className="text-sm text-muted">Your role cannot run the plate check.</p>
      )}
    </div>
  );
}
