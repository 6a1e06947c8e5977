import type { Metadata } from "next";
import Link from "next/link";
import { TechniqueList } from "@/components/techniques/technique-list";
import { buttonClasses } from "@/components/ui/button";
import { can } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/session";
import { listTags } from "@/lib/tags/queries";
import { listTechniques } from "@/lib/techniques/queries";
import { STATUS_LABELS, TECHNIQUE_STATUSES, type TechniqueStatus } from "@/lib/techniques/schemas";
import { cn } from "@/lib/utils";

export const metadata: Metadata = { title: "Techniques" };

export default async function TechniquesPage({ searchParams }: { searchParams: Promise<{ status?: string; tag?: string }> }) {
  const user = await requireUser();
  const sp = await searchParams;
  const status = TECHNIQUE_STATUSES.includes(sp.status as TechniqueStatus) ? (sp.status as TechniqueStatus) : undefined;
  const [{ items, total }, tags] = await Promise.all([listTechniques(user, { status, tag: sp.tag, limit: 200 }), listTags(user)]);
  const statuses = can(user, "technique:read-working") ? TECHNIQUE_STATUSES : (["approved", "retired"] as const);
  return (
    <div className="space-y-5">
      <div className="flex flex-wrap items-center gap-3">
        <h1 className="text-2xl font-semibold">Techniques</h1>
        <span className="text-sm text-muted">{total} shown</span>
        {can(user, "technique:write") ? (
          <Link href="/techniques/new" className={buttonClasses("primary", "ml-auto")}>
            Write a technique
          </Link>
        ) : null}
      </div>
      <nav aria-label="Filter by status" className="flex flex-wrap gap-1.5 text-sm">
        <Link href="/techniques" className={cn("rounded px-2 py-1", !status ? "bg-surface-2 text-ink" : "text-muted hover:text-ink")}>
          All
        </Link>
        {statuses.map((s) => (
          <Link key={s} href={`/techniques?status=${s}`} className={cn("rounded px-2 py-1", status === s ? "bg-surface-2 text-ink" : "text-muted hover:text-ink")}>
            {STATUS_LABELS[s]}
          </Link>
        ))}
        {sp.tag ? <span className="px-2 py-1 text-muted">tag: {tags.find((t) => t.slug === sp.tag)?.name ?? sp.tag}</span> : null}
      </nav>
      <TechniqueList items={items} empty={status || sp.tag ? "No techniques match this filter." : "No techniques yet. Seniors write them; leads approve them."} />
    </div>
  );
}
