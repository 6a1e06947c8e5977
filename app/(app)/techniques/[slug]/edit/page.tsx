import type { Metadata } from "next";
import { redirect } from "next/navigation";
import { TechniqueForm } from "@/components/techniques/technique-form";
import { Refused } from "@/components/ui/refused";
import { loadOrNotFound } from "@/lib/api/page-guards";
import { can } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/session";
import { listTags } from "@/lib/tags/queries";
import { getTechnique } from "@/lib/techniques/queries";

export const metadata: Metadata = { title: "Edit technique" };

export default async function EditTechniquePage({ params }: { params: Promise<{ slug: string }> }) {
  const user = await requireUser();
  if (!can(user, "technique:write")) return <Refused what="Editing techniques" />;
  const { slug } = await params;
  const t = await loadOrNotFound(() => getTechnique(user, slug));
  if (t.renamedFrom) redirect(`/techniques/${t.slug}/edit`);
  const tags = (await listTags(user)).map(({ slug: s, name, kind }) => ({ slug: s, name, kind }));
  return (
    <div className="mx-auto max-w-4xl space-y-4">
      <h1 className="text-2xl font-semibold">Edit: {t.title}</h1>
      <p className="text-sm text-muted">Editing revision {t.latestRevision}. Saving makes revision {t.latestRevision + 1}.</p>
      <TechniqueForm
        mode="edit"
        slug={t.slug}
        baseRevision={t.latestRevision}
        isEditOfApproved={t.approvedRevision !== null}
        tags={tags}
        initial={{ title: t.title, summary: t.summary, aliases: t.aliases, tags: t.tags.map((x) => x.slug), body: t.body, recipe: t.recipe }}
      />
    </div>
  );
}
