import "server-only";
import { asc, count, eq, max } from "drizzle-orm";
import { getDb } from "@/db/client";
import { thesaurusEntries, users } from "@/db/schema";
import { AppError } from "@/lib/api/errors";
import { assertCan } from "@/lib/auth/permissions";
import type { SessionUser } from "@/lib/auth/roles";
import type { ThesaurusEntry } from "@/lib/search";
import type { ThesaurusEntryDto } from "@/lib/thesaurus/schemas";
import { isUuid } from "@/lib/utils";

function toDto(row: typeof thesaurusEntries.$inferSelect, updatedBy: string | null): ThesaurusEntryDto {
  return { id: row.id, kind: row.kind, broader: row.broader, terms: row.terms, note: row.note, updatedAt: row.updatedAt.toISOString(), updatedBy };
}

/** Every entry, broader term or first term alphabetically; anyone who may read techniques. */
export async function listThesaurusEntries(user: SessionUser): Promise<ThesaurusEntryDto[]> {
  assertCan(user, "technique:read");
  const rows = await getDb()
    .select({ entry: thesaurusEntries, updatedBy: users.name })
    .from(thesaurusEntries)
    .leftJoin(users, eq(users.id, thesaurusEntries.updatedById))
    .orderBy(asc(thesaurusEntries.createdAt), asc(thesaurusEntries.id));
  const firstWord = (d: ThesaurusEntryDto): string => d.broader ?? d.terms[0] ?? "";
  return rows.map((r) => toDto(r.entry, r.updatedBy)).sort((a, b) => firstWord(a).localeCompare(firstWord(b)) || a.id.localeCompare(b.id));
}

export async function getThesaurusEntry(user: SessionUser, id: string): Promise<ThesaurusEntryDto> {
  assertCan(user, "technique:read");
  if (!isUuid(id)) throw new AppError("not_found", "No such thesaurus entry.");
  const [row] = await getDb()
    .select({ entry: thesaurusEntries, updatedBy: users.name })
    .from(thesaurusEntries)
    .leftJoin(users, eq(users.id, thesaurusEntries.updatedById))
    .where(eq(thesaurusEntries.id, id));
  if (!row) throw new AppError("not_found", "No such thesaurus entry.");
  return toDto(row.entry, row.updatedBy);
}

/** The whole thesaurus as the search index applies it (start-up and after every change; no person). */
export async function loadThesaurusForSearch(): Promise<ThesaurusEntry[]> {
  const rows = await getDb().select().from(thesaurusEntries);
  return rows.map((r) => (r.kind === "narrower" && r.broader ? { id: r.id, kind: "narrower", broader: r.broader, terms: r.terms } : { id: r.id, kind: "synonyms", terms: r.terms }));
}

/** Changes when any entry is added, edited or deleted: the poll of lib/techniques/search-follow.ts compares it. */
export async function thesaurusSignature(): Promise<string> {
  const [row] = await getDb().select({ n: count(), last: max(thesaurusEntries.updatedAt) }).from(thesaurusEntries);
  return `${row?.n ?? 0}:${row?.last?.toISOString() ?? ""}`;
}
