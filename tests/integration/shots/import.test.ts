import { asc, eq, sql } from "drizzle-orm";
import { beforeAll, describe, expect, it, vi } from "vitest";
import { getDb } from "@/db/client";
import { auditLog, shots, shows } from "@/db/schema";
import * as showsRoute from "@/app/api/shows/route";
import * as showRoute from "@/app/api/shows/[code]/route";
import * as showShotsRoute from "@/app/api/shows/[code]/shots/route";
import type { ImportShotsResponse, ShotsResponse } from "@/lib/shots/schemas";
import type { ShowResponse, ShowsResponse } from "@/lib/shows/schemas";
import { ctx, makePerson, request, type ErrorJson, type Person } from "./factories";

// Shot codes SHOW_SEQ_SHOT (e.g. SLM_040_0120): common practice, no published source.
// CSV syntax: RFC 4180 (CRLF records, quoted fields with commas and doubled quotes).

let lead: Person;
let artist: Person;

const importCsv = (code: string, csv: string, as: Person | null = lead, query = "") =>
  showShotsRoute.POST(request("POST", `/api/shows/${code}/shots${query}`, { as, body: csv }), ctx({ code }));
const rowsOf = async (showCode: string) =>
  (
    await getDb()
      .select({ shot: shots })
      .from(shots)
      .innerJoin(shows, eq(shows.id, shots.showId))
      .where(eq(shows.code, showCode))
      .orderBy(asc(shots.code))
  ).map(({ shot: s }) => ({
    code: s.code,
    description: s.description,
    frame_start: s.frameStart,
    frame_end: s.frameEnd,
    state: s.state,
    updated_at: s.updatedAt.toISOString(),
  }));

beforeAll(async () => {
  lead = await makePerson("lead");
  artist = await makePerson("artist");
  const res = await showsRoute.POST(request("POST", "/api/shows", { as: lead, json: { code: "slm", name: "Saltmarsh", kind: "feature" } }), ctx({}));
  expect(res.status).toBe(201);
  const body = (await res.json()) as ShowResponse;
  expect(body).toMatchObject({ code: "SLM", name: "Saltmarsh", kind: "feature", state: "active", shotCount: 0 });
  expect(body.shotPattern).toBe(String.raw`^{CODE}_\d{3}_\d{4}$`);
});

describe("shows", () => {
  it("lists shows for any signed-in person, 401 when signed out", async () => {
    const res = await showsRoute.GET(request("GET", "/api/shows", { as: artist }), ctx({}));
    expect(res.status).toBe(200);
    expect(((await res.json()) as ShowsResponse).items.map((s) => s.code)).toContain("SLM");
    const anon = await showsRoute.GET(request("GET", "/api/shows"), ctx({}));
    expect(anon.status).toBe(401);
    expect(((await anon.json()) as ErrorJson).error.code).toBe("unauthorized");
  });

  it("lets only leads create and change shows; codes are unique", async () => {
    const byArtist = await showsRoute.POST(request("POST", "/api/shows", { as: artist, json: { code: "LTH", name: "The Long Thaw" } }), ctx({}));
    expect(byArtist.status).toBe(403);
    const bad = await showsRoute.POST(request("POST", "/api/shows", { as: lead, json: { code: "L", name: "x", shotPattern: "(" } }), ctx({}));
    expect(bad.status).toBe(400);
    const fields = ((await bad.json()) as ErrorJson).error.fields ?? {};
    expect(Object.keys(fields).sort()).toEqual(["code", "shotPattern"]);
    const dup = await showsRoute.POST(request("POST", "/api/shows", { as: lead, json: { code: "SLM", name: "again" } }), ctx({}));
    expect(dup.status).toBe(409);

    const patchByArtist = await showRoute.PATCH(request("PATCH", "/api/shows/SLM", { as: artist, json: { state: "wrapped" } }), ctx({ code: "SLM" }));
    expect(patchByArtist.status).toBe(403);
    const lth = await showsRoute.POST(request("POST", "/api/shows", { as: lead, json: { code: "LTH", name: "The Long Thaw", kind: "series" } }), ctx({}));
    expect(lth.status).toBe(201);
    const patched = await showRoute.PATCH(request("PATCH", "/api/shows/LTH", { as: lead, json: { state: "wrapped" } }), ctx({ code: "LTH" }));
    expect(((await patched.json()) as ShowResponse).state).toBe("wrapped");
    const missing = await showRoute.GET(request("GET", "/api/shows/NOPE", { as: artist }), ctx({ code: "NOPE" }));
    expect(missing.status).toBe(404);
  });
});

describe("POST /api/shows/{code}/shots", () => {
  // Two good rows, then every kind of bad row, a blank line and a quoted comma.
  const list = [
    "\uFEFFShot,Description,Frame start,Frame end,Status",
    'SLM_040_0120,"markers, left of frame",1001,1096,waiting',
    "SLM_040_0130,wire rig,1001,1050,In prep",
    "",
    "SLM_40_130,pattern broken,1001,1010,", // row 3
    "SLM_040_0120,duplicate,1001,1096,", // row 4
    "SLM_040_0140,reversed,1100,1001,", // row 5
    "SLM_050_0010,dust,1001,1020,",
  ].join("\r\n");

  it("refuses artists (403) and signed-out callers (401) without writing", async () => {
    const a = await importCsv("SLM", list, artist);
    expect(a.status).toBe(403);
    expect(((await a.json()) as ErrorJson).error.code).toBe("forbidden");
    const anon = await importCsv("SLM", list, null);
    expect(anon.status).toBe(401);
    expect(await rowsOf("SLM")).toEqual([]);
  });

  it("dry run reports the plan and writes nothing", async () => {
    const res = await importCsv("SLM", list, lead, "?dryRun=true");
    expect(res.status).toBe(200);
    const body = (await res.json()) as ImportShotsResponse;
    expect(body).toMatchObject({ dryRun: true, created: 3, updated: 0, unchanged: 0 });
    expect(body.preview?.create.map((s) => s.code)).toEqual(["SLM_040_0120", "SLM_040_0130", "SLM_050_0010"]);
    expect(await rowsOf("SLM")).toEqual([]);
  });

  it("writes the good rows, reports every bad row, and a second import changes nothing", async () => {
    const res = await importCsv("SLM", list);
    expect(res.status).toBe(200);
    const body = (await res.json()) as ImportShotsResponse;
    expect(body).toMatchObject({ dryRun: false, created: 3, updated: 0, unchanged: 0 });
    expect(body.errors.map((e) => e.row)).toEqual([3, 4, 5]);
    expect(body.errors[1]?.message).toBe("SLM_040_0120 appears more than once; first on row 1.");
    const stored = await rowsOf("SLM");
    expect(stored.map((r) => [r.code, r.description, r.frame_start, r.frame_end, r.state])).toEqual([
      ["SLM_040_0120", "markers, left of frame", 1001, 1096, "waiting"],
      ["SLM_040_0130", "wire rig", 1001, 1050, "in_prep"],
      ["SLM_050_0010", "dust", 1001, 1020, "waiting"],
    ]);
    const [audits] = (await getDb().select({ n: sql<number>`count(*)`.mapWith(Number) }).from(auditLog).where(eq(auditLog.action, "shots.import")));
    expect(audits?.n).toBe(1);

    const again = (await (await importCsv("SLM", list)).json()) as ImportShotsResponse;
    expect(again).toMatchObject({ created: 0, updated: 0, unchanged: 3 });
    expect(again.errors).toHaveLength(3);
    // Unchanged rows are not rewritten: their updated_at stays as it was.
    expect(await rowsOf("SLM")).toEqual(stored);
  });

  it("updates changed rows only, from JSON rows", async () => {
    const res = await showShotsRoute.POST(
      request("POST", "/api/shows/SLM/shots", {
        as: lead,
        json: { rows: [{ code: "SLM_040_0130", description: "wire rig and shadow" }, { code: "SLM_050_0010" }, { code: "LTH_010_0010" }] },
      }),
      ctx({ code: "SLM" }),
    );
    const body = (await res.json()) as ImportShotsResponse;
    expect(body).toMatchObject({ created: 0, updated: 1, unchanged: 1 });
    expect(body.errors).toEqual([{ row: 3, code: "LTH_010_0010", message: expect.stringMatching(/^LTH_010_0010 is not a shot code of SLM: they look like SLM_040_0120/) }]);
    const stored = await rowsOf("SLM");
    expect(stored.find((r) => r.code === "SLM_040_0130")).toMatchObject({ description: "wire rig and shadow", frame_start: 1001, state: "in_prep" });
  });

  it("takes CSV with an explicit column mapping in JSON", async () => {
    const csv = "Plate;Notes\nignored";
    const res = await showShotsRoute.POST(
      request("POST", "/api/shows/SLM/shots", {
        as: lead,
        json: { csv: "Plate,Notes,Cut in,Cut out\nSLM_060_0010,crew reflection,1,48\n", mapping: { code: "Plate", description: "Notes", frameStart: "Cut in", frameEnd: "Cut out" } },
      }),
      ctx({ code: "SLM" }),
    );
    expect(((await res.json()) as ImportShotsResponse).created).toBe(1);
    // A mapping that names a column the file lacks is a 400 with the error shape.
    const bad = await showShotsRoute.POST(
      request("POST", "/api/shows/SLM/shots", { as: lead, json: { csv, mapping: { code: "Shot" } } }),
      ctx({ code: "SLM" }),
    );
    expect(bad.status).toBe(400);
    expect(((await bad.json()) as ErrorJson).error.message).toMatch(/"Shot" is not in the file/);
  });

  it("writes none of the good rows when the write fails part-way (one transaction)", async () => {
    // A trigger makes the database refuse one row that passes every check, in a later batch of
    // the upsert, so earlier batches have already been sent when the failure comes.
    await getDb().execute(sql`
      create function refuse_poison() returns trigger language plpgsql as $$
      begin
        if new.code = 'SLM_999_0999' then raise exception 'refused for the test'; end if;
        return new;
      end $$`);
    await getDb().execute(sql`create trigger refuse_poison before insert on shots for each row execute function refuse_poison()`);
    const lines = ["Shot,Description"];
    for (let i = 0; i < 1200; i++) lines.push(`SLM_7${String(Math.floor(i / 100)).padStart(2, "0")}_${String(i % 100).padStart(4, "0")},bulk`);
    lines.push("SLM_999_0999,poison");
    const before = (await rowsOf("SLM")).length;
    const quiet = vi.spyOn(console, "error").mockImplementation(() => {});
    const res = await importCsv("SLM", lines.join("\n"));
    quiet.mockRestore();
    expect(res.status).toBe(500);
    expect(((await res.json()) as ErrorJson).error.code).toBe("internal");
    expect((await rowsOf("SLM")).length).toBe(before);
    await getDb().execute(sql`drop trigger refuse_poison on shots`);

    const ok = (await (await importCsv("SLM", lines.join("\n"))).json()) as ImportShotsResponse;
    expect(ok.created).toBe(1201);
    expect((await rowsOf("SLM")).length).toBe(before + 1201);
  });

  it("answers 404 for an unknown show and 415 for other body types", async () => {
    const res = await importCsv("NOPE", list);
    expect(res.status).toBe(404);
    expect(((await res.json()) as ErrorJson).error.message).toBe("No show NOPE");
    const xml = await showShotsRoute.POST(request("POST", "/api/shows/SLM/shots", { as: lead, body: "<x/>", contentType: "application/xml" }), ctx({ code: "SLM" }));
    expect(xml.status).toBe(415);
  });

  it("the dry run refuses exactly what the import refuses: a NUL (U+0000) in a cell is a row error in both", async () => {
    // PostgreSQL text cannot store U+0000 (PostgreSQL documentation, "Character Types"); the dry run
    // once reported such a row as created and the real import then failed as a whole.
    const nul = [
      "Shot,Description,Sequence",
      "SLM_987_0010,clean row,060",
      "SLM_987_0020,wire\u0000rig,060", // row 2
      "SLM_987_0030,clean too,0\u000060", // row 3
      "SLM_987\u0000_0040,code,060", // row 4
    ].join("\r\n");
    const dryRes = await importCsv("SLM", nul, lead, "?dryRun=true");
    expect(dryRes.status).toBe(200);
    const dry = (await dryRes.json()) as ImportShotsResponse;
    const real = await importCsv("SLM", nul);
    expect(real.status).toBe(200);
    const done = (await real.json()) as ImportShotsResponse;
    for (const body of [dry, done]) {
      expect(body.created).toBe(1);
      expect(body.errors.map((e) => e.row)).toEqual([2, 3, 4]);
      expect(body.errors.every((e) => /NUL \(U\+0000\)/.test(e.message))).toBe(true);
    }
    expect(done.errors).toEqual(dry.errors);
    expect((await rowsOf("SLM")).filter((r) => r.code.startsWith("SLM_987")).map((r) => r.code)).toEqual(["SLM_987_0010"]);
  });
});

describe("GET /api/shows/{code}/shots", () => {
  it("lists and filters shots, and exports CSV that re-imports unchanged", async () => {
    const list = (await (await showShotsRoute.GET(request("GET", "/api/shows/SLM/shots?q=wire&limit=10", { as: artist }), ctx({ code: "SLM" }))).json()) as ShotsResponse;
    expect(list.items.map((s) => s.code)).toEqual(["SLM_040_0130"]);
    expect(list.total).toBe(1);

    const exported = await showShotsRoute.GET(request("GET", "/api/shows/SLM/shots?format=csv", { as: artist }), ctx({ code: "SLM" }));
    expect(exported.headers.get("content-type")).toMatch(/^text\/csv/);
    expect(exported.headers.get("content-disposition")).toBe('attachment; filename="SLM-shots.csv"');
    expect(exported.headers.get("cache-control")).toBe("private, no-store");
    const csv = await exported.text();
    const total = (await rowsOf("SLM")).length;
    const again = (await (await importCsv("SLM", csv)).json()) as ImportShotsResponse;
    expect(again).toMatchObject({ created: 0, updated: 0, unchanged: total, errors: [] });
  });
});

