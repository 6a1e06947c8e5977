import "server-only";
import { eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { thesaurusEntries } from "@/db/schema";
import { AppError } from "@/lib/api/errors";
import { writeAudit } from "@/lib/audit/log";
import { assertCan } from "@/lib/auth/permissions";
import { isUuid } from "@/lib/utils";
import type { SessionUser } from "@/lib/auth/roles";
import { reloadSearchThesaurus } from "@/lib/techniques/search-sync";
import { getThesaurusEntry } from "@/lib/thesaurus/queries";
import type { ThesaurusEntryDto, ThesaurusEntryInput } from "@/lib/thesaurus/schemas";

function columns(input: ThesaurusEntryInput) {
  return { kind: input.kind, broader: input.kind === "narrower" ? input.broader : null, terms: input.terms, note: input.note };
}

export async function createThesaurusEntry(actor: SessionUser, input: ThesaurusEntryInput): Promise<ThesaurusEntryDto> {
  assertCan(actor, "thesaurus:manage");
  const id = await getDb().transaction(async (tx) => {
    const [row] = await tx
      .insert(thesaurusEntries)
      .values({ ...columns(input), updatedById: actor.id })
      .returning({ id: thesaurusEntries.id });
    await writeAudit(tx, { actorId: actor.id, action: "thesaurus.create", targetType: "thesaurus_entry", targetId: row!.id, detail: columns(input) });
    return row!.id;
  });
  await reloadSearchThesaurus();
  return getThesaurusEntry(actor, id);
}

export async function updateThesaurusEntry(actor: SessionUser, id: string, input: ThesaurusEntryInput): Promise<ThesaurusEntryDto> {
  assertCan(actor, "thesaurus:manage");
  if (!isUuid(id)) throw new AppError("not_found", "No such thesaurus entry.");
  await getDb().transaction(async (tx) => {
    const [before] = await tx.select().from(thesaurusEntries).where(eq(thesaurusEntries.id, id));
    if (!before) throw new AppError("not_found", "No such thesaurus entry.");
    await tx
      .update(thesaurusEntries)
      .set({ ...columns(input), updatedAt: new Date(), updatedById: actor.id })
      .where(eq(thesaurusEntries.id, id));
    await writeAudit(tx, {
      actorId: actor.id,
      action: "thesaurus.update",
      targetType: "thesaurus_entry",
      targetId: id,
      detail: { before: { kind: before.kind, broader: before.broader, terms: before.terms, note: before.note }, after: columns(input) },
    });
  });
  await reloadSearchThesaurus();
  return getThesaurusEntry(actor, id);
}

export async function deleteThesaurusEntry(actor: SessionUser, id: string): Promise<void> {
  assertCan(actor, "thesaurus:manage");
  if (!isUuid(id)) throw new AppError("not_found", "No such thesaurus entry.");
  await getDb().transaction(async (tx) => {
    const [gone] = await tx.delete(thesaurusEntries).where(eq(thesaurusEntries.id, id)).returning();
    if (!gone) throw new AppError("not_found", "No such thesaurus entry.");
    await writeAudit(tx, {
      actorId: actor.id,
      action: "thesaurus.delete",
      targetType: "thesaurus_entry",
      targetId: id,
      detail: { kind: gone.kind, broader: gone.broader, terms: gone.terms, note: gone.note },
    });
  });
  await reloadSearchThesaurus();
}
