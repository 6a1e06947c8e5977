import "server-only";
import { eq, gt, inArray } from "drizzle-orm";
import { getDb } from "@/db/client";
import { houseMethods, revisions, shots, tags, techniques, uses, type Revision, type Technique } from "@/db/schema";
import { applySearchChange, rebuildSearchIndex, type SearchDocument, type SearchIndexEntry, type SearchTag } from "@/lib/search";
import { databaseMeaningStore } from "@/lib/search/meaning-store";
import { MEANING_MODEL_ID } from "@/lib/search/meaning-model";
import { loadThesaurusForSearch } from "@/lib/thesaurus/queries";
import { RECIPE_PARAMETER_LABELS } from "@/lib/techniques/recipe-labels";

type TagRow = { id: string; slug: string; name: string; kind: "problem" | "plate"; aliases: string[] };

/** Words a recipe contributes to search: its operations and their parameter names. */
function recipeParameterNames(recipe: unknown): string[] {
  if (!Array.isArray(recipe)) return [];
  const names = new Set<string>();
  for (const step of recipe) {
    if (!step || typeof step !== "object") continue;
    const op = (step as { op?: unknown }).op;
    if (typeof op === "string") {
      names.add(op);
      const label = RECIPE_PARAMETER_LABELS[op];
      if (label) names.add(label);
    }
  }
  return [...names];
}

function toDocument(t: Technique, r: Revision, tagById: Map<string, TagRow>, shotCodes: string[], houseFor: string[], status: SearchDocument["status"]): SearchDocument {
  const docTags: SearchTag[] = r.tagIds
    .map((id) => tagById.get(id))
    .filter((x): x is TagRow => Boolean(x))
    .map(({ slug, name, kind, aliases }) => ({ slug, name, kind, aliases }));
  return {
    techniqueId: t.id,
    slug: t.slug,
    title: r.title,
    summary: r.summary,
    aliases: r.aliases,
    tags: docTags,
    parameterNames: recipeParameterNames(r.recipe),
    shotCodes,
    bodyText: r.bodyText,
    status,
    houseMethodFor: houseFor,
    updatedAt: t.updatedAt.toISOString(),
  };
}

/** Builds both views (published = approved revision, working = newest) of the given techniques, or of all. */
async function loadSearchEntries(ids?: string[]): Promise<SearchIndexEntry[]> {
  const db = getDb();
  const techniqueRows = ids ? (ids.length ? await db.select().from(techniques).where(inArray(techniques.id, ids)) : []) : await db.select().from(techniques);
  if (!techniqueRows.length) return [];
  const techniqueIds = techniqueRows.map((t) => t.id);
  const revisionIds = [...new Set(techniqueRows.flatMap((t) => [t.latestRevisionId, t.approvedRevisionId]).filter((x): x is string => Boolean(x)))];
  const [revisionRows, tagRows, shotRows, houseRows] = await Promise.all([
    revisionIds.length ? db.select().from(revisions).where(inArray(revisions.id, revisionIds)) : Promise.resolve([]),
    db.select({ id: tags.id, slug: tags.slug, name: tags.name, kind: tags.kind, aliases: tags.aliases }).from(tags),
    db
      .selectDistinct({ techniqueId: uses.techniqueId, code: shots.code })
      .from(uses)
      .innerJoin(shots, eq(shots.id, uses.shotId))
      .where(inArray(uses.techniqueId, techniqueIds)),
    db.select().from(houseMethods).where(inArray(houseMethods.techniqueId, techniqueIds)),
  ]);
  const revisionById = new Map(revisionRows.map((r) => [r.id, r]));
  const tagById = new Map(tagRows.map((t) => [t.id, t]));
  const shotsBy = new Map<string, string[]>();
  for (const s of shotRows) shotsBy.set(s.techniqueId, [...(shotsBy.get(s.techniqueId) ?? []), s.code]);
  const houseBy = new Map<string, string[]>();
  for (const h of houseRows) {
    const slug = tagById.get(h.tagId)?.slug;
    if (slug) houseBy.set(h.techniqueId, [...(houseBy.get(h.techniqueId) ?? []), slug]);
  }
  return techniqueRows.map((t) => {
    const approved = t.approvedRevisionId ? revisionById.get(t.approvedRevisionId) : undefined;
    const latest = t.latestRevisionId ? revisionById.get(t.latestRevisionId) : undefined;
    const codes = shotsBy.get(t.id) ?? [];
    const house = houseBy.get(t.id) ?? [];
    return {
      techniqueId: t.id,
      published: approved ? toDocument(t, approved, tagById, codes, house, t.status === "retired" ? "retired" : "approved") : null,
      working: latest ? toDocument(t, latest, tagById, codes, house, t.status) : null,
    };
  });
}

/** Called after every committed write that changes what search should return for a technique. */
export async function reindexTechnique(techniqueId: string): Promise<void> {
  const [entry] = await loadSearchEntries([techniqueId]);
  await applySearchChange({ kind: "technique", techniqueId, views: entry ? { published: entry.published, working: entry.working } : null });
}

/** Rebuilds the whole index and its thesaurus from the database (start-up, and after tag renames or merges). */
export function rebuildSearchFromDb(): Promise<number> {
  return rebuildSearchIndex(() => loadSearchEntries(), loadThesaurusForSearch, databaseMeaningStore(MEANING_MODEL_ID));
}

/** The index applies the thesaurus at query time: after a change it takes the whole (small) list again. */
export async function reloadSearchThesaurus(): Promise<void> {
  await applySearchChange({ kind: "thesaurus", entries: await loadThesaurusForSearch() });
}

/**
 * With several app instances on one PostgreSQL server, each keeps its own index: this picks up
 * techniques another instance changed since `since` and returns the new high-water mark.
 */
export async function syncChangedSince(since: Date): Promise<Date> {
  const changed = await getDb().select({ id: techniques.id, updatedAt: techniques.updatedAt }).from(techniques).where(gt(techniques.updatedAt, since));
  let mark = since;
  for (const row of changed) {
    await reindexTechnique(row.id);
    if (row.updatedAt > mark) mark = row.updatedAt;
  }
  return mark;
}
