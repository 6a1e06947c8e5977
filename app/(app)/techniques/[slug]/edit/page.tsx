import type { Metadata } from "next";
import { redirect } from "next/navigation";
import { TechniqueForm } from "@/components/techniques/technique-form";
import { loadOrNotFound, requirePagePermission } from "@/lib/api/page-guards";
import { requireUser } from "@/lib/auth/session";
import { listStillsForTechnique } from "@/lib/stills/queries";
import { listTags } from "@/lib/tags/queries";
import { getTechnique } from "@/lib/techniques/queries";

export const metadata: Metadata = { title: "Edit technique" };

export default async function EditTechniquePage({ params }: { params: Promise<{ slug: string }> }) {
  const user = await requireUser();
  requirePagePermission(user, "technique:write");
  const { slug } = await params;
  const t = await loadOrNotFound(() => getTechnique(user, slug));
  if (t.renamedFrom) redirect(`/techniques/${t.slug}/edit`);
  const tags = (await listTags(user)).map(({ slug: s, name, kind }) => ({ slug: s, name, kind }));
  const stills = (await listStillsForTechnique(user, t.id)).map(({ id, alt, role }) => ({ id, alt, role }));
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
        stills={stills}
        initial={{ title: t.title, summary: t.summary, aliases: t.aliases, tags: t.tags.map((x) => x.slug), body: t.body, recipe: t.recipe }}
      />
    </div>
  );
}
