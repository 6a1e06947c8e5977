import { beforeAll, describe, expect, it } from "vitest";
import * as requestsRoute from "@/app/api/requests/route";
import * as searchRoute from "@/app/api/search/route";
import * as suggestRoute from "@/app/api/search/suggest/route";
import { listRequests } from "@/lib/requests/queries";
import type { SearchApiResponse, SuggestApiResponse } from "@/lib/search-ui/params";
import { createTechnique, retireTechnique, reviewTechnique, submitTechnique, updateTechnique } from "@/lib/techniques/mutations";
import { rebuildSearchFromDb } from "@/lib/techniques/search-sync";
import { techniqueDocumentSchema } from "@/lib/techniques/document";
import { apiRequest, createPerson, createTag, simpleDoc, type TestPerson } from "@/tests/factories";

// Visibility rules are our own product rules (shared/PRODUCT.md "Search" and "Techniques", issue 6):
// no outside source. Status codes follow RFC 9110 §15.5.1 (400 Bad Request) and §15.5.2 (401 Unauthorized).

const doc = (text: string) => techniqueDocumentSchema.parse(simpleDoc(text));

let artist: TestPerson;
let senior: TestPerson;
let lead: TestPerson;

async function search(who: TestPerson | null, qs: string): Promise<{ status: number; body: SearchApiResponse & { error?: { code: string; fields?: Record<string, string> } } }> {
  const res = await searchRoute.GET(apiRequest("GET", `/api/search?${qs}`, who), { params: Promise.resolve({}) });
  return { status: res.status, body: await res.json() };
}

const slugsFor = async (who: TestPerson, qs: string) => (await search(who, qs)).body.results.map((r) => r.slug);
/** Every highlighted piece of text of one result, lowercased: what the person was shown as matching. */
const shownWords = (r: SearchApiResponse["results"][number]) => r.matches.flatMap((m) => m.ranges.map(([s, e]) => m.value.slice(s, e).toLowerCase()));

async function approve(slug: string) {
  const { revision } = await submitTechnique(senior, slug);
  await reviewTechnique(lead, slug, { revision, decision: "approve" });
}

beforeAll(async () => {
  artist = await createPerson("artist");
  senior = await createPerson("senior");
  lead = await createPerson("lead");
  await createTag("problem", "Rolling shutter", ["jello", "skew"]);
  await createTag("problem", "Lens breathing", []);
  await createTag("plate", "Car interior", []);
  await rebuildSearchFromDb();
});

describe("GET /api/search", () => {
  it("answers 401 to nobody signed in", async () => {
    const { status, body } = await search(null, "q=shutter");
    expect(status).toBe(401);
    expect(body.error?.code).toBe("unauthorized");
  });

  it("answers 400 naming the field for a status that does not exist", async () => {
    const { status, body } = await search(artist, "q=shutter&status=published");
    expect(status).toBe(400);
    expect(body.error?.code).toBe("validation_failed");
    expect(Object.keys(body.error?.fields ?? {}).some((k) => k.startsWith("status"))).toBe(true);
    expect((await search(artist, "sort=oldest")).status).toBe(400);
    expect((await search(artist, "tag=Not%20A%20Slug")).status).toBe(400);
  });

  it("never shows a draft to an artist; the author's senior colleagues see it", async () => {
    const { slug } = await createTechnique(senior, {
      title: "Lens breathing compensation",
      summary: "Scale each frame against a focus-pull reference so the framing holds while focus racks.",
      aliases: ["focus breathing fix"],
      tags: ["lens-breathing"],
      body: doc("Track the background scale across the pull and divide it out before any paint."),
      recipe: [],
    });
    expect(await slugsFor(artist, "q=lens+breathing")).not.toContain(slug);
    expect(await slugsFor(artist, "q=breathing&status=draft")).not.toContain(slug);
    const seen = await search(senior, "q=lens+breathing");
    const hit = seen.body.results.find((r) => r.slug === slug);
    expect(hit?.status).toBe("draft");
    expect(hit?.matches.some((m) => m.field === "title")).toBe(true);
    expect(seen.body.facets.status).toContainEqual({ status: "draft", count: 1 });
  });

  it("keeps a pending revision's words from artists until it is approved, then shows them at once", async () => {
    const { slug } = await createTechnique(senior, {
      title: "Rolling shutter skew repair",
      summary: "Undo the lean of verticals on a whip pan by shearing each scanline back by its capture delay.",
      aliases: [],
      tags: ["rolling-shutter", "car-interior"],
      body: doc("Measure the lean on a straight vertical, then shear rows by the measured delay."),
      recipe: [],
    });
    await approve(slug);
    expect(await slugsFor(artist, "q=shutter+skew")).toContain(slug);

    const edit = await updateTechnique(senior, slug, {
      title: "Rolling shutter skew repair",
      summary: "Undo the lean of verticals on a whip pan; on anamorphic plates squeeze first.",
      aliases: ["wobble fix"],
      tags: ["rolling-shutter", "car-interior"],
      body: doc("Desqueeze anamorphic plates before measuring the lean."),
      recipe: [],
      baseRevision: 1,
      changeNote: "Anamorphic plates.",
    });
    const before = await search(artist, "q=anamorphic");
    const artistHit = before.body.results.find((r) => r.slug === slug);
    // If the technique shows up at all for an artist, it is never through the unapproved words.
    expect(artistHit ? shownWords(artistHit).some((w) => w.startsWith("anamorph")) : false).toBe(false);
    expect(artistHit?.summary ?? "").not.toContain("anamorphic");
    const seniorHit = (await search(senior, "q=anamorphic")).body.results.find((r) => r.slug === slug);
    expect(seniorHit?.summary).toContain("anamorphic");

    // A saved revision is a draft until submitted (issue 13: one rule for new and approved pages).
    await submitTechnique(senior, slug);
    await reviewTechnique(lead, slug, { revision: edit.revision, decision: "approve" });
    const after = (await search(artist, "q=anamorphic")).body.results.find((r) => r.slug === slug);
    expect(after?.status).toBe("approved");
    expect(after?.summary).toContain("anamorphic");
  });

  it("hides a retired technique from default results and shows it with retired=1", async () => {
    const { slug } = await createTechnique(senior, {
      title: "Rolling shutter fix by frame blending",
      summary: "Blend neighbouring frames to hide the shear; superseded by scanline shearing.",
      aliases: [],
      tags: ["rolling-shutter"],
      body: doc("Blend three frames with weights that follow the scanline."),
      recipe: [],
    });
    await approve(slug);
    expect(await slugsFor(artist, "q=frame+blending")).toContain(slug);
    await retireTechnique(lead, slug, { note: "Use scanline shearing." });
    expect(await slugsFor(artist, "q=frame+blending")).not.toContain(slug);
    const withRetired = await search(artist, "q=frame+blending&retired=1");
    expect(withRetired.body.results.find((r) => r.slug === slug)?.status).toBe("retired");
    expect(await slugsFor(artist, "q=frame+blending&status=retired")).toContain(slug);
  });

  it("filters by repeated tags and reports facets and timing", async () => {
    const { body, status } = await search(artist, "q=shutter&tag=rolling-shutter&tag=car-interior");
    expect(status).toBe(200);
    expect(body.results.length).toBeGreaterThan(0);
    for (const r of body.results) expect(r.tags.map((t) => t.slug)).toEqual(expect.arrayContaining(["rolling-shutter", "car-interior"]));
    // Tag aliases are search vocabulary only; they are not part of a result.
    expect(Object.keys(body.results[0]!.tags[0]!).sort()).toEqual(["kind", "name", "slug"]);
    expect(body.facets.plate.find((f) => f.slug === "car-interior")?.count).toBe(body.total);
    expect(typeof body.tookMs).toBe("number");
  });

  it("orders pages the words score alike by meaning: the page about what the person describes comes first", async () => {
    // Both pages match only "window", in the title, so the engine scores them alike (and lists the
    // older first); the sentence encoder puts the query nearer the page about reflections.
    const made: string[] = [];
    for (const [title, summary] of [
      ["Window smudges", "Dirt and grease marks on the glass."],
      ["Window reflections", "Mirror images of people on the glass."],
    ] as const) {
      const { slug } = await createTechnique(senior, { title, summary, aliases: [], tags: [], recipe: [], body: doc("") });
      await approve(slug);
      made.push(slug);
    }
    const [smudges, reflections] = made as [string, string];
    const firstOf = async (q: string) => (await slugsFor(artist, `q=${encodeURIComponent(q)}`)).filter((s) => made.includes(s));
    expect(await firstOf("you can see the film crew in the window")).toEqual([reflections, smudges]);
    expect(await firstOf("a ghostly copy of the actor in the window")).toEqual([reflections, smudges]);
    // Where the words already name the problem, meaning agrees with them.
    expect(await firstOf("greasy window")).toEqual([smudges, reflections]);
  });
});

describe("GET /api/search/suggest", () => {
  it("suggests titles with highlight ranges, never a draft to an artist, and needs sign-in", async () => {
    const res = await suggestRoute.GET(apiRequest("GET", "/api/search/suggest?q=shutter", artist), { params: Promise.resolve({}) });
    const body = (await res.json()) as SuggestApiResponse;
    const top = body.items[0];
    expect(top?.title).toContain("Rolling shutter");
    const [s, e] = top!.ranges[0]!;
    expect(top!.title.slice(s, e).toLowerCase()).toBe("shutter");
    const lens = (await (await suggestRoute.GET(apiRequest("GET", "/api/search/suggest?q=breathing", artist), { params: Promise.resolve({}) })).json()) as SuggestApiResponse;
    expect(lens.items.map((i) => i.title)).not.toContain("Lens breathing compensation");
    const anon = await suggestRoute.GET(apiRequest("GET", "/api/search/suggest?q=shutter", null), { params: Promise.resolve({}) });
    expect(anon.status).toBe(401);
  });
});

describe("a search turned into a request", () => {
  it("reaches seniors' list of open requests", async () => {
    const res = await requestsRoute.POST(apiRequest("POST", "/api/requests", artist, { query: "zebra crossing flicker", note: "SLM_040_0120, night" }), { params: Promise.resolve({}) });
    expect(res.status).toBe(201);
    const open = await listRequests(senior, "open");
    expect(open.find((r) => r.query === "zebra crossing flicker")?.requester?.id).toBe(artist.id);
  });
});
