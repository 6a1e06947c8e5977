import { eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { getDb } from "@/db/client";
import { houseMethods } from "@/db/schema";
import * as houseMethodRoute from "@/app/api/tags/[slug]/house-method/route";
import * as techniquesRoute from "@/app/api/techniques/route";
import * as techniqueRoute from "@/app/api/techniques/[slug]/route";
import * as retireRoute from "@/app/api/techniques/[slug]/retire/route";
import * as reviewRoute from "@/app/api/techniques/[slug]/review/route";
import * as restoreRoute from "@/app/api/techniques/[slug]/revisions/[number]/restore/route";
import * as submitRoute from "@/app/api/techniques/[slug]/submit/route";
import type { TechniqueResponse } from "@/lib/techniques/schemas";
import { apiRequest, createPerson, createTag, params, simpleDoc, type TestPerson } from "@/tests/factories";

/*
 * A technique from first draft to retirement through the HTTP contract (shared/API.md:
 * POST/PUT /api/techniques, submit, review, retire, restore, the tag's department method) on a
 * real PGlite. The rules are the product's (shared/PRODUCT.md: seniors write and submit, leads
 * review, retire and choose the department's method; artists read approved revisions only;
 * a save from a stale base is refused with 409 so nothing is silently overwritten).
 */

type ErrorJson = { error: { code: string; message: string; fields?: Record<string, string> } };
type Saved = { slug: string; revision: number };

let senior: TestPerson;
let otherSenior: TestPerson;
let lead: TestPerson;
let artist: TestPerson;
let problemTag: string;

const content = (title: string, text: string) => ({ title, summary: `${title}: a summary.`, tags: [problemTag], body: simpleDoc(text) });

const create = (as: TestPerson, body: unknown) => techniquesRoute.POST(apiRequest("POST", "/api/techniques", as, body), params({}));
const read = (as: TestPerson, slug: string) => techniqueRoute.GET(apiRequest("GET", `/api/techniques/${slug}`, as), params({ slug }));
const save = (as: TestPerson, slug: string, body: unknown) => techniqueRoute.PUT(apiRequest("PUT", `/api/techniques/${slug}`, as, body), params({ slug }));
const submit = (as: TestPerson, slug: string) => submitRoute.POST(apiRequest("POST", `/api/techniques/${slug}/submit`, as, {}), params({ slug }));
const review = (as: TestPerson, slug: string, body: unknown) => reviewRoute.POST(apiRequest("POST", `/api/techniques/${slug}/review`, as, body), params({ slug }));
const retire = (as: TestPerson, slug: string, body: unknown) => retireRoute.POST(apiRequest("POST", `/api/techniques/${slug}/retire`, as, body), params({ slug }));
const restore = (as: TestPerson, slug: string, number: number, body: unknown) =>
  restoreRoute.POST(apiRequest("POST", `/api/techniques/${slug}/revisions/${number}/restore`, as, body), params({ slug, number: String(number) }));
const setHouseMethod = (as: TestPerson, tag: string, technique: string | null) =>
  houseMethodRoute.PUT(apiRequest("PUT", `/api/tags/${tag}/house-method`, as, { technique }), params({ slug: tag }));

async function shown(as: TestPerson, slug: string): Promise<TechniqueResponse> {
  const res = await read(as, slug);
  expect(res.status).toBe(200);
  return (await res.json()) as TechniqueResponse;
}

async function expectError(res: Response, status: number, code: string): Promise<ErrorJson["error"]> {
  expect(res.status).toBe(status);
  const body = (await res.json()) as ErrorJson;
  expect(body.error.code).toBe(code);
  return body.error;
}

/** A technique taken through create → submit → approve, for the retire and department-method steps. */
async function approvedTechnique(title: string): Promise<string> {
  const created = (await (await create(senior, content(title, "Approved steps."))).json()) as Saved;
  expect((await submit(senior, created.slug)).status).toBe(200);
  const approved = (await (await review(lead, created.slug, { revision: 1, decision: "approve" })).json()) as Saved;
  return approved.slug;
}

beforeAll(async () => {
  senior = await createPerson("senior", { name: "Sam Senior" });
  otherSenior = await createPerson("senior", { name: "Sol Senior" });
  lead = await createPerson("lead", { name: "Lena Lead" });
  artist = await createPerson("artist", { name: "Ann Artist" });
  problemTag = (await createTag("problem", "Tracking markers on blue")).slug;
});

describe("a technique's life cycle", () => {
  let slug: string;

  it("a senior creates a draft that artists cannot see; artists cannot create one", async () => {
    expect((await create(artist, content("Marker paint-out", "Artist try."))).status).toBe(403);
    const res = await create(senior, content("Marker paint-out", "Step one: pick the plate."));
    expect(res.status).toBe(201);
    const created = (await res.json()) as Saved;
    expect(created.revision).toBe(1);
    slug = created.slug;
    const draft = await shown(senior, slug);
    expect([draft.status, draft.revision.state, draft.latestRevision, draft.approvedRevision]).toEqual(["draft", "draft", 1, null]);
    await expectError(await read(artist, slug), 404, "not_found");
  });

  it("a save from a stale base is refused with 409 naming who saved in between, and changes nothing", async () => {
    const first = await save(senior, slug, { ...content("Marker paint-out", "Step one, revised."), baseRevision: 1, changeNote: "Clearer first step." });
    expect(first.status).toBe(200);
    expect(((await first.json()) as Saved).revision).toBe(2);

    const stale = await save(otherSenior, slug, { ...content("Marker paint-out (other)", "Written from revision 1."), baseRevision: 1, changeNote: "My edit." });
    const error = await expectError(stale, 409, "conflict");
    expect(error.message).toContain("Sam Senior saved revision 2");
    const after = await shown(senior, slug);
    expect([after.latestRevision, after.title, after.revision.changeNote]).toEqual([2, "Marker paint-out", "Clearer first step."]);

    // A save without a change note is bad input (400 with the field named), not a new revision.
    const noNote = await save(senior, slug, { ...content("Marker paint-out", "x"), baseRevision: 2, changeNote: " " });
    expect(Object.keys((await expectError(noNote, 400, "validation_failed")).fields ?? {})).toEqual(["changeNote"]);
    expect((await shown(senior, slug)).latestRevision).toBe(2);
  });

  it("submit sends the newest revision to review once; a second submit is 409", async () => {
    expect((await submit(artist, slug)).status).toBe(403);
    const res = await submit(senior, slug);
    expect(res.status).toBe(200);
    expect(await res.json()).toMatchObject({ revision: 2, state: "in_review" });
    expect((await shown(senior, slug)).status).toBe("in_review");
    await expectError(await submit(senior, slug), 409, "conflict");
  });

  it("a lead sends it back with a note (a note is required); it returns to draft", async () => {
    expect((await review(senior, slug, { revision: 2, decision: "return", note: "No." })).status).toBe(403);
    const noNote = await review(lead, slug, { revision: 2, decision: "return" });
    expect(Object.keys((await expectError(noNote, 400, "validation_failed")).fields ?? {})).toEqual(["note"]);
    const res = await review(lead, slug, { revision: 2, decision: "return", note: "Say which channel carries the markers." });
    expect(res.status).toBe(200);
    expect(await res.json()).toMatchObject({ revision: 2, state: "returned" });
    const returned = await shown(senior, slug);
    expect([returned.status, returned.revision.state, returned.revision.reviewNote, returned.revision.reviewedBy?.name]).toEqual([
      "draft",
      "returned",
      "Say which channel carries the markers.",
      "Lena Lead",
    ]);
    await expectError(await read(artist, slug), 404, "not_found");
  });

  it("after a fix and a new submit, the lead approves the newest revision (an older number is 409) and artists read it", async () => {
    const fixed = await save(senior, slug, { ...content("Marker paint-out", "The markers sit in the blue channel."), baseRevision: 2, changeNote: "Names the channel." });
    slug = ((await fixed.json()) as Saved).slug;
    expect((await submit(senior, slug)).status).toBe(200);
    await expectError(await review(lead, slug, { revision: 2, decision: "approve" }), 409, "conflict");
    const res = await review(lead, slug, { revision: 3, decision: "approve" });
    expect(res.status).toBe(200);
    slug = ((await res.json()) as Saved).slug;
    const approved = await shown(artist, slug);
    expect([approved.status, approved.revision.number, approved.approvedRevision, approved.approvedBy?.name]).toEqual(["approved", 3, 3, "Lena Lead"]);
  });

  it("an edit of an approved technique is a draft until submitted, while artists keep reading the approved revision", async () => {
    const res = await save(senior, slug, { ...content("Marker paint-out", "An untested shortcut."), baseRevision: 3, changeNote: "Shortcut." });
    expect(((await res.json()) as Saved).revision).toBe(4);
    const forWriters = await shown(senior, slug);
    expect([forWriters.revision.number, forWriters.revision.state, forWriters.hasPendingRevision, forWriters.status]).toEqual([4, "draft", true, "approved"]);
    expect(await (await submit(senior, slug)).json()).toMatchObject({ revision: 4, state: "in_review" });
    expect((await shown(senior, slug)).revision.state).toBe("in_review");
    const forArtists = await shown(artist, slug);
    expect([forArtists.revision.number, forArtists.status, forArtists.body]).toEqual([3, "approved", simpleDoc("The markers sit in the blue channel.")]);
  });

  it("restoring an older revision copies it into a new revision, from the newest base only", async () => {
    await expectError(await restore(senior, slug, 1, { baseRevision: 3 }), 409, "conflict");
    await expectError(await restore(senior, slug, 9, { baseRevision: 4 }), 404, "not_found");
    const res = await restore(senior, slug, 1, { baseRevision: 4 });
    expect(res.status).toBe(201);
    expect(((await res.json()) as Saved).revision).toBe(5);
    const restored = await shown(senior, slug);
    expect([restored.revision.number, restored.revision.changeNote, restored.body]).toEqual([5, "Restored revision 1.", simpleDoc("Step one: pick the plate.")]);
  });

  it("a lead makes an approved technique the department's method for its problem tag; only approved, tagged ones qualify", async () => {
    expect((await setHouseMethod(senior, problemTag, slug)).status).toBe(403);
    const res = await setHouseMethod(lead, problemTag, slug);
    expect(res.status).toBe(200);
    expect((await shown(artist, slug)).isHouseMethodFor.map((t) => t.slug)).toEqual([problemTag]);

    const plateTag = (await createTag("plate", "Blue screen plate")).slug;
    await expectError(await setHouseMethod(lead, plateTag, slug), 400, "validation_failed");
    const draft = ((await (await create(senior, content("Unreviewed idea", "Not yet."))).json()) as Saved).slug;
    await expectError(await setHouseMethod(lead, problemTag, draft), 400, "validation_failed");
    expect((await shown(artist, slug)).isHouseMethodFor.map((t) => t.slug)).toEqual([problemTag]);
  });

  it("a lead retires it in favour of an approved replacement; it leaves the department's method and takes no more edits", async () => {
    const replacement = await approvedTechnique("Marker paint-out, two-pass");
    expect((await retire(senior, slug, { supersededBy: replacement })).status).toBe(403);
    await expectError(await retire(lead, slug, { supersededBy: slug }), 400, "validation_failed");
    const res = await retire(lead, slug, { supersededBy: replacement, note: "The two-pass method keeps the grain." });
    expect(res.status).toBe(200);
    const retired = await shown(artist, slug);
    expect([retired.status, retired.supersededBy?.slug, retired.retireNote, retired.isHouseMethodFor]).toEqual(["retired", replacement, "The two-pass method keeps the grain.", []]);
    const tagId = (await getDb().query.tags.findFirst({ where: (t, { eq: equals }) => equals(t.slug, problemTag) }))!.id;
    expect(await getDb().select().from(houseMethods).where(eq(houseMethods.tagId, tagId))).toEqual([]);

    await expectError(await save(senior, slug, { ...content("Marker paint-out", "Too late."), baseRevision: 5, changeNote: "Late edit." }), 409, "conflict");
    await expectError(await retire(lead, slug, {}), 409, "conflict");
  });
});
