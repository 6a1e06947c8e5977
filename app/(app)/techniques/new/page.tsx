import type { Metadata } from "next";
import { TechniqueForm } from "@/components/techniques/technique-form";
import { requirePagePermission } from "@/lib/api/page-guards";
import { requireUser } from "@/lib/auth/session";
import { emptyDocument } from "@/lib/techniques/document";
import { listTags } from "@/lib/tags/queries";

export const metadata: Metadata = { title: "Write a technique" };

export default async function NewTechniquePage({ searchParams }: { searchParams: Promise<{ request?: string; title?: string }> }) {
  const user = await requireUser();
  requirePagePermission(user, "technique:write");
  const sp = await searchParams;
  const tags = (await listTags(user)).map(({ slug, name, kind }) => ({ slug, name, kind }));
  const requestId = typeof sp.request === "string" && /^[0-9a-f-]{36}$/.test(sp.request) ? sp.request : undefined;
  return (
    <div className="mx-auto max-w-4xl space-y-4">
      <h1 className="text-2xl font-semibold">Write a technique</h1>
      <p className="text-sm text-muted">It starts as a draft only writers and leads can see. Submit it for review when it is ready.</p>
      <TechniqueForm
        mode="create"
        tags={tags}
        requestId={requestId}
        initial={{ title: typeof sp.title === "string" ? sp.title.slice(0, 140) : "", summary: "", aliases: [], tags: [], body: emptyDocument(), recipe: [] }}
      />
    </div>
  );
}
