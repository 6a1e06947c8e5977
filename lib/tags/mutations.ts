import "server-only";
import { and, eq, sql } from "drizzle-orm";
import { getDb } from "@/db/client";
import { houseMethods, revisions, subscriptions, tags, type Tag } from "@/db/schema";
import { AppError } from "@/lib/api/errors";
import { assertCan } from "@/lib/auth/permissions";
import type { SessionUser } from "@/lib/auth/roles";
import { writeAudit } from "@/lib/audit/log";
import { slugify } from "@/lib/techniques/slug";
import { rebuildSearchFromDb } from "@/lib/techniques/search-sync";
import type { TagInput, TagUpdateInput } from "@/lib/tags/schemas";

export async function createTag(actor: SessionUser, input: TagInput): Promise<Tag> {
  assertCan(actor, "tag:manage");
  const slug = slugify(input.name);
  const tag = await getDb().transaction(async (tx) => {
    const [existing] = await tx.select({ id: tags.id }).from(tags).where(eq(tags.slug, slug));
    if (existing) throw new AppError("conflict", "A tag with this name exists already.", { fields: { name: "Already exists." } });
    const [row] = await tx.insert(tags).values({ ...input, slug }).returning();
    await writeAudit(tx, { actorId: actor.id, action: "tag.create", targetType: "tag", targetId: row!.id, detail: { slug, kind: input.kind } });
    return row!;
  });
  return tag;
}

/** Renames (the slug stays, so links and subscriptions keep working), re-describes or re-aliases a tag. */
export async function updateTag(actor: SessionUser, slug: string, input: TagUpdateInput): Promise<Tag> {
  assertCan(actor, "tag:manage");
  const tag = await getDb().transaction(async (tx) => {
    const [row] = await tx
      .update(tags)
      .set({ ...input })
      .where(eq(tags.slug, slug))
      .returning();
    if (!row) throw new AppError("not_found", "No such tag.");
    await writeAudit(tx, { actorId: actor.id, action: "tag.update", targetType: "tag", targetId: row.id, detail: { ...input } });
    return row;
  });
  await rebuildSearchFromDb();
  return tag;
}

/** Merges one tag into another of the same kind: techniques, the approved method and subscriptions move over. */
export async function mergeTags(actor: SessionUser, fromSlug: string, intoSlug: string): Promise<Tag> {
  assertCan(actor, "tag:manage");
  if (fromSlug === intoSlug) throw new AppError("validation_failed", "Choose a different tag to merge into.", { fields: { into: "Same tag." } });
  const merged = await getDb().transaction(async (tx) => {
    const [from] = await tx.select().from(tags).where(eq(tags.slug, fromSlug));
    const [into] = await tx.select().from(tags).where(eq(tags.slug, intoSlug));
    if (!from || !into) throw new AppError("not_found", "No such tag.");
    if (from.kind !== into.kind) throw new AppError("validation_failed", "Only tags of the same kind can be merged.", { fields: { into: "Different kind." } });
    // Replace the id inside every revision's tag list, without duplicating it where both were present.
    await tx
      .update(revisions)
      .set({ tagIds: sql`array(select distinct unnest(array_replace(${revisions.tagIds}, ${from.id}::uuid, ${into.id}::uuid)))` })
      .where(sql`${from.id}::uuid = any(${revisions.tagIds})`);
    const [fromHouse] = await tx.select().from(houseMethods).where(eq(houseMethods.tagId, from.id));
    const [intoHouse] = await tx.select().from(houseMethods).where(eq(houseMethods.tagId, into.id));
    if (fromHouse && !intoHouse) await tx.insert(houseMethods).values({ tagId: into.id, techniqueId: fromHouse.techniqueId, setById: actor.id });
    await tx
      .update(subscriptions)
      .set({ key: into.slug })
      .where(
        and(
          eq(subscriptions.kind, "tag"),
          eq(subscriptions.key, from.slug),
          sql`not exists (select 1 from ${subscriptions} s2 where s2.user_id = ${subscriptions.userId} and s2.kind = 'tag' and s2.key = ${into.slug})`,
        ),
      );
    await tx.delete(subscriptions).where(and(eq(subscriptions.kind, "tag"), eq(subscriptions.key, from.slug)));
    const aliases = [...new Set([...into.aliases, from.name, ...from.aliases])];
    const [updated] = await tx.update(tags).set({ aliases }).where(eq(tags.id, into.id)).returning();
    await tx.delete(tags).where(eq(tags.id, from.id));
    await writeAudit(tx, { actorId: actor.id, action: "tag.merge", targetType: "tag", targetId: into.id, detail: { from: from.slug, into: into.slug } });
    return updated!;
  });
  await rebuildSearchFromDb();
  return merged;
}
