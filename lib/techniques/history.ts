import "server-only";
import type { SessionUser } from "@/lib/auth/roles";
import { diffRevisions, type FieldDiff } from "@/lib/techniques/diff";
import { loadTagMap } from "@/lib/tags/queries";
import { getRevisionsByNumber } from "@/lib/techniques/queries";

type RevisionDiffResponse = { slug: string; from: number; to: number; fields: FieldDiff[] };

/** Field-by-field word diff of two revisions the person may see. */
export async function revisionDiff(user: SessionUser, slug: string, from: number, to: number): Promise<RevisionDiffResponse> {
  const [a, b] = await getRevisionsByNumber(user, slug, [from, to]);
  const tagMap = await loadTagMap();
  const snapshot = (r: NonNullable<typeof a>) => ({
    title: r.title,
    summary: r.summary,
    aliases: r.aliases,
    tags: r.tagIds.map((id) => tagMap.get(id)?.name ?? "(removed tag)"),
    bodyText: r.bodyText,
    recipe: r.recipe,
  });
  return { slug, from, to, fields: diffRevisions(snapshot(a!), snapshot(b!)) };
}
