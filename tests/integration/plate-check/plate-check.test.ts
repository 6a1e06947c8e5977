import crypto from "node:crypto";
import fs from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import { eq } from "drizzle-orm";
import sharp from "sharp";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { GET as checkGet, POST as checkPost } from "@/app/api/stills/[id]/check/route";
import { GET as imageGet } from "@/app/api/stills/[id]/check/tries/[slug]/image/route";
import { POST as keepPost } from "@/app/api/stills/[id]/check/tries/[slug]/keep/route";
import { POST as proposePost } from "@/app/api/stills/[id]/check/tries/[slug]/propose/route";
import { POST as triesPost } from "@/app/api/stills/[id]/check/tries/route";
import { POST as stillsPost } from "@/app/api/stills/route";
import { getDb } from "@/db/client";
import { plateChecks, tags } from "@/db/schema";
import { DEMO_TAGS } from "@/scripts/seed/data/tags";
import { DEMO_TECHNIQUES } from "@/scripts/seed/data/techniques";
import { env } from "@/lib/env";
import { recipeSchema, type RecipeStep } from "@/lib/lab/recipe";
import { solveRow } from "@/lib/lab/solver";
import { demoCleanupRecipe, MARKER_COLOURS, SCREEN_COLOURS } from "@/lib/lab/synthetic";
import { DETECTOR_VERSION } from "@/lib/plate-check/check";
import type { CheckDto, KeptRecipeDto, TryResult } from "@/lib/plate-check/schemas";
import { createTechnique, reviewTechnique, setHouseMethod, submitTechnique } from "@/lib/techniques/mutations";
import { getTechnique } from "@/lib/techniques/queries";
import { apiRequest, createPerson, params, type TestPerson } from "@/tests/factories";
import { encodeExr } from "@/lib/exr/encode";
import { scoreFindings } from "@/tests/plate-check/score";
import { generatePlate, type GeneratedPlate } from "@/tests/plate-check/synthetic-plates";

/*
 * The plate check end to end through its route handlers, on a real PGlite and real files: a
 * generated plate (truth known) dropped as a private trial, checked, its suggested methods, the
 * side-by-side tries, keeping and proposing — and who may see what (a trial stays private:
 * shared/PRODUCT.md roles; OWASP ASVS 4.0.3 V4.1.1, deny by default, from memory).
 * The demo techniques are the real demo records (scripts/seed/data), approved and made the house
 * method for their problem as the seed does.
 */

let tmp = "";
let artist: TestPerson, other: TestPerson, senior: TestPerson, lead: TestPerson;
let plate: GeneratedPlate;
let png: Buffer;
let trialId = "";

const slugOf = (key: string) => key; // demo keys are their slugs (scripts/seed/data/techniques.ts)

async function upload(person: TestPerson, bytes: Uint8Array, name = "frame.png", colourSpace?: string): Promise<string> {
  const form = new FormData();
  const type = name.endsWith(".jpg") ? "image/jpeg" : name.endsWith(".exr") ? "image/x-exr" : name.endsWith(".webp") ? "image/webp" : "image/png";
  form.set("file", new Blob([new Uint8Array(bytes)], { type }), name);
  if (colourSpace) form.set("colourSpace", colourSpace);
  form.set("alt", "Frame dropped for a plate check");
  form.set("owner", "trial");
  const res = await stillsPost(new Request("http://localhost/api/stills", { method: "POST", body: form, headers: { Authorization: `Bearer ${person.token}` } }), params({}));
  expect(res.status).toBe(201);
  return ((await res.json()) as { id: string }).id;
}

const check = (who: TestPerson | null, id: string, body: unknown = {}, headers: Record<string, string> = {}) => checkPost(apiRequest("POST", `/api/stills/${id}/check`, who, body, headers), params({ id }));
const read = (who: TestPerson | null, id: string) => checkGet(apiRequest("GET", `/api/stills/${id}/check`, who), params({ id }));
const tries = (who: TestPerson, id: string, body: unknown = {}) => triesPost(apiRequest("POST", `/api/stills/${id}/check/tries`, who, body), params({ id }));

/** Approves a demo technique as the seed does, with the given recipe; the house method when the demo says so. */
async function demoTechnique(key: string, recipe: RecipeStep[]): Promise<void> {
  const t = DEMO_TECHNIQUES.find((d) => d.key === key)!;
  const { slug } = await createTechnique(senior, { title: t.title, summary: t.summary, aliases: t.aliases, tags: t.tags, body: t.body, recipe });
  const s = await submitTechnique(senior, slug);
  await reviewTechnique(lead, slug, { revision: s.revision, decision: "approve" });
  if (t.houseMethodFor) await setHouseMethod(lead, t.houseMethodFor, slug);
}

beforeAll(async () => {
  tmp = await fs.mkdtemp(path.join(os.tmpdir(), "plateroom-plate-check-"));
  env.PLATEROOM_UPLOADS_DIR = path.join(tmp, "uploads");
  env.PLATEROOM_DATA_DIR = path.join(tmp, "data");
  [artist, other, senior, lead] = await Promise.all([createPerson("artist"), createPerson("artist"), createPerson("senior"), createPerson("lead")]);
  await getDb().insert(tags).values(DEMO_TAGS.map((t) => ({ kind: t.kind, name: t.name, slug: t.slug, description: t.description, aliases: [...t.aliases] })));
  const matte = solveRow({ markers: MARKER_COLOURS, screen: [SCREEN_COLOURS.green], goal: { kind: "matte", channel: "g" } });
  await demoTechnique("marker-channel-cleanup", recipeSchema.parse(demoCleanupRecipe({ denoisedStillId: crypto.randomUUID(), width: 1280, screen: "green", markerSamples: MARKER_COLOURS, screenSamples: [SCREEN_COLOURS.green], screenRect: { x: 64, y: 22, w: 1152, h: 58 } })));
  await demoTechnique("screen-flattening-by-normalized-convolution", [
    { op: "matte", channel: matte.row, source: "plate", black: 0.08, white: 0.35 },
    { op: "grow", px: 4 },
    { op: "flatten", sigma: 40, color: SCREEN_COLOURS.green, weight: "outside" },
  ] as RecipeStep[]);
  for (const key of ["dust-busting-with-a-temporal-median", "dead-and-stuck-pixel-repair-with-a-sensor-map", "grain-restore-after-denoise"]) await demoTechnique(key, []);
  // A third runnable marker method (invented for the test): the matte and mix of the demo recipe without its matrix.
  const { slug } = await createTechnique(senior, {
    title: "Marker matte with a copied channel",
    summary: "Copy the screen channel over the others inside a solved marker matte.",
    aliases: [],
    tags: ["tracking-markers", "green-screen"],
    recipe: [
      { op: "copy", from: "g", to: "r" },
      { op: "copy", from: "g", to: "b" },
      { op: "matte", channel: matte.row, source: "plate", black: 0.08, white: 0.35 },
      { op: "grow", px: 2 },
      { op: "mix" },
    ] as RecipeStep[],
  });
  const s = await submitTechnique(senior, slug);
  await reviewTechnique(lead, slug, { revision: s.revision, decision: "approve" });

  plate = generatePlate({ width: 1280, height: 720, seed: 4242, screenHue: 118, shades: 2, unevenness: 0.3, grain: 0.008, foregroundShapes: 1, deadHotStuck: 10, dust: 5, hairs: 1 });
  png = await plate.png();
  trialId = await upload(artist, png);
}, 180_000);

afterAll(async () => {
  if (tmp) await fs.rm(tmp, { recursive: true, force: true });
});

describe("POST and GET /api/stills/{id}/check", () => {
  let dto: CheckDto;

  it("measures a dropped trial as its owner: findings match the generated truth", async () => {
    const res = await check(artist, trialId);
    expect(res.status).toBe(200);
    dto = (await res.json()) as CheckDto;
    expect(dto.stale).toBe(false);
    expect(dto.findings.detectorVersion).toBe(DETECTOR_VERSION);
    const s = scoreFindings(dto.findings, plate.truth);
    // Targets of issue 18 (recall and precision ≥ 95 %, every dead/hot pixel, noise within 10 %, hue within 2°).
    expect(s.markers.matched / s.markers.truth).toBeGreaterThanOrEqual(0.95);
    expect(s.markers.matched / s.markers.found).toBeGreaterThanOrEqual(0.95);
    expect(s.defects.matched).toBe(s.defects.truth);
    expect(Math.max(...s.noiseRelError.map(Math.abs))).toBeLessThanOrEqual(0.1);
    expect(s.hueError!).toBeLessThanOrEqual(2);
    expect(dto.findings.markers.shades).toHaveLength(2);
    expect(dto.findings.problemTags.map((t) => t.slug)).toEqual(expect.arrayContaining(["tracking-markers", "uneven-screen", "dead-or-stuck-pixels", "dust-and-scratches", "grain-and-noise"]));
  });

  it("suggests the demo technique written for each problem found, the department's method for markers first", () => {
    const slugs = dto.suggestions.map((m) => m.slug);
    expect(slugs[0]).toBe(slugOf("marker-channel-cleanup"));
    for (const key of ["marker-channel-cleanup", "screen-flattening-by-normalized-convolution", "dust-busting-with-a-temporal-median", "dead-and-stuck-pixel-repair-with-a-sensor-map", "grain-restore-after-denoise"]) {
      expect(slugs, key).toContain(slugOf(key));
    }
    expect(dto.suggestions.find((m) => m.slug === "marker-channel-cleanup")).toMatchObject({ isHouseMethod: true, hasRecipe: true });
    expect(dto.suggestions.find((m) => m.slug === "grain-restore-after-denoise")).toMatchObject({ hasRecipe: false });
  });

  it("answers stored findings without measuring again, and streams detector stages when asked", async () => {
    const again = (await (await check(artist, trialId)).json()) as CheckDto;
    expect(again.checkedAt).toBe(dto.checkedAt);
    const res = await check(artist, trialId, { force: true }, { Accept: "application/x-ndjson" });
    expect(res.headers.get("content-type")).toContain("application/x-ndjson");
    const lines = (await res.text()).trim().split("\n").map((l) => JSON.parse(l) as Record<string, unknown>);
    expect(lines.slice(0, -1).map((l) => l.stage)).toEqual(["noise estimate", "dead and hot pixels", "clipping", "screen", "markers and dust", "noise", "done"]);
    expect((lines.at(-1)!.check as CheckDto).checkedAt > dto.checkedAt).toBe(true);
  });

  it("keeps a private trial private: the owner reads it, other artists, seniors and leads get 404", async () => {
    expect((await read(artist, trialId)).status).toBe(200);
    for (const who of [other, senior, lead]) {
      expect((await read(who, trialId)).status).toBe(404);
      expect((await check(who, trialId)).status).toBe(404);
      expect((await tries(who, trialId)).status).toBe(404);
    }
    expect((await read(null, trialId)).status).toBe(401);
  });

  it("re-runs findings an older detector version made", async () => {
    await getDb().update(plateChecks).set({ detectorVersion: DETECTOR_VERSION - 1 }).where(eq(plateChecks.stillId, trialId));
    const stale = (await (await read(artist, trialId)).json()) as CheckDto;
    expect(stale.stale).toBe(true);
    const fresh = (await (await check(artist, trialId)).json()) as CheckDto;
    expect(fresh.stale).toBe(false);
    expect(fresh.findings.detectorVersion).toBe(DETECTOR_VERSION);
  });

  it("refuses bad input with the API error shape", async () => {
    const res = await check(artist, trialId, { force: "yes" });
    expect(res.status).toBe(400);
    expect(((await res.json()) as { error: { code: string } }).error.code).toBe("validation_failed");
    expect((await read(artist, "not-a-uuid")).status).toBe(400);
    expect((await tries(artist, trialId, { techniques: [] })).status).toBe(400);
    expect((await tries(artist, trialId, { techniques: ["a", "b", "c", "d"] })).status).toBe(400);
    expect((await tries(artist, trialId, { techniques: ["no-such-technique"] })).status).toBe(404);
  });

  it("says plainly when a frame has no screen, and does not try a screen method on it", { timeout: 120_000 }, async () => {
    const grey = await sharp({ create: { width: 320, height: 200, channels: 3, background: { r: 120, g: 118, b: 115 }, noise: { type: "gaussian", mean: 120, sigma: 4 } } }).png().toBuffer();
    const id = await upload(artist, grey, "grey.png");
    const f = ((await (await check(artist, id)).json()) as CheckDto).findings;
    expect(f.screen.present).toBe(false);
    expect(f.screen.summary).toMatch(/^No backing screen/);
    expect(f.markers.searched).toBe(false);
    const out = (await (await tries(artist, id, { techniques: ["marker-channel-cleanup"] })).json()) as { tries: TryResult[] };
    expect(out.tries[0]!.problem).toMatch(/backing screen/);
    expect(out.tries[0]!.measures).toBeNull();
  });

  it("does not claim full confidence in grain, defects or dust on a JPEG, and says why", { timeout: 120_000 }, async () => {
    const jpeg = await sharp(png).jpeg({ quality: 92 }).toBuffer();
    const id = await upload(artist, jpeg, "frame.jpg");
    const lossy = ((await (await check(artist, id)).json()) as CheckDto).findings;
    const lossless = dto.findings;
    for (const key of ["noise", "defects", "dust"] as const) {
      expect(lossy[key].summary).toMatch(/lossy-compressed \(JPEG\)/);
      expect(lossy[key].confidence).toBeLessThanOrEqual(0.5);
      expect(lossless[key].summary).not.toMatch(/JPEG/);
    }
    // The screen itself survives compression: still found, same hue within the 2° target.
    expect(lossy.screen.present).toBe(true);
    expect(Math.abs(lossy.screen.hue! - lossless.screen.hue!)).toBeLessThanOrEqual(2);
  });

  it("says a lossy WebP affects grain, defects and dust, and a lossless one does not (told from its VP8 / VP8L chunk)", { timeout: 120_000 }, async () => {
    const lossyId = await upload(artist, await sharp(png).webp({ quality: 90 }).toBuffer(), "frame.webp");
    const losslessId = await upload(artist, await sharp(png).webp({ lossless: true }).toBuffer(), "frame-lossless.webp");
    const lossy = ((await (await check(artist, lossyId)).json()) as CheckDto).findings;
    const lossless = ((await (await check(artist, losslessId)).json()) as CheckDto).findings;
    expect(lossy.compression.lossy).toBe(true);
    expect(lossy.compression.method).toMatch(/lossy VP8/);
    expect(lossy.compression.summary).toMatch(/noise σ, dead and hot pixels and dust/);
    expect(lossy.compression.confidence).toBe(1);
    for (const key of ["noise", "defects", "dust"] as const) {
      expect(lossy[key].summary).toMatch(/lossy-compressed \(WebP, lossy VP8 coding\)/);
      expect(lossy[key].confidence).toBeLessThanOrEqual(0.5);
    }
    expect(lossless.compression).toMatchObject({ lossy: false, method: "WebP, lossless VP8L coding" });
    expect(lossless.noise.summary).not.toMatch(/lossy/);
    // Lossless WebP keeps the 8-bit codes: the grain measured matches the PNG's within 10 %.
    for (let c = 0; c < 3; c++) expect(Math.abs(lossless.noise.sigma[c]! / plate.truth.noiseSigma - 1)).toBeLessThanOrEqual(0.1);
  });

  it("refuses a still declared as data in words, and stores nothing", async () => {
    const id = await upload(artist, png, "values.png", "data");
    const res = await check(artist, id);
    expect(res.status).toBe(415);
    const body = (await res.json()) as { error: { code: string; message: string } };
    expect(body.error.code).toBe("unsupported_type");
    expect(body.error.message).toMatch(/declared as data/);
    expect((await getDb().select().from(plateChecks).where(eq(plateChecks.stillId, id))).length).toBe(0);
  });
});

describe("a linear OpenEXR frame: checked in its linear space and tried side by side", () => {
  let exrPlate: GeneratedPlate;
  let exrId = "";

  it("measures an uploaded half-float OpenEXR against the generated truth", { timeout: 120_000 }, async () => {
    // The scene of the PNG above (seed 4242), kept in linear light as floats with grain in linear values.
    exrPlate = generatePlate({ width: 1280, height: 720, seed: 4242, encoding: "linear", screenHue: 118, shades: 2, unevenness: 0.3, grain: 0.005, foregroundShapes: 1, deadHotStuck: 10, dust: 5, hairs: 1 });
    // Written by three's EXRExporter (lib/exr/encode.ts): half floats, ZIP.
    const bytes = await encodeExr(exrPlate.linear!, exrPlate.width, exrPlate.height, { pixelType: "half", compression: "zip" }, null);
    exrId = await upload(artist, bytes, "linear-frame.exr");
    const res = await check(artist, exrId);
    expect(res.status).toBe(200);
    const f = ((await res.json()) as CheckDto).findings;
    expect(f.colourSpace).toBe("linear");
    expect(f.compression).toMatchObject({ lossy: false });
    expect(f.clipping.hardCeiling).toBe(false);
    const s = scoreFindings(f, exrPlate.truth);
    // Issue 18 targets; the screen's mean in the still's linear space within 1 % of the generated one (own tolerance, see linear-accuracy.test.ts).
    expect(s.markers.matched / s.markers.truth).toBeGreaterThanOrEqual(0.95);
    expect(s.markers.matched / s.markers.found).toBeGreaterThanOrEqual(0.95);
    expect(s.defects.matched).toBe(s.defects.truth);
    expect(s.defects.found).toBe(s.defects.truth);
    expect(Math.max(...s.noiseRelError.map(Math.abs))).toBeLessThanOrEqual(0.1);
    expect(s.hueError!).toBeLessThanOrEqual(2);
    f.screen.meanLinear!.forEach((v, c) => expect(Math.abs(v / exrPlate.truth.screen!.meanLinear[c]! - 1)).toBeLessThanOrEqual(0.01));
    expect(f.noise.summary).toMatch(/linear float values/);
  });

  it("fills, renders and measures the tries through the lab's colour entry, in the still's linear space", { timeout: 120_000 }, async () => {
    const res = await tries(artist, exrId);
    expect(res.status).toBe(200);
    const results = ((await res.json()) as { tries: TryResult[] }).tries;
    const marker = results.find((r) => r.slug === "marker-channel-cleanup")!;
    expect(marker.problem).toBeNull();
    const m = marker.measures!;
    expect(m.residualPerShade).toHaveLength(2);
    for (const r of m.residualPerShade) expect(Math.abs(r)).toBeLessThan(1e-6);
    expect(m.markerContrast!.after).toBeLessThan(0.25 * m.markerContrast!.before);
    const flatten = results.find((r) => r.slug === "screen-flattening-by-normalized-convolution")!;
    const step = flatten.recipe.find((st) => st.op === "flatten") as Extract<RecipeStep, { op: "flatten" }>;
    const stored = ((await (await read(artist, exrId)).json()) as CheckDto).findings.screen.meanLinear!;
    expect(step.color).toEqual(stored.map((v) => Math.round(v * 1e6) / 1e6));
    expect(flatten.measures!.changedOutsideMatte).toBeGreaterThan(10 * m.changedOutsideMatte);
    const proxy = await imageGet(apiRequest("GET", `/api/stills/${exrId}/check/tries/marker-channel-cleanup/image`, artist), params({ id: exrId, slug: "marker-channel-cleanup" }));
    expect(proxy.status).toBe(200);
    expect(proxy.headers.get("content-type")).toBe("image/webp");
  });
});

describe("trying methods side by side", () => {
  let results: TryResult[];

  it("refuses to try before a check", async () => {
    const id = await upload(artist, png, "again.png");
    expect((await tries(artist, id)).status).toBe(409);
  });

  it("fills, renders and measures the three runnable suggested methods", { timeout: 120_000 }, async () => {
    const res = await tries(artist, trialId);
    expect(res.status).toBe(200);
    results = ((await res.json()) as { tries: TryResult[] }).tries;
    // The department's method for the first problem first; then the others with a recipe, in the suggestions' order.
    expect(results).toHaveLength(3);
    expect(results[0]!.slug).toBe("marker-channel-cleanup");
    expect(results.map((r) => r.slug).sort()).toEqual(["marker-channel-cleanup", "marker-matte-with-a-copied-channel", "screen-flattening-by-normalized-convolution"]);
    const marker = results[0]!;
    expect(marker.problem).toBeNull();
    expect(marker.skipped.join(" ")).toMatch(/grain/);
    expect(marker.filled.join(" ")).toMatch(/Step 1 \(matrix\)/);
    const m = marker.measures!;
    expect(m.targetChannel).toBe("g");
    // Two shades and a hide row with two free coefficients: both met exactly (LAB-NOTES.md "Solver").
    expect(m.residualPerShade).toHaveLength(2);
    for (const r of m.residualPerShade) expect(Math.abs(r)).toBeLessThan(1e-6);
    expect(m.markerContrast!.after).toBeLessThan(0.25 * m.markerContrast!.before);
    // The solver's row gain is reported beside the measured noise gain (a hide row amplifies grain).
    expect(m.matrixGain).toBeGreaterThan(1);
    expect(m.noiseGain).toBeGreaterThan(0);
    const flatten = results.find((r) => r.slug === "screen-flattening-by-normalized-convolution")!;
    const step = flatten.recipe.find((s) => s.op === "flatten") as Extract<RecipeStep, { op: "flatten" }>;
    const stored = ((await (await read(artist, trialId)).json()) as CheckDto).findings.screen.meanLinear!;
    expect(step.color).toEqual(stored.map((v) => Math.round(v * 1e6) / 1e6));
    // Flattening changes the whole screen by design: far more than a marker cleanup outside the markers.
    expect(flatten.measures!.changedOutsideMatte).toBeGreaterThan(10 * m.changedOutsideMatte);
  });

  it("serves each try as a proxy and, on request, exactly", async () => {
    const url = (slug: string, q = "") => apiRequest("GET", `/api/stills/${trialId}/check/tries/${slug}/image${q}`, artist);
    const proxy = await imageGet(url("marker-channel-cleanup"), params({ id: trialId, slug: "marker-channel-cleanup" }));
    expect(proxy.status).toBe(200);
    expect(proxy.headers.get("content-type")).toBe("image/webp");
    expect(proxy.headers.get("x-lab-width")).toBe("1024");
    const exact = await imageGet(url("marker-channel-cleanup", "?size=exact"), params({ id: trialId, slug: "marker-channel-cleanup" }));
    expect(exact.headers.get("content-type")).toBe("image/png");
    expect(exact.headers.get("x-lab-width")).toBe("1280");
    expect((await imageGet(apiRequest("GET", `/api/stills/${trialId}/check/tries/x/image`, other), params({ id: trialId, slug: "x" }))).status).toBe(404);
  });

  it("keeps a filled recipe for its keeper alone", async () => {
    const res = await keepPost(apiRequest("POST", `/api/stills/${trialId}/check/tries/marker-channel-cleanup/keep`, artist, { note: "for the marker shot" }), params({ id: trialId, slug: "marker-channel-cleanup" }));
    expect(res.status).toBe(201);
    const kept = (await res.json()) as KeptRecipeDto;
    expect(kept.recipe).toEqual(results[0]!.recipe);
    expect(((await (await read(artist, trialId)).json()) as CheckDto).kept.map((k) => k.id)).toEqual([kept.id]);
    expect((await read(lead, trialId)).status).toBe(404);
  });

  it("lets a senior propose a filled recipe as a new revision that waits for review; not artists, not on another's trial", { timeout: 120_000 }, async () => {
    const propose = (who: TestPerson, id: string) =>
      proposePost(apiRequest("POST", `/api/stills/${id}/check/tries/screen-flattening-by-normalized-convolution/propose`, who, { changeNote: "Values from a checked frame." }), params({ id, slug: "screen-flattening-by-normalized-convolution" }));
    expect((await propose(artist, trialId)).status).toBe(403);
    expect((await propose(senior, trialId)).status).toBe(404);
    const own = await upload(senior, png, "senior.png");
    await check(senior, own);
    await tries(senior, own, { techniques: ["screen-flattening-by-normalized-convolution"] });
    const res = await propose(senior, own);
    expect(res.status).toBe(201);
    const { revision } = (await res.json()) as { revision: number };
    const t = await getTechnique({ id: senior.id, email: senior.email, name: senior.name, role: "senior" }, "screen-flattening-by-normalized-convolution");
    expect(t.latestRevision).toBe(revision);
    expect(t.approvedRevision).toBe(1);
    expect(t.hasPendingRevision).toBe(true);
    expect(t.revision.state).toBe("in_review");
    // Readers keep the approved recipe until a lead approves the proposal.
    const reader = await getTechnique({ id: artist.id, email: artist.email, name: artist.name, role: "artist" }, "screen-flattening-by-normalized-convolution");
    expect(reader.revision.number).toBe(1);
  });
});
