import Link from "next/link";
import { HouseMethodBadge, StatusBadge } from "@/components/techniques/status-badge";
import { TagChips } from "@/components/techniques/tag-chips";
import { EmptyState } from "@/components/ui/empty-state";
import type { TechniqueListItem } from "@/lib/techniques/schemas";
import { formatDate } from "@/lib/utils";

export function TechniqueList({ items, empty, highlightTag }: { items: TechniqueListItem[]; empty: string; highlightTag?: string }) {
  if (!items.length) return <EmptyState title={empty} />;
  return (
    <ul className="divide-y divide-line rounded-lg border border-line bg-surface">
      {items.map((t) => (
        <li key={t.slug} className="space-y-1.5 px-4 py-3">
          <div className="flex flex-wrap items-center gap-2">
            <Link href={`/techniques/${t.slug}`} className="font-medium hover:text-accent">
              {t.title}
            </Link>
            <StatusBadge status={t.status} />
            {highlightTag && t.isHouseMethodFor.includes(highlightTag) ? <HouseMethodBadge /> : null}
            {t.hasPendingRevision ? <span className="text-xs text-warn">edit waiting for review</span> : null}
            <span className="ml-auto text-xs text-muted">updated {formatDate(t.updatedAt)}</span>
          </div>
          <p className="text-sm text-muted">{t.summary}</p>
          <TagChips tags={t.tags} />
        </li>
      ))}
    </ul>
  );
}
