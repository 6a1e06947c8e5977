import fs from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import sharp from "sharp";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { getDb } from "@/db/client";
import { stills } from "@/db/schema";
import { env } from "@/lib/env";
import { STILL_PIXEL_LIMIT } from "@/lib/stills/limits";
import { variantPath } from "@/lib/stills/storage";
import { POST as stillsPost } from "@/app/api/stills/route";
import { POST as run } from "@/app/api/lab/run/route";
import { POST as analyse } from "@/app/api/lab/analyse/route";
import { POST as sample } from "@/app/api/lab/sample/route";
import { apiRequest, params } from "@/tests/factories";
import { createPerson, filesUnder, uploadRequest, type TestPerson } from "./factories";

/*
 * OWASP File Upload Cheat Sheet ("File Content Validation": limit the size of what a file
 * decompresses to): one pixel limit, decided once, for upload and the still lab. A still the
 * upload accepts opens in every lab route; a still above the limit is refused at upload, and one
 * stored before the limit existed gets a 4xx from the lab, never a 500.
 */

let tmp = "";
let senior: TestPerson;
const ctx = params({});

/** A flat-grey PNG: millions of pixels in a few hundred kB (a decompression-bomb shape). */
const flatPng = (width: number, height: number) =>
  sharp({ create: { width, height, channels: 3, background: { r: 90, g: 128, b: 70 } } }).png({ compressionLevel: 9 }).toBuffer();

async function upload(png: Buffer) {
  return stillsPost(uploadRequest({ bytes: png, name: "plate.png", type: "image/png" }, { alt: "Invented flat plate", owner: "trial" }, senior.auth), ctx);
}

const labRoutes = (still: string) => [
  { name: "run", call: () => run(apiRequest("POST", "/api/lab/run", senior, { still, format: "png", width: 256, steps: [{ op: "matrix", m: [[1, 0, 0], [0, 1, 0], [0, 0, 1]] }] }), ctx) },
  { name: "analyse", call: () => analyse(apiRequest("POST", "/api/lab/analyse", senior, { still, width: 256, histogram: true }), ctx) },
  { name: "sample", call: () => sample(apiRequest("POST", "/api/lab/sample", senior, { still, boxes: [{ x: 10, y: 10, w: 8, h: 8 }] }), ctx) },
];

beforeAll(async () => {
  tmp = await fs.mkdtemp(path.join(os.tmpdir(), "plateroom-pixels-"));
  env.PLATEROOM_UPLOADS_DIR = path.join(tmp, "uploads");
  env.PLATEROOM_DATA_DIR = path.join(tmp, "data");
  senior = await createPerson("senior");
});

afterAll(async () => {
  if (tmp) await fs.rm(tmp, { recursive: true, force: true });
});

describe("one pixel limit for upload and lab (OWASP File Upload Cheat Sheet)", () => {
  it("refuses a 9000 × 9000 PNG of a few hundred kB at upload with 413, naming its size and the limit", async () => {
    const png = await flatPng(9000, 9000);
    expect(png.length).toBeLessThan(1024 * 1024);
    expect(9000 * 9000).toBeGreaterThan(STILL_PIXEL_LIMIT);
    const res = await upload(png);
    expect(res.status).toBe(413);
    const body = (await res.json()) as { error: { code: string; message: string } };
    expect(body.error.code).toBe("too_large");
    expect(body.error.message).toContain("9000 × 9000");
    expect(body.error.message).toContain("8192 × 8192");
    expect(filesUnder(path.join(tmp, "uploads")).filter((f) => !f.startsWith("tmp"))).toEqual([]);
  });

  it("accepts a still exactly at the limit, and every lab route answers it", { timeout: 240_000 }, async () => {
    const res = await upload(await flatPng(8192, 8192));
    expect(res.status).toBe(201);
    const { id } = (await res.json()) as { id: string };
    for (const route of labRoutes(id)) {
      const answer = await route.call();
      expect({ route: route.name, status: answer.status }).toEqual({ route: route.name, status: 200 });
    }
  });

  it("answers 400, never 500, from every lab route for a still stored before the limit existed", { timeout: 120_000 }, async () => {
    const png = await flatPng(9000, 9000);
    const sha = "9".repeat(64);
    await fs.mkdir(path.dirname(variantPath(sha, "original")), { recursive: true });
    await fs.writeFile(variantPath(sha, "original"), png);
    const [row] = await getDb()
      .insert(stills)
      .values({ sha256: sha, width: 9000, height: 9000, format: "png", bitDepth: 8, channels: 3, sizeBytes: png.length, uploaderId: senior.user.id, alt: "Old plate", owner: "trial" })
      .returning();
    for (const route of labRoutes(row!.id)) {
      const answer = await route.call();
      const body = (await answer.json()) as { error: { code: string; message: string } };
      expect({ route: route.name, status: answer.status, code: body.error.code }).toEqual({ route: route.name, status: 400, code: "validation_failed" });
      expect(body.error.message).toContain("9000 × 9000");
    }
  });
});
