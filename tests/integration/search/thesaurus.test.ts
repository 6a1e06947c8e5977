import { desc, eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import * as entryRoute from "@/app/api/thesaurus/[id]/route";
import * as listRoute from "@/app/api/thesaurus/route";
import * as searchRoute from "@/app/api/search/route";
import { getDb } from "@/db/client";
import { auditLog, thesaurusEntries } from "@/db/schema";
import { STARTER_THESAURUS } from "@/scripts/seed/data/thesaurus";
import type { SearchApiResponse } from "@/lib/search-ui/params";
import { createTechnique, reviewTechnique, submitTechnique } from "@/lib/techniques/mutations";
import { rebuildSearchFromDb } from "@/lib/techniques/search-sync";
import { techniqueDocumentSchema } from "@/lib/techniques/document";
import type { ThesaurusEntryDto, ThesaurusListResponse } from "@/lib/thesaurus/schemas";
import { apiRequest, createPerson, createTag, params, simpleDoc, type TestPerson } from "@/tests/factories";

// The thesaurus contract is Plateroom's own (issue 16). Status codes: RFC 9110 §15.5 (400, 401, 403,
// 404) and §15.3.5 (204 No Content).

let artist: TestPerson;
let senior: TestPerson;
let lead: TestPerson;

type Body = ThesaurusEntryDto & { error?: { code: string; fields?: Record<string, string> } };
const call = async (res: Response) => ({ status: res.status, body: res.status === 204 ? null : ((await res.json()) as Body) });
const list = async (who: TestPerson | null) => {
  const res = await listRoute.GET(apiRequest("GET", "/api/thesaurus", who), params({}));
  return { status: res.status, body: (await res.json()) as ThesaurusListResponse & { error?: { code: string } } };
};
const create = async (who: TestPerson | null, body: unknown) => call(await listRoute.POST(apiRequest("POST", "/api/thesaurus", who, body), params({})));
const put = async (who: TestPerson | null, id: string, body: unknown) => call(await entryRoute.PUT(apiRequest("PUT", `/api/thesaurus/${id}`, who, body), params({ id })));
const del = async (who: TestPerson | null, id: string) => call(await entryRoute.DELETE(apiRequest("DELETE", `/api/thesaurus/${id}`, who), params({ id })));
const search = async (who: TestPerson, q: string) => {
  const res = await searchRoute.GET(apiRequest("GET", `/api/search?q=${encodeURIComponent(q)}`, who), params({}));
  return (await res.json()) as SearchApiResponse;
};

beforeAll(async () => {
  artist = await createPerson("artist");
  senior = await createPerson("senior");
  lead = await createPerson("lead");
  await createTag("problem", "Screen seams");
  const { slug } = await createTechnique(senior, {
    title: "Seam fill on cloth backings",
    summary: "Fill the lines where screen panels meet before the key.",
    aliases: [],
    tags: ["screen-seams"],
    body: techniqueDocumentSchema.parse(simpleDoc("Fill each seam from either side with a thin matte.")),
    recipe: [],
  });
  const { revision } = await submitTechnique(senior, slug);
  await reviewTechnique(lead, slug, { revision, decision: "approve" });
  await rebuildSearchFromDb();
});

describe("the starter thesaurus", () => {
  it("is in every database after migrating, equal to scripts/seed/data/thesaurus.ts, with at least 60 entries", async () => {
    const rows = await getDb().select().from(thesaurusEntries);
    const key = (e: { kind: string; broader?: string | null; terms: readonly string[] }) => JSON.stringify([e.kind, e.broader ?? null, e.terms]);
    expect(rows.map(key).sort()).toEqual(STARTER_THESAURUS.map((e) => key({ ...e, broader: e.kind === "narrower" ? e.broader : null })).sort());
    expect(rows.length).toBeGreaterThanOrEqual(60);
  });
});

describe("/api/thesaurus", () => {
  it("answers 401 to nobody signed in, lists for any role, and lets only leads write", async () => {
    expect((await list(null)).status).toBe(401);
    const { status, body } = await list(artist);
    expect(status).toBe(200);
    expect(body.items.length).toBeGreaterThanOrEqual(60);
    expect((await create(artist, { kind: "synonyms", terms: ["joins", "gaps"] })).status).toBe(403);
    expect((await create(senior, { kind: "synonyms", terms: ["joins", "gaps"] })).status).toBe(403);
    const id = body.items[0]!.id;
    expect((await put(senior, id, { kind: "synonyms", terms: ["a b", "c d"] })).status).toBe(403);
    expect((await del(artist, id)).status).toBe(403);
  });

  it("refuses bad entries with field messages", async () => {
    const one = await create(lead, { kind: "synonyms", terms: ["seam"] });
    expect(one.status).toBe(400);
    expect(one.body?.error?.fields?.terms).toMatch(/at least two/);
    const loop = await create(lead, { kind: "narrower", broader: "seam", terms: ["seam", "join"] });
    expect(loop.status).toBe(400);
    expect(loop.body?.error?.fields?.broader).toMatch(/cannot also be/);
    const twice = await create(lead, { kind: "synonyms", terms: ["Seam", "seam "] });
    expect(twice.status).toBe(400);
    const quotedTwice = await create(lead, { kind: "synonyms", terms: ['"seam"', "seam"] });
    expect(quotedTwice.body?.error?.fields?.terms).toMatch(/listed twice/);
    const stray = await create(lead, { kind: "synonyms", terms: ['seam"s', "join"] });
    expect(stray.status).toBe(400);
    expect(stray.body?.error?.fields?.["terms.0"] ?? stray.body?.error?.fields?.terms).toMatch(/“seam"s”: quotes go around a whole term/);
    const quotedBroader = await create(lead, { kind: "narrower", broader: '"seam"', terms: ["join"] });
    expect(quotedBroader.body?.error?.fields?.broader).toMatch(/takes no quotes/);
  });

  it("meets a quoted term only with its words as written or their plurals", async () => {
    // Snowball stems "shimming" to "shim", an English word (so never corrected): unquoted, "shim" would meet the term.
    const created = await create(lead, { kind: "narrower", broader: "seam", terms: ['"Shimming"'] });
    expect(created.status).toBe(201);
    try {
      expect(created.body?.terms).toEqual(['"shimming"']);
      expect((await search(artist, "shim")).results).toEqual([]);
      expect((await search(artist, "shimming")).results[0]).toMatchObject({ slug: "seam-fill-on-cloth-backings", via: [{ word: "shimming", term: "seam", kind: "broader" }] });
      expect((await search(artist, "shimmings")).results[0]?.slug).toBe("seam-fill-on-cloth-backings");
    } finally {
      expect((await del(lead, created.body!.id)).status).toBe(204);
    }
  });

  it("creates, edits and deletes an entry, each audited, and search uses it at once", async () => {
    expect((await search(artist, "kzorp")).results).toEqual([]);
    const created = await create(lead, { kind: "narrower", broader: "seam", terms: ["Kzorp", "panel gap"], note: "Said on the Saltmarsh stage." });
    expect(created.status).toBe(201);
    expect(created.body).toMatchObject({ kind: "narrower", broader: "seam", terms: ["kzorp", "panel gap"], updatedBy: lead.name });
    const id = created.body!.id;

    const hit = await search(artist, "kzorp");
    expect(hit.results[0]).toMatchObject({ slug: "seam-fill-on-cloth-backings", via: [{ word: "kzorp", term: "seam", kind: "broader" }] });

    const edited = await put(lead, id, { kind: "synonyms", terms: ["kzorp", "seam", "join"] });
    expect(edited.status).toBe(200);
    expect(edited.body).toMatchObject({ kind: "synonyms", broader: null, terms: ["kzorp", "seam", "join"] });
    expect((await search(artist, "kzorp")).results[0]?.via).toEqual([{ word: "kzorp", term: "seam", kind: "synonym", source: "thesaurus" }]);

    expect((await del(lead, id)).status).toBe(204);
    expect((await search(artist, "kzorp")).results).toEqual([]);
    expect((await del(lead, id)).status).toBe(404);
    expect((await put(lead, id, { kind: "synonyms", terms: ["a b", "c d"] })).status).toBe(404);
    expect((await put(lead, "not-a-uuid", { kind: "synonyms", terms: ["a b", "c d"] })).status).toBe(404);

    const audit = await getDb().select().from(auditLog).where(eq(auditLog.targetId, id)).orderBy(desc(auditLog.id));
    expect(audit.map((a) => a.action)).toEqual(["thesaurus.delete", "thesaurus.update", "thesaurus.create"]);
    expect(audit.every((a) => a.actorId === lead.id)).toBe(true);
    expect(audit[1]?.detail).toMatchObject({ before: { kind: "narrower", broader: "seam" }, after: { kind: "synonyms" } });
  });
});
