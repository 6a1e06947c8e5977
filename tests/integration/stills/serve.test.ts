import crypto from "node:crypto";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import sharp from "sharp";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { POST } from "@/app/api/stills/route";
import { GET as getVariant } from "@/app/api/stills/[id]/[variant]/route";
import { GET as getStill } from "@/app/api/stills/[id]/route";
import { GET as getPixel } from "@/app/api/stills/[id]/pixel/route";
import { env } from "@/lib/env";
import { floatTiff, noisePng, png16 } from "./images";
import { createPerson, createTechnique, ctx, uploadRequest, type TestPerson } from "./factories";

let dir: string;
let artist: TestPerson;
let otherArtist: TestPerson;
let senior: TestPerson;
let lead: TestPerson;
let admin: TestPerson;
let trialId: string;
let trialBytes: Buffer;
let draftStillId: string;
let approvedStillId: string;

async function upload(person: TestPerson, bytes: Uint8Array, fields: Record<string, string>): Promise<Record<string, unknown>> {
  const res = await POST(uploadRequest({ bytes, name: "still.png", type: "image/png" }, { alt: "Screen with markers", ...fields }, person.auth), ctx({}));
  const body = (await res.json()) as Record<string, unknown>;
  if (res.status !== 201) throw new Error(`upload failed ${res.status} ${JSON.stringify(body)}`);
  return body;
}

function variantRequest(person: TestPerson | null, id: string, variant: string, headers: Record<string, string> = {}) {
  const req = new Request(`http://plateroom.test/api/stills/${id}/${variant}`, { headers: { ...(person?.auth ?? {}), ...headers } });
  return getVariant(req, ctx({ id, variant }));
}

beforeAll(async () => {
  dir = fs.mkdtempSync(path.join(os.tmpdir(), "plateroom-serve-"));
  env.PLATEROOM_UPLOADS_DIR = dir;
  [artist, otherArtist, senior, lead, admin] = await Promise.all([
    createPerson("artist"),
    createPerson("artist"),
    createPerson("senior"),
    createPerson("lead"),
    createPerson("admin"),
  ]);
  const draft = await createTechnique(senior.user, { approved: false });
  const approved = await createTechnique(senior.user, { approved: true });
  trialBytes = await noisePng(30, 20);
  trialId = (await upload(artist, trialBytes, { owner: "trial" })).id as string;
  draftStillId = (await upload(senior, await noisePng(10, 10), { owner: "technique", technique: draft.slug })).id as string;
  approvedStillId = (await upload(senior, await noisePng(12, 10), { owner: "technique", technique: approved.slug })).id as string;
});

afterAll(() => {
  fs.rmSync(dir, { recursive: true, force: true });
});

describe("who may upload", () => {
  it("signed out → 401 and nothing read", async () => {
    const res = await POST(uploadRequest({ bytes: await noisePng(4, 4), name: "a.png" }, { alt: "x" }), ctx({}));
    expect(res.status).toBe(401);
    expect(((await res.json()) as { error: { code: string } }).error.code).toBe("unauthorized");
  });

  it("an artist may not attach a still to a technique (403) but may upload a private trial", async () => {
    const t = await createTechnique(senior.user, { approved: true });
    const res = await POST(uploadRequest({ bytes: await noisePng(4, 4), name: "a.png" }, { alt: "x", owner: "technique", technique: t.slug }, artist.auth), ctx({}));
    expect(res.status).toBe(403);
    const ok = await POST(uploadRequest({ bytes: await noisePng(4, 4), name: "a.png" }, { alt: "x", owner: "trial", technique: t.slug }, artist.auth), ctx({}));
    expect(ok.status).toBe(201);
  });

  it("a technique nobody can see gives 404, not a hint that it exists", async () => {
    const draft = await createTechnique(senior.user, { approved: false });
    const res = await POST(uploadRequest({ bytes: await noisePng(4, 4), name: "a.png" }, { alt: "x", owner: "trial", technique: draft.slug }, artist.auth), ctx({}));
    expect(res.status).toBe(404);
  });
});

describe("who may see a still (private trials: their uploader alone; technique stills: who sees the technique)", () => {
  it("signed out → 401", async () => {
    expect((await variantRequest(null, trialId, "original")).status).toBe(401);
  });

  const trialCases: [string, () => TestPerson, number][] = [
    ["the owner", () => artist, 200],
    // OWASP ASVS 4.0.3 V4.2.1 (access to data by object id); README roles table: leads and admins do not read trials.
    ["a lead", () => lead, 404],
    ["another artist", () => otherArtist, 404],
    ["a senior", () => senior, 404],
    ["an admin", () => admin, 404],
  ];
  for (const [who, person, status] of trialCases) {
    it(`private trial, ${who} → ${status}`, async () => {
      for (const variant of ["original", "preview", "thumb"]) {
        const res = await variantRequest(person(), trialId, variant);
        expect(res.status, variant).toBe(status);
        await res.arrayBuffer();
      }
      const meta = await getStill(new Request(`http://plateroom.test/api/stills/${trialId}`, { headers: person().auth }), ctx({ id: trialId }));
      expect(meta.status).toBe(status);
    });
  }

  it("a still of a draft technique: artist 404, senior 200", async () => {
    expect((await variantRequest(artist, draftStillId, "preview")).status).toBe(404);
    expect((await variantRequest(senior, draftStillId, "preview")).status).toBe(200);
  });

  it("a still of an approved technique: any signed-in person", async () => {
    expect((await variantRequest(otherArtist, approvedStillId, "preview")).status).toBe(200);
    expect((await variantRequest(admin, approvedStillId, "thumb")).status).toBe(200);
  });

  it("unknown id → 404, malformed id → 400, unknown variant → 404", async () => {
    expect((await variantRequest(lead, crypto.randomUUID(), "original")).status).toBe(404);
    expect((await variantRequest(lead, "../../etc/passwd", "original")).status).toBe(400);
    expect((await variantRequest(lead, trialId, "full")).status).toBe(404);
  });
});

describe("serving headers", () => {
  it("original: exact bytes, image/png, private no-store, nosniff, strong ETag, generated inline file name", async () => {
    const res = await variantRequest(artist, trialId, "original");
    expect(res.status).toBe(200);
    expect(Buffer.from(await res.arrayBuffer()).equals(trialBytes)).toBe(true);
    expect(res.headers.get("content-type")).toBe("image/png");
    expect(res.headers.get("cache-control")).toBe("private, no-store");
    expect(res.headers.get("x-content-type-options")).toBe("nosniff");
    expect(res.headers.get("content-disposition")).toBe(`inline; filename="still-${trialId}.png"`);
    const sha = crypto.createHash("sha256").update(trialBytes).digest("hex");
    // RFC 9110 §8.8.3: a strong entity tag is a quoted string without the W/ prefix.
    expect(res.headers.get("etag")).toBe(`"${sha}-original"`);
    expect(res.headers.get("content-length")).toBe(String(trialBytes.length));
  });

  it("preview and thumb are image/webp with their own ETags", async () => {
    for (const variant of ["preview", "thumb"]) {
      const res = await variantRequest(artist, trialId, variant);
      expect(res.headers.get("content-type")).toBe("image/webp");
      expect(res.headers.get("cache-control")).toBe("private, no-store");
      expect(res.headers.get("content-disposition")).toBe(`inline; filename="still-${trialId}.webp"`);
      const meta = await sharp(Buffer.from(await res.arrayBuffer())).metadata();
      expect(meta.format).toBe("webp");
      expect(res.headers.get("etag")).toMatch(new RegExp(`-${variant}"$`));
    }
  });

  it("If-None-Match with the ETag → 304 without a body, still private", async () => {
    const first = await variantRequest(artist, trialId, "preview");
    const etag = first.headers.get("etag")!;
    await first.arrayBuffer();
    const again = await variantRequest(artist, trialId, "preview", { "if-none-match": etag });
    expect(again.status).toBe(304);
    expect(again.headers.get("cache-control")).toBe("private, no-store");
    expect((await again.arrayBuffer()).byteLength).toBe(0);
    // Someone not allowed to see it gets 404 even with a matching tag.
    expect((await variantRequest(otherArtist, trialId, "preview", { "if-none-match": etag })).status).toBe(404);
  });

  it("a lost preview is made again from the original", async () => {
    const sha = crypto.createHash("sha256").update(trialBytes).digest("hex");
    fs.rmSync(path.join(dir, "previews", sha.slice(0, 2), `${sha}.webp`));
    const res = await variantRequest(artist, trialId, "preview");
    expect(res.status).toBe(200);
    expect((await sharp(Buffer.from(await res.arrayBuffer())).metadata()).width).toBe(30);
  });
});

describe("pixel values", () => {
  it("16-bit: exact stored code values and 0..1 floats", async () => {
    const samples = [40000, 12345, 1, 65535, 0, 300];
    const id = (await upload(artist, await png16(2, 1, samples), { owner: "trial" })).id as string;
    const at = async (x: number, y: number, who = artist) =>
      getPixel(new Request(`http://plateroom.test/api/stills/${id}/pixel?x=${x}&y=${y}`, { headers: who.auth }), ctx({ id }));
    const p0 = (await (await at(0, 0)).json()) as { values: number[]; floats: number[]; max: number };
    expect(p0.values).toEqual([40000, 12345, 1]);
    expect(p0.max).toBe(65535);
    expect(p0.floats[0]).toBeCloseTo(40000 / 65535, 12);
    const p1 = (await (await at(1, 0)).json()) as { values: number[] };
    expect(p1.values).toEqual([65535, 0, 300]);
    expect((await at(2, 0)).status).toBe(400);
    expect((await at(0, 0, otherArtist)).status).toBe(404);
  });

  it("8-bit: the same values sharp decodes", async () => {
    const bytes = await noisePng(5, 4);
    const id = (await upload(artist, bytes, { owner: "trial" })).id as string;
    // Reference: sharp's own decode of the uploaded bytes.
    const { data } = await sharp(bytes).raw().toBuffer({ resolveWithObject: true });
    const res = await getPixel(new Request(`http://plateroom.test/api/stills/${id}/pixel?x=3&y=2`, { headers: artist.auth }), ctx({ id }));
    const body = (await res.json()) as { values: number[]; max: number };
    const i = (2 * 5 + 3) * 3;
    expect(body.values).toEqual([data[i], data[i + 1], data[i + 2]]);
    expect(body.max).toBe(255);
  });

  it("float TIFF: accepted as 32-bit, values read back exactly as stored", async () => {
    // Values exactly representable in IEEE 754 binary32, including one above 1.0 (scene-referred).
    const samples = [0.25, 0.5, 1.5, 0, 0.125, 0.75];
    const created = await upload(artist, floatTiff(2, 1, samples), { owner: "trial" });
    expect(created).toMatchObject({ format: "tiff", bitDepth: 32, channels: 3, width: 2, height: 1 });
    const id = created.id as string;
    const res = await getPixel(new Request(`http://plateroom.test/api/stills/${id}/pixel?x=1&y=0`, { headers: artist.auth }), ctx({ id }));
    expect(await res.json()).toMatchObject({ values: [0, 0.125, 0.75], max: 1, bitDepth: 32 });
    const original = await variantRequest(artist, id, "original");
    expect(original.headers.get("content-type")).toBe("image/tiff");
    expect(original.headers.get("content-disposition")).toBe(`inline; filename="still-${id}.tif"`);
  });
});
