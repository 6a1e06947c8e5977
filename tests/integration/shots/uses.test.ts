import { eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { getDb } from "@/db/client";
import { stills, techniques } from "@/db/schema";
import * as shotRoute from "@/app/api/shots/[code]/route";
import * as shotSearchRoute from "@/app/api/shots/route";
import * as techniqueUsesRoute from "@/app/api/techniques/[slug]/uses/route";
import * as useRoute from "@/app/api/uses/[id]/route";
import { shotCodesForTechnique, shotsToFollowUp } from "@/lib/uses/queries";
import type { ShotDetailResponse, ShotSearchResponse } from "@/lib/shots/schemas";
import type { TechniqueUsesResponse, UseResponse } from "@/lib/uses/schemas";
import { ctx, makePerson, makeShot, makeShow, makeStill, makeTechnique, request, type ErrorJson, type Person } from "./factories";

// Rules under test come from shared/PRODUCT.md (roles table: anyone logs a use; people edit or
// delete their own logs, leads any) and shared/API.md (POST /api/techniques/{slug}/uses, error shape).

let lead: Person;
let senior: Person;
let ann: Person;
let bob: Person;
let approved: Awaited<ReturnType<typeof makeTechnique>>;
let draft: Awaited<ReturnType<typeof makeTechnique>>;

const logUse = (slug: string, as: Person | null, json: unknown) =>
  techniqueUsesRoute.POST(request("POST", `/api/techniques/${slug}/uses`, { as, json }), ctx({ slug }));
const listUses = async (slug: string, as: Person, query = "") =>
  (await (await techniqueUsesRoute.GET(request("GET", `/api/techniques/${slug}/uses${query}`, { as }), ctx({ slug }))).json()) as TechniqueUsesResponse;

beforeAll(async () => {
  lead = await makePerson("lead", "Lena Lead");
  senior = await makePerson("senior", "Sam Senior");
  ann = await makePerson("artist", "Ann Artist");
  bob = await makePerson("artist", "Bob Artist");
  const slm = await makeShow("SLM");
  for (const code of ["SLM_040_0120", "SLM_040_0130", "SLM_050_0010"]) await makeShot(slm.id, code);
  // Not SHOW_SEQ_SHOT, to check that "_" in a typeahead prefix is not a LIKE wildcard.
  await makeShot(slm.id, "SLMX040X0999");
  approved = await makeTechnique({ title: "Marker removal by channel matrix" });
  draft = await makeTechnique({ title: "Wire removal draft", status: "draft", createdById: senior.id });
});

describe("POST /api/techniques/{slug}/uses", () => {
  it("rejects a use on an unknown shot with 404 and the error shape", async () => {
    const res = await logUse(approved.slug, ann, { shot: "SLM_040_9999", outcome: "clean" });
    expect(res.status).toBe(404);
    const body = (await res.json()) as ErrorJson;
    expect(body.error.code).toBe("not_found");
    expect(body.error.message).toBe("No shot SLM_040_9999");
  });

  it("validates the body and needs a signed-in person", async () => {
    const bad = await logUse(approved.slug, ann, { shot: "SLM_040_0120", outcome: "great" });
    expect(bad.status).toBe(400);
    expect(Object.keys(((await bad.json()) as ErrorJson).error.fields ?? {})).toEqual(["outcome"]);
    expect((await logUse(approved.slug, null, { shot: "SLM_040_0120", outcome: "clean" })).status).toBe(401);
  });

  it("lets artists log uses of approved techniques only; drafts are hidden from them (404)", async () => {
    const res = await logUse(approved.slug, ann, { shot: "SLM_040_0120", outcome: "clean", note: "first try" });
    expect(res.status).toBe(201);
    const use = (await res.json()) as UseResponse;
    expect(use).toMatchObject({
      outcome: "clean",
      note: "first try",
      shot: { code: "SLM_040_0120", showCode: "SLM", sequence: "040" },
      technique: { slug: approved.slug, title: "Marker removal by channel matrix" },
      user: { id: ann.id, name: "Ann Artist" },
      revisionId: approved.revisionId,
      canEdit: true,
    });
    expect((await logUse(draft.slug, ann, { shot: "SLM_040_0120", outcome: "clean" })).status).toBe(404);
    // Seniors read working copies, so they may log a draft's trial use; it pins the latest revision.
    const bySenior = await logUse(draft.slug, senior, { shot: "SLM_040_0120", outcome: "failed" });
    expect(bySenior.status).toBe(201);
    expect(((await bySenior.json()) as UseResponse).revisionId).toBe(draft.revisionId);
  });

  it("accepts stills that exist and the caller may see, and refuses others", async () => {
    const before = await makeStill(ann.id, "use");
    const after = await makeStill(ann.id, "use");
    const ok = await logUse(approved.slug, ann, { shot: "SLM_040_0130", outcome: "touch-up", beforeStill: before.id, afterStill: after.id });
    expect(ok.status).toBe(201);
    expect((await ok.json()) as UseResponse).toMatchObject({ beforeStill: before.id, afterStill: after.id });

    const missing = await logUse(approved.slug, ann, { shot: "SLM_040_0130", outcome: "clean", afterStill: "00000000-0000-4000-8000-000000000000" });
    expect(missing.status).toBe(400);
    expect(((await missing.json()) as ErrorJson).error.fields).toEqual({ afterStill: "No still 00000000-0000-4000-8000-000000000000." });
    // A private lab trial is its owner's (and leads'): Bob cannot attach Ann's.
    const trial = await makeStill(ann.id, "trial");
    expect((await logUse(approved.slug, bob, { shot: "SLM_040_0130", outcome: "clean", beforeStill: trial.id })).status).toBe(400);
  });
});

describe("GET /api/techniques/{slug}/uses", () => {
  it("counts outcomes and sorts, filters and pages the shot table", async () => {
    const t = await makeTechnique({ title: "Dust busting" });
    const logged = [
      { shot: "SLM_040_0120", outcome: "clean" },
      { shot: "SLM_040_0130", outcome: "clean" },
      { shot: "SLM_050_0010", outcome: "touch-up" },
      { shot: "SLM_040_0120", outcome: "failed" },
      { shot: "SLM_050_0010", outcome: "clean" },
    ] as const;
    for (const [i, u] of logged.entries()) expect((await logUse(t.slug, i % 2 ? bob : ann, u)).status).toBe(201);

    const all = await listUses(t.slug, ann);
    // The expected counts are tallied from the list logged above, not typed in.
    const tally = { clean: 0, "touch-up": 0, failed: 0 };
    for (const u of logged) tally[u.outcome]++;
    expect(all.counts).toEqual({ ...tally, total: logged.length });
    expect(all.total).toBe(logged.length);

    const failed = await listUses(t.slug, ann, "?outcome=failed");
    expect(failed.items.map((u) => u.shot.code)).toEqual(["SLM_040_0120"]);
    expect(failed.counts.total).toBe(logged.length);

    const byShot = await listUses(t.slug, ann, "?sort=shot&dir=asc&limit=2&offset=0");
    expect(byShot.items.map((u) => u.shot.code)).toEqual(["SLM_040_0120", "SLM_040_0120"]);
    expect(byShot.total).toBe(logged.length);
    const page3 = await listUses(t.slug, ann, "?sort=shot&dir=asc&limit=2&offset=4");
    expect(page3.items.map((u) => u.shot.code)).toEqual(["SLM_050_0010"]);
    const q = await listUses(t.slug, ann, "?q=050");
    expect(q.items.every((u) => u.shot.code === "SLM_050_0010")).toBe(true);
    expect(q.total).toBe(2);
    // canEdit reflects the ownership rule for the reader.
    expect(all.items.every((u) => u.canEdit === (u.user?.id === ann.id))).toBe(true);

    expect(await shotCodesForTechnique(t.id)).toEqual(["SLM_040_0120", "SLM_040_0130", "SLM_050_0010"]);
  });

  it("is 404 for a draft when an artist asks", async () => {
    const res = await techniqueUsesRoute.GET(request("GET", `/api/techniques/${draft.slug}/uses`, { as: ann }), ctx({ slug: draft.slug }));
    expect(res.status).toBe(404);
  });
});

describe("PATCH and DELETE /api/uses/{id}", () => {
  it("lets the author and leads edit or delete a log, and nobody else", async () => {
    const created = (await (await logUse(approved.slug, ann, { shot: "SLM_050_0010", outcome: "touch-up" })).json()) as UseResponse;
    const patch = (as: Person, json: unknown) => useRoute.PATCH(request("PATCH", `/api/uses/${created.id}`, { as, json }), ctx({ id: created.id }));
    const del = (as: Person) => useRoute.DELETE(request("DELETE", `/api/uses/${created.id}`, { as }), ctx({ id: created.id }));

    const own = await patch(ann, { outcome: "clean", note: "re-rendered" });
    expect(own.status).toBe(200);
    expect((await own.json()) as UseResponse).toMatchObject({ outcome: "clean", note: "re-rendered" });

    const other = await patch(bob, { outcome: "failed" });
    expect(other.status).toBe(403);
    expect(((await other.json()) as ErrorJson).error.code).toBe("forbidden");
    // A senior is not a lead: still someone else's log.
    expect((await patch(senior, { outcome: "failed" })).status).toBe(403);
    expect((await del(bob)).status).toBe(403);

    const byLead = await patch(lead, { shot: "SLM_040_0130" });
    expect(byLead.status).toBe(200);
    expect(((await byLead.json()) as UseResponse).shot.code).toBe("SLM_040_0130");
    expect((await patch(ann, { shot: "SLM_040_9999" })).status).toBe(404);

    expect((await del(ann)).status).toBe(204);
    expect((await useRoute.GET(request("GET", `/api/uses/${created.id}`, { as: ann }), ctx({ id: created.id }))).status).toBe(404);
    expect((await useRoute.DELETE(request("DELETE", "/api/uses/not-a-uuid", { as: lead }), ctx({ id: "not-a-uuid" }))).status).toBe(404);
  });

  it("lets a lead delete someone else's log", async () => {
    const created = (await (await logUse(approved.slug, bob, { shot: "SLM_040_0120", outcome: "failed" })).json()) as UseResponse;
    const res = await useRoute.DELETE(request("DELETE", `/api/uses/${created.id}`, { as: lead }), ctx({ id: created.id }));
    expect(res.status).toBe(204);
  });
});

describe("shot page and follow-up", () => {
  it("lists techniques used on a shot, with a follow-up note once a technique is retired", async () => {
    const replacement = await makeTechnique({ title: "Marker removal, two-matrix method" });
    const old = await makeTechnique({ title: "Old clone-paint markers" });
    expect((await logUse(old.slug, ann, { shot: "SLM_040_0130", outcome: "touch-up" })).status).toBe(201);
    expect((await logUse(old.slug, bob, { shot: "SLM_040_0130", outcome: "failed" })).status).toBe(201);
    expect((await logUse(old.slug, bob, { shot: "SLM_050_0010", outcome: "clean" })).status).toBe(201);

    await getDb().update(techniques).set({ status: "retired", retiredAt: new Date(), supersededById: replacement.id }).where(eq(techniques.id, old.id));

    const res = await shotRoute.GET(request("GET", "/api/shots/SLM_040_0130", { as: ann }), ctx({ code: "SLM_040_0130" }));
    expect(res.status).toBe(200);
    const shot = (await res.json()) as ShotDetailResponse;
    expect(shot).toMatchObject({ code: "SLM_040_0130", sequence: "040", show: { code: "SLM" } });
    const oldUses = shot.uses.filter((u) => u.technique.slug === old.slug);
    expect(oldUses).toHaveLength(2);
    for (const u of oldUses) {
      expect(u.followUp).toEqual({
        note: "retired — see Marker removal, two-matrix method",
        replacement: { slug: replacement.slug, title: "Marker removal, two-matrix method" },
      });
    }
    // Artists do not see uses of techniques they cannot read (the senior's draft trial).
    expect(shot.uses.some((u) => u.technique.slug === draft.slug)).toBe(false);
    expect(shot.uses.filter((u) => u.technique.slug === approved.slug).every((u) => u.followUp === null)).toBe(true);

    // Retired techniques take no new uses from artists.
    expect((await logUse(old.slug, ann, { shot: "SLM_040_0120", outcome: "clean" })).status).toBe(409);

    const followUp = await shotsToFollowUp(old.id);
    expect(followUp.map((f) => [f.code, f.uses, f.lastOutcome])).toEqual([
      ["SLM_040_0130", 2, "failed"],
      ["SLM_050_0010", 1, "clean"],
    ]);

    const lower = await shotRoute.GET(request("GET", "/api/shots/slm_040_0130", { as: ann }), ctx({ code: "slm_040_0130" }));
    expect(((await lower.json()) as ShotDetailResponse).code).toBe("SLM_040_0130");

    const unknown = await shotRoute.GET(request("GET", "/api/shots/SLM_040_9999", { as: ann }), ctx({ code: "SLM_040_9999" }));
    expect(unknown.status).toBe(404);
    expect(((await unknown.json()) as ErrorJson).error.message).toBe("No shot SLM_040_9999");
  });

  it("attaching one's own private trial shares a copy that every reader of the log sees; the trial stays private", async () => {
    // Rule: a private trial is its uploader's alone until shared (README roles table); a use log
    // never shows its readers a still they may not open (no broken images).
    const before = await makeStill(ann.id, "use");
    const trial = await makeStill(ann.id, "trial");
    const created = await logUse(approved.slug, ann, { shot: "SLM_050_0010", outcome: "clean", beforeStill: before.id, afterStill: trial.id });
    expect(created.status).toBe(201);
    const id = ((await created.json()) as UseResponse).id;
    const usesOnShot = async (as: Person) => {
      const res = await shotRoute.GET(request("GET", "/api/shots/SLM_050_0010", { as }), ctx({ code: "SLM_050_0010" }));
      return ((await res.json()) as ShotDetailResponse).uses.find((u) => u.id === id)!;
    };
    const shared = (await usesOnShot(ann)).afterStill;
    expect(shared).not.toBeNull();
    expect(shared).not.toBe(trial.id);
    for (const reader of [ann, lead, bob]) {
      expect(await usesOnShot(reader)).toMatchObject({ beforeStill: before.id, beforeStillAlt: before.alt, afterStill: shared, afterStillAlt: trial.alt });
    }
    const [copy] = await getDb().select().from(stills).where(eq(stills.id, shared!));
    expect(copy).toMatchObject({ owner: "use", sha256: trial.sha256, uploaderId: ann.id });
    const [original] = await getDb().select().from(stills).where(eq(stills.id, trial.id));
    expect(original!.owner).toBe("trial");
  });

  it("refuses someone else's private trial on a use log, for leads too (404-like field error, no hint)", async () => {
    const trial = await makeStill(ann.id, "trial");
    for (const as of [bob, lead]) {
      const res = await logUse(approved.slug, as, { shot: "SLM_050_0010", outcome: "clean", afterStill: trial.id });
      expect(res.status).toBe(400);
      expect(((await res.json()) as ErrorJson).error.fields).toEqual({ afterStill: `No still ${trial.id}.` });
    }
  });

  it("suggests shot codes by prefix, any case, with _ matched literally", async () => {
    const res = await shotSearchRoute.GET(request("GET", "/api/shots?q=slm_04", { as: ann }), ctx({}));
    const body = (await res.json()) as ShotSearchResponse;
    expect(body.items.map((s) => s.code)).toEqual(["SLM_040_0120", "SLM_040_0130"]);
    expect((await shotSearchRoute.GET(request("GET", "/api/shots?q=SLM"), ctx({}))).status).toBe(401);
  });
});
