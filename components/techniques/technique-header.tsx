import Link from "next/link";
import { HouseMethodBadge, StatusBadge } from "@/components/techniques/status-badge";
import { TagChips } from "@/components/techniques/tag-chips";
import type { TechniqueResponse } from "@/lib/techniques/schemas";
import { formatDate } from "@/lib/utils";

export function TechniqueHeader({ t }: { t: TechniqueResponse }) {
  return (
    <header className="space-y-2">
      <div className="flex flex-wrap items-center gap-2">
        <h1 className="text-2xl font-semibold">{t.title}</h1>
        <StatusBadge status={t.status} />
        {t.isHouseMethodFor.map((tag) => (
          <HouseMethodBadge key={tag.slug} tagName={tag.name} />
        ))}
      </div>
      <p className="text-muted">{t.summary}</p>
      {t.aliases.length ? <p className="text-xs text-muted">Also known as: {t.aliases.join(" · ")}</p> : null}
      <TagChips tags={t.tags} />
      <p className="text-xs text-muted">
        Written by {t.createdBy?.name ?? "someone who has left"}
        {t.approvedBy ? ` · approved by ${t.approvedBy.name}` : ""}
        {t.lastApprovedAt ? ` · last approved ${formatDate(t.lastApprovedAt)}` : " · not approved yet"} · revision {t.revision.number}
        {" · "}
        <Link href={`/techniques/${t.slug}/history`} className="underline underline-offset-2 hover:text-ink">
          history
        </Link>
      </p>
    </header>
  );
}
