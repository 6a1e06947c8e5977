import "server-only";
import { asc, eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { houseMethods, tags } from "@/db/schema";
import { AppError } from "@/lib/api/errors";
import { assertCan } from "@/lib/auth/permissions";
import type { SessionUser } from "@/lib/auth/roles";
import type { TagRef } from "@/lib/techniques/schemas";

/** Every tag by id, for turning a revision's tag ids into references (callers have checked who reads). */
export async function loadTagMap(): Promise<Map<string, TagRef & { id: string }>> {
  const rows = await getDb().select({ id: tags.id, slug: tags.slug, name: tags.name, kind: tags.kind }).from(tags);
  return new Map(rows.map((t) => [t.id, t]));
}

export function tagRefs(tagIds: string[], tagMap: Map<string, TagRef & { id: string }>): TagRef[] {
  return tagIds
    .map((id) => tagMap.get(id))
    .filter((t): t is TagRef & { id: string } => Boolean(t))
    .map(({ slug, name, kind }) => ({ slug, name, kind }));
}

/** Every tag, problems first, by name. */
export async function listTags(actor: SessionUser): Promise<Array<TagRef & { id: string; description: string; aliases: string[] }>> {
  assertCan(actor, "technique:read");
  return getDb()
    .select({ id: tags.id, slug: tags.slug, name: tags.name, kind: tags.kind, description: tags.description, aliases: tags.aliases })
    .from(tags)
    .orderBy(asc(tags.kind), asc(tags.name));
}

/** A tag with the technique the department approved for it, if any; 404 when there is no such tag. */
export async function getTag(actor: SessionUser, slug: string) {
  assertCan(actor, "technique:read");
  const [tag] = await getDb().select().from(tags).where(eq(tags.slug, slug)).limit(1);
  if (!tag) throw new AppError("not_found", "No such tag.");
  const [house] = await getDb().select().from(houseMethods).where(eq(houseMethods.tagId, tag.id)).limit(1);
  return { tag, houseMethodTechniqueId: house?.techniqueId ?? null };
}
