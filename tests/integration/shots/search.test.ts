import { beforeAll, describe, expect, it } from "vitest";
import * as showShotsRoute from "@/app/api/shows/[code]/shots/route";
import * as techniqueUsesRoute from "@/app/api/techniques/[slug]/uses/route";
import * as useRoute from "@/app/api/uses/[id]/route";
import { getSearchIndex } from "@/lib/search";
import type { ImportShotsResponse } from "@/lib/shots/schemas";
import type { UseResponse } from "@/lib/uses/schemas";
import { ctx, makePerson, makeShot, makeShow, makeTechnique, request, type Person } from "./factories";

// Our own behaviour, no outside source: shared/PRODUCT.md lists shot codes among the fields
// search covers, so a use log puts its shot code into the technique's search document as soon
// as it is saved, and editing or deleting the log takes it out again.

let lead: Person;
let ann: Person;
let technique: Awaited<ReturnType<typeof makeTechnique>>;

/** The shot codes through which `query` found the technique in the published view (what artists search). */
function shotMatches(query: string): string[] {
  const { results } = getSearchIndex().search(query, { audience: "published", limit: 50 });
  const hit = results.find((r) => r.slug === technique.slug);
  return hit ? hit.matches.filter((m) => m.field === "shots").map((m) => m.value) : [];
}

const logUse = async (shot: string) => {
  const res = await techniqueUsesRoute.POST(
    request("POST", `/api/techniques/${technique.slug}/uses`, { as: ann, json: { shot, outcome: "clean" } }),
    ctx({ slug: technique.slug }),
  );
  expect(res.status).toBe(201);
  return (await res.json()) as UseResponse;
};

beforeAll(async () => {
  lead = await makePerson("lead", "Lena Lead");
  ann = await makePerson("artist", "Ann Artist");
  const lth = await makeShow("LTH");
  for (const code of ["LTH_101_0230", "LTH_102_0040"]) await makeShot(lth.id, code);
  // Inserted straight into the database, so the index has not seen it until a write reindexes it.
  technique = await makeTechnique({ title: "Rig removal with a clean plate" });
});

describe("shot codes in search", () => {
  it("adds a logged shot to the technique's document, moves it on edit and drops it on delete", async () => {
    expect(shotMatches("LTH_101_0230")).toEqual([]);

    const use = await logUse("LTH_101_0230");
    expect(shotMatches("LTH_101_0230")).toEqual(["LTH_101_0230"]);

    const patched = await useRoute.PATCH(request("PATCH", `/api/uses/${use.id}`, { as: ann, json: { shot: "LTH_102_0040" } }), ctx({ id: use.id }));
    expect(patched.status).toBe(200);
    expect(shotMatches("LTH_102_0040")).toEqual(["LTH_102_0040"]);
    expect(shotMatches("LTH_101_0230")).not.toContain("LTH_101_0230");

    const deleted = await useRoute.DELETE(request("DELETE", `/api/uses/${use.id}`, { as: ann }), ctx({ id: use.id }));
    expect(deleted.status).toBe(204);
    expect(shotMatches("LTH_102_0040")).not.toContain("LTH_102_0040");
  });

  it("keeps the document after an import changes a shot that has uses (and the import does not hang)", async () => {
    await logUse("LTH_101_0230");
    const res = await showShotsRoute.POST(
      request("POST", "/api/shows/LTH/shots", { as: lead, json: { rows: [{ code: "LTH_101_0230", description: "crane in frame" }] } }),
      ctx({ code: "LTH" }),
    );
    expect(res.status).toBe(200);
    expect(((await res.json()) as ImportShotsResponse).updated).toBe(1);
    expect(shotMatches("LTH_101_0230")).toEqual(["LTH_101_0230"]);
  });
});
