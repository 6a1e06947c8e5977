import type { Metadata } from "next";
import Link from "next/link";
import { Card, CardTitle } from "@/components/ui/card";
import { EmptyState } from "@/components/ui/empty-state";
import { TagManager } from "@/components/tags/tag-manager";
import { can } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/session";
import { listTags } from "@/lib/tags/queries";

export const metadata: Metadata = { title: "Problems" };

export default async function ProblemsPage() {
  const user = await requireUser();
  const tags = await listTags(user);
  const groups = [
    { kind: "problem" as const, title: "By problem in the plate" },
    { kind: "plate" as const, title: "By kind of plate" },
  ];
  return (
    <div className="space-y-6">
      <h1 className="text-2xl font-semibold">Browse by problem</h1>
      {groups.map((g) => {
        const list = tags.filter((t) => t.kind === g.kind);
        return (
          <Card key={g.kind}>
            <CardTitle>{g.title}</CardTitle>
            {list.length ? (
              <ul className="grid gap-2 sm:grid-cols-2 lg:grid-cols-3">
                {list.map((t) => (
                  <li key={t.slug}>
                    <Link href={`/problems/${t.slug}`} className="block rounded border border-line px-3 py-2 hover:border-accent">
                      <span className="font-medium">{t.name}</span>
                      {t.description ? <span className="block text-xs text-muted">{t.description}</span> : null}
                    </Link>
                  </li>
                ))}
              </ul>
            ) : (
              <EmptyState title="No tags yet." />
            )}
          </Card>
        );
      })}
      {can(user, "tag:manage") ? <TagManager tags={tags.map(({ id: _id, ...t }) => t)} /> : null}
    </div>
  );
}
