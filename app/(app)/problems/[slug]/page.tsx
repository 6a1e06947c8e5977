import type { Metadata } from "next";
import Link from "next/link";
import { TechniqueList } from "@/components/techniques/technique-list";
import { SubscribeButton } from "@/components/subscriptions/subscribe-button";
import { loadOrNotFound } from "@/lib/api/page-guards";
import { requireUser } from "@/lib/auth/session";
import { getTag } from "@/lib/tags/queries";
import { listTechniques } from "@/lib/techniques/queries";

export const metadata: Metadata = { title: "Problem" };

export default async function ProblemPage({ params }: { params: Promise<{ slug: string }> }) {
  const user = await requireUser();
  const { slug } = await params;
  const { tag } = await loadOrNotFound(() => getTag(user, slug));
  const { items } = await listTechniques(user, { tag: slug, limit: 200 });
  // The department's approved method first, then approved ones, then the rest; retired last.
  const rank = (t: (typeof items)[number]) => (t.isHouseMethodFor.includes(slug) ? 0 : t.status === "approved" ? 1 : t.status === "retired" ? 3 : 2);
  const sorted = [...items].sort((a, b) => rank(a) - rank(b) || a.title.localeCompare(b.title));
  return (
    <div className="space-y-4">
      <Link href="/problems" className="text-sm text-muted hover:text-ink">
        ← All problems
      </Link>
      <div className="flex flex-wrap items-center gap-3">
        <h1 className="text-2xl font-semibold">{tag.name}</h1>
        <span className="text-sm text-muted">{tag.kind === "problem" ? "problem" : "plate"}</span>
        <div className="ml-auto">
          <SubscribeButton target={{ kind: "tag", key: tag.slug }} />
        </div>
      </div>
      {tag.description ? <p className="text-muted">{tag.description}</p> : null}
      {tag.aliases.length ? <p className="text-xs text-muted">Also called: {tag.aliases.join(" · ")}</p> : null}
      <TechniqueList items={sorted} highlightTag={slug} empty="Nobody has written up a technique for this yet." />
    </div>
  );
}
