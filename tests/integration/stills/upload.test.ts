import crypto from "node:crypto";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { count } from "drizzle-orm";
import sharp from "sharp";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { POST } from "@/app/api/stills/route";
import { getDb } from "@/db/client";
import { stills } from "@/db/schema";
import { env } from "@/lib/env";
import { animated, cmykJpeg, corruptJpeg, jpegWithExif, noisePng, png16, pngBomb, readIhdr, solidPng, truncatedPng } from "./images";
import { createPerson, createTechnique, ctx, filesUnder, uploadRequest, type TestPerson } from "./factories";

let dir: string;
let senior: TestPerson;
let artist: TestPerson;
let techniqueSlug: string;

beforeAll(async () => {
  // Route handlers read the folder from env at call time; point it at a throwaway folder.
  dir = fs.mkdtempSync(path.join(os.tmpdir(), "plateroom-stills-"));
  env.PLATEROOM_UPLOADS_DIR = dir;
  senior = await createPerson("senior");
  artist = await createPerson("artist");
  techniqueSlug = (await createTechnique(senior.user, { approved: true })).slug;
});

afterAll(() => {
  fs.rmSync(dir, { recursive: true, force: true });
});

async function stillCount(): Promise<number> {
  const [row] = await getDb().select({ n: count() }).from(stills);
  return row?.n ?? 0;
}

async function upload(person: TestPerson | null, bytes: Uint8Array, name: string, fields: Record<string, string> = {}, type?: string) {
  const req = uploadRequest({ bytes, name, type }, { alt: "Backing screen with tracking markers", owner: "trial", ...fields }, person?.auth ?? {});
  const res = await POST(req, ctx({}));
  return { res, body: (await res.json()) as Record<string, unknown> & { error?: { code: string; message: string } } };
}

describe("POST /api/stills refuses what is not an accepted still, and leaves nothing behind", () => {
  // Expected statuses: shared/API.md error table (400 bad input, 413 too large, 415 type).
  const cases: { label: string; build: () => Promise<Buffer> | Buffer; name: string; type?: string; status: number; code: string }[] = [
    {
      label: "SVG",
      build: () => Buffer.from('<svg xmlns="http://www.w3.org/2000/svg" width="10" height="10"><rect width="10" height="10"/></svg>'),
      name: "plate.svg",
      type: "image/svg+xml",
      status: 415,
      code: "unsupported_type",
    },
    {
      label: "HTML named .png",
      build: () => Buffer.from("<!doctype html><html><body><script>alert(1)</script></body></html>"),
      name: "plate.png",
      type: "image/png",
      status: 415,
      code: "unsupported_type",
    },
    { label: "PDF header", build: () => Buffer.from("%PDF-1.7\n1 0 obj <<>> endobj\ntrailer <<>>\n%%EOF\n"), name: "plate.pdf", status: 415, code: "unsupported_type" },
    { label: "text named .png", build: () => Buffer.from("just some notes about the plate\n"), name: "notes.png", type: "image/png", status: 415, code: "unsupported_type" },
    { label: "truncated PNG", build: truncatedPng, name: "cut.png", type: "image/png", status: 400, code: "validation_failed" },
    { label: "corrupt JPEG", build: corruptJpeg, name: "bad.jpg", type: "image/jpeg", status: 400, code: "validation_failed" },
    { label: "empty file", build: () => Buffer.alloc(0), name: "empty.png", type: "image/png", status: 400, code: "validation_failed" },
    { label: "decompression bomb (256 MP PNG)", build: pngBomb, name: "bomb.png", type: "image/png", status: 413, code: "too_large" },
    { label: "CMYK JPEG", build: cmykJpeg, name: "print.jpg", type: "image/jpeg", status: 415, code: "unsupported_type" },
    { label: "animated WebP", build: () => animated("webp"), name: "anim.webp", type: "image/webp", status: 415, code: "unsupported_type" },
    { label: "animated GIF", build: () => animated("gif"), name: "anim.gif", type: "image/gif", status: 415, code: "unsupported_type" },
  ];

  for (const c of cases) {
    it(`${c.label} → ${c.status}`, async () => {
      const before = await stillCount();
      const { res, body } = await upload(senior, await c.build(), c.name, {}, c.type);
      expect(res.status).toBe(c.status);
      expect(body.error?.code).toBe(c.code);
      expect(typeof body.error?.message).toBe("string");
      expect(body.error?.message).not.toMatch(/vips|libpng|at \w+ \(/i);
      expect(filesUnder(dir)).toEqual([]);
      expect(await stillCount()).toBe(before);
    });
  }

  it("a file without alt text → 400 naming the field, nothing stored", async () => {
    const req = uploadRequest({ bytes: await solidPng(8, 8), name: "a.png" }, { owner: "trial" }, senior.auth);
    const res = await POST(req, ctx({}));
    expect(res.status).toBe(400);
    const body = (await res.json()) as { error: { fields: Record<string, string> } };
    expect(body.error.fields.alt).toBeTruthy();
    expect(filesUnder(dir)).toEqual([]);
  });

  it("no file part → 400", async () => {
    const res = await POST(uploadRequest(null, { alt: "x", owner: "trial" }, senior.auth), ctx({}));
    expect(res.status).toBe(400);
  });

  it("a JSON body instead of multipart → 415", async () => {
    const req = new Request("http://plateroom.test/api/stills", { method: "POST", body: "{}", headers: { ...senior.auth, "content-type": "application/json" } });
    expect((await POST(req, ctx({}))).status).toBe(415);
  });
});

describe("POST /api/stills accepts PNG, JPEG, TIFF and WebP at 8 and 16 bits", () => {
  it("8-bit RGB PNG: size, depth and hash match the bytes", async () => {
    const bytes = await noisePng(40, 30);
    const { res, body } = await upload(senior, bytes, "plate_v001.png", { owner: "technique", technique: techniqueSlug, role: "before" });
    expect(res.status).toBe(201);
    // PNG spec §11.2.2: IHDR width, height and bit depth are the file's own declaration.
    const ihdr = readIhdr(bytes);
    expect(body).toMatchObject({ width: ihdr.width, height: ihdr.height, bitDepth: ihdr.bitDepth, format: "png", channels: 3 });
    // FIPS 180-4 SHA-256 through Node's crypto, over the exact uploaded bytes.
    expect(body.sha256).toBe(crypto.createHash("sha256").update(bytes).digest("hex"));
    const sha = body.sha256 as string;
    expect(fs.readFileSync(path.join(dir, "originals", sha.slice(0, 2), `${sha}.bin`)).equals(bytes)).toBe(true);
  });

  it("16-bit RGB PNG is recorded as 16 bits per channel", async () => {
    const bytes = await png16(2, 1, [40000, 12345, 1, 65535, 0, 300]);
    expect(readIhdr(bytes).bitDepth).toBe(16);
    const { res, body } = await upload(artist, bytes, "deep.png");
    expect(res.status).toBe(201);
    expect(body).toMatchObject({ bitDepth: 16, channels: 3, format: "png", width: 2, height: 1 });
  });

  it("grey, RGBA, JPEG, TIFF and WebP are accepted with their channel counts", async () => {
    const base = sharp({ create: { width: 12, height: 10, channels: 3, background: { r: 90, g: 140, b: 60 } } });
    const variants: [string, Buffer, Record<string, unknown>][] = [
      ["grey.png", await base.clone().toColourspace("b-w").png().toBuffer(), { channels: 1, bitDepth: 8, format: "png" }],
      ["rgba.png", await base.clone().ensureAlpha(0.5).png().toBuffer(), { channels: 4, bitDepth: 8, format: "png" }],
      ["plate.jpg", await base.clone().jpeg().toBuffer(), { channels: 3, bitDepth: 8, format: "jpeg" }],
      ["plate.tif", await base.clone().tiff().toBuffer(), { channels: 3, bitDepth: 8, format: "tiff" }],
      ["plate.webp", await base.clone().webp({ lossless: true }).toBuffer(), { channels: 3, bitDepth: 8, format: "webp" }],
    ];
    for (const [name, bytes, expected] of variants) {
      const { res, body } = await upload(artist, bytes, name);
      expect(res.status, name).toBe(201);
      expect(body, name).toMatchObject({ width: 12, height: 10, ...expected });
    }
  });

  it("a PNG named .txt with a text MIME type is judged by its content and accepted", async () => {
    const { res } = await upload(artist, await solidPng(6, 6), "not-really.txt", {}, "text/plain");
    expect(res.status).toBe(201);
  });
});

describe("content-addressed storage", () => {
  it("identical uploads get two rows and share one stored file", async () => {
    const bytes = await noisePng(24, 24);
    const sha = crypto.createHash("sha256").update(bytes).digest("hex");
    const a = await upload(artist, bytes, "one.png");
    const b = await upload(senior, bytes, "two.png");
    expect(a.res.status).toBe(201);
    expect(b.res.status).toBe(201);
    expect(a.body.id).not.toBe(b.body.id);
    expect(a.body.sha256).toBe(sha);
    expect(b.body.sha256).toBe(sha);
    expect(filesUnder(dir).filter((f) => f.includes(sha))).toEqual([
      path.join("originals", sha.slice(0, 2), `${sha}.bin`),
      path.join("previews", sha.slice(0, 2), `${sha}.webp`),
      path.join("thumbs", sha.slice(0, 2), `${sha}.webp`),
    ]);
  });

  it("20 parallel uploads of the same bytes store the file once and leave no temp files", async () => {
    const bytes = await noisePng(64, 48);
    const sha = crypto.createHash("sha256").update(bytes).digest("hex");
    const before = await stillCount();
    const results = await Promise.all(Array.from({ length: 20 }, (_, i) => upload(artist, bytes, `burst-${i}.png`)));
    expect(results.map((r) => r.res.status)).toEqual(Array(20).fill(201));
    expect(new Set(results.map((r) => r.body.id)).size).toBe(20);
    expect(await stillCount()).toBe(before + 20);
    expect(filesUnder(dir).filter((f) => f.startsWith("originals") && f.includes(sha))).toHaveLength(1);
    expect(filesUnder(dir).filter((f) => f.startsWith("tmp") || f.endsWith(".tmp"))).toEqual([]);
  });

  it("previews are WebP within 2048 px and thumbnails within 400 px, metadata stripped", async () => {
    const wide = await solidPng(3000, 200);
    const { body } = await upload(artist, wide, "wide.png");
    const sha = body.sha256 as string;
    const preview = await sharp(path.join(dir, "previews", sha.slice(0, 2), `${sha}.webp`)).metadata();
    const thumb = await sharp(path.join(dir, "thumbs", sha.slice(0, 2), `${sha}.webp`)).metadata();
    expect(preview).toMatchObject({ format: "webp", width: 2048 });
    expect(thumb).toMatchObject({ format: "webp", width: 400 });

    const exifJpeg = await jpegWithExif();
    expect((await sharp(exifJpeg).metadata()).exif).toBeDefined();
    const { body: b2 } = await upload(artist, exifJpeg, "camera.jpg");
    const sha2 = b2.sha256 as string;
    for (const folder of ["previews", "thumbs"]) {
      const m = await sharp(path.join(dir, folder, sha2.slice(0, 2), `${sha2}.webp`)).metadata();
      expect(m.exif, folder).toBeUndefined();
      expect(m.xmp, folder).toBeUndefined();
      expect(m.icc, folder).toBeUndefined();
    }
    // The original is stored without its EXIF (shared/PRODUCT.md, "Confidentiality"); strip-metadata.test.ts checks the pixels.
    const original = fs.readFileSync(path.join(dir, "originals", sha2.slice(0, 2), `${sha2}.bin`));
    expect((await sharp(original).metadata()).exif).toBeUndefined();
    expect(crypto.createHash("sha256").update(original).digest("hex")).toBe(sha2);
  });
});

describe("size limit", () => {
  it("is enforced while streaming: the body is abandoned early, nothing is stored", async () => {
    const saved = env.PLATEROOM_MAX_UPLOAD_BYTES;
    env.PLATEROOM_MAX_UPLOAD_BYTES = 256 * 1024;
    try {
      const before = await stillCount();
      const boundary = "----plateroom-test-boundary";
      const head = Buffer.from(
        `--${boundary}\r\nContent-Disposition: form-data; name="alt"\r\n\r\nA big plate\r\n` +
          `--${boundary}\r\nContent-Disposition: form-data; name="owner"\r\n\r\ntrial\r\n` +
          `--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="big.png"\r\nContent-Type: image/png\r\n\r\n`,
      );
      const png = await solidPng(8, 8);
      const chunk = Buffer.alloc(64 * 1024, 7);
      const totalChunks = 160; // 10 MB if read to the end
      let pulled = 0;
      let cancelled = false;
      const body = new ReadableStream<Uint8Array>({
        pull(controller) {
          if (pulled === 0) controller.enqueue(Buffer.concat([head, png]));
          else if (pulled <= totalChunks) controller.enqueue(chunk);
          else {
            controller.enqueue(Buffer.from(`\r\n--${boundary}--\r\n`));
            controller.close();
          }
          pulled++;
        },
        cancel() {
          cancelled = true;
        },
      });
      const req = new Request("http://plateroom.test/api/stills", {
        method: "POST",
        body,
        headers: { ...artist.auth, "content-type": `multipart/form-data; boundary=${boundary}` },
        duplex: "half",
      } as RequestInit & { duplex: "half" });
      const res = await POST(req, ctx({}));
      expect(res.status).toBe(413);
      expect(((await res.json()) as { error: { code: string } }).error.code).toBe("too_large");
      // 256 KB is 4 chunks of 64 KB; reading stopped long before the 10 MB end.
      expect(pulled).toBeLessThan(20);
      expect(cancelled).toBe(true);
      expect(filesUnder(dir).filter((f) => f.startsWith("tmp"))).toEqual([]);
      expect(await stillCount()).toBe(before);
    } finally {
      env.PLATEROOM_MAX_UPLOAD_BYTES = saved;
    }
  });

  it("a Content-Length above the limit is refused before the body is read", async () => {
    let pulled = 0;
    const body = new ReadableStream<Uint8Array>({
      pull(controller) {
        pulled++;
        controller.enqueue(new Uint8Array(1024));
      },
    });
    const req = new Request("http://plateroom.test/api/stills", {
      method: "POST",
      body,
      headers: { ...artist.auth, "content-type": "multipart/form-data; boundary=x", "content-length": String(env.PLATEROOM_MAX_UPLOAD_BYTES + 10 * 1024 * 1024) },
      duplex: "half",
    } as RequestInit & { duplex: "half" });
    const res = await POST(req, ctx({}));
    expect(res.status).toBe(413);
    expect(pulled).toBeLessThanOrEqual(1);
  });

  it("a file just over a small limit → 413; the same file under it → 201", async () => {
    const bytes = await noisePng(120, 100);
    const saved = env.PLATEROOM_MAX_UPLOAD_BYTES;
    try {
      env.PLATEROOM_MAX_UPLOAD_BYTES = bytes.length - 1;
      const over = await upload(artist, bytes, "n.png");
      expect(over.res.status).toBe(413);
      env.PLATEROOM_MAX_UPLOAD_BYTES = bytes.length;
      const fits = await upload(artist, bytes, "n.png");
      expect(fits.res.status).toBe(201);
    } finally {
      env.PLATEROOM_MAX_UPLOAD_BYTES = saved;
    }
  });
});
