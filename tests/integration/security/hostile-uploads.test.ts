import fs from "node:fs";
import path from "node:path";
import zlib from "node:zlib";
import { count } from "drizzle-orm";
import sharp from "sharp";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { GET as getVariant } from "@/app/api/stills/[id]/[variant]/route";
import { POST } from "@/app/api/stills/route";
import { getDb } from "@/db/client";
import { stills } from "@/db/schema";
import { createPerson, params, type TestPerson } from "@/tests/factories";
import { approvedTechnique, expectErrorShape, useTempFolders } from "./world";

/*
 * At least 30 hostile files through POST /api/stills (the real handler, a multipart Request,
 * a senior's bearer token). Checks follow the OWASP File Upload Cheat Sheet: the type is decided
 * by content, not name or browser MIME type; an allow-list of formats; a size and pixel limit
 * (decompression bombs); nothing refused is kept. Statuses: shared/API.md (400 bad input,
 * 413 too large, 415 unsupported type). After each refusal: no new file under the uploads
 * folder and no new stills row.
 */

let folders: ReturnType<typeof useTempFolders>;
let senior: TestPerson;
let techniqueSlug: string;

// ---- byte builders (W3C PNG 2nd ed. §5.3 chunk layout, §11.2.2 IHDR; ITU T.81 JPEG markers; from memory) ----

function crc32(buf: Buffer): number {
  return zlib.crc32(buf) >>> 0;
}

function chunk(type: string, data: Buffer, badCrc = false): Buffer {
  const len = Buffer.alloc(4);
  len.writeUInt32BE(data.length);
  const body = Buffer.concat([Buffer.from(type, "latin1"), data]);
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(badCrc ? (crc32(body) ^ 0xffffffff) >>> 0 : crc32(body));
  return Buffer.concat([len, body, crc]);
}

const PNG_SIG = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);

function ihdr(width: number, height: number, bitDepth: number, colourType: number): Buffer {
  const d = Buffer.alloc(13);
  d.writeUInt32BE(width, 0);
  d.writeUInt32BE(height, 4);
  d[8] = bitDepth;
  d[9] = colourType;
  return chunk("IHDR", d);
}

/** A grey 1-bit PNG of the declared size whose all-zero rows deflate to almost nothing. */
function zeroPng(width: number, height: number): Buffer {
  const row = 1 + Math.ceil(width / 8);
  const raw = Buffer.alloc(row * height);
  return Buffer.concat([PNG_SIG, ihdr(width, height, 1, 0), chunk("IDAT", zlib.deflateSync(raw, { level: 9 })), chunk("IEND", Buffer.alloc(0))]);
}

/** Splits a PNG into its chunks (after the signature). */
function chunks(png: Buffer): { type: string; data: Buffer }[] {
  const out: { type: string; data: Buffer }[] = [];
  for (let at = 8; at + 8 <= png.length; ) {
    const len = png.readUInt32BE(at);
    out.push({ type: png.toString("latin1", at + 4, at + 8), data: png.subarray(at + 8, at + 8 + len) });
    at += 12 + len;
  }
  return out;
}

function rebuild(parts: { type: string; data: Buffer }[]): Buffer {
  return Buffer.concat([PNG_SIG, ...parts.map((c) => chunk(c.type, c.data))]);
}

/** Inserts chunks right after IHDR. */
function withChunksAfterIhdr(png: Buffer, extra: Buffer[]): Buffer {
  const parts = chunks(png);
  return Buffer.concat([PNG_SIG, chunk("IHDR", parts[0]!.data), ...extra, ...parts.slice(1).map((c) => chunk(c.type, c.data))]);
}

async function plainPng(width = 32, height = 24): Promise<Buffer> {
  return sharp({ create: { width, height, channels: 3, background: { r: 90, g: 140, b: 60 }, noise: { type: "gaussian", mean: 128, sigma: 30 } } })
    .png()
    .toBuffer();
}

async function plainJpeg(): Promise<Buffer> {
  return sharp({ create: { width: 48, height: 32, channels: 3, background: "grey", noise: { type: "gaussian", mean: 128, sigma: 30 } } })
    .jpeg()
    .toBuffer();
}

/** A JPEG whose SOF0 frame header (ITU T.81 §B.2.2) declares width × height. */
function jpegWithDims(jpeg: Buffer, width: number, height: number): Buffer {
  const bad = Buffer.from(jpeg);
  for (let i = 2; i < bad.length - 9; i++) {
    if (bad[i] === 0xff && (bad[i + 1] === 0xc0 || bad[i + 1] === 0xc2)) {
      bad.writeUInt16BE(height, i + 5);
      bad.writeUInt16BE(width, i + 7);
      return bad;
    }
  }
  throw new Error("no SOF marker");
}

/** An extended WebP (VP8X, canvas sizes stored minus one in 24 bits) declaring a huge canvas, with a tiny VP8L frame. */
async function webpHugeCanvas(): Promise<Buffer> {
  const small = await sharp({ create: { width: 4, height: 4, channels: 3, background: "red" } }).webp({ lossless: true }).toBuffer();
  const frame = small.subarray(12); // the VP8L chunk of a simple-format file
  const vp8x = Buffer.alloc(18);
  vp8x.write("VP8X", 0, "latin1");
  vp8x.writeUInt32LE(10, 4);
  const w = 16383, h = 16383; // 16384 × 16384 = 268 megapixels
  vp8x.writeUIntLE(w, 12, 3);
  vp8x.writeUIntLE(h, 15, 3);
  const body = Buffer.concat([Buffer.from("WEBP", "latin1"), vp8x, frame]);
  const head = Buffer.alloc(8);
  head.write("RIFF", 0, "latin1");
  head.writeUInt32LE(body.length, 4);
  return Buffer.concat([head, body]);
}

function bmp2x2(): Buffer {
  const b = Buffer.alloc(70);
  b.write("BM", 0, "latin1");
  b.writeUInt32LE(70, 2);
  b.writeUInt32LE(54, 10);
  b.writeUInt32LE(40, 14);
  b.writeInt32LE(2, 18);
  b.writeInt32LE(2, 22);
  b.writeUInt16LE(1, 26);
  b.writeUInt16LE(24, 28);
  b.writeUInt32LE(16, 34);
  return b;
}

async function ico(): Promise<Buffer> {
  const png = await plainPng(16, 16);
  const dir = Buffer.alloc(22);
  dir.writeUInt16LE(0, 0);
  dir.writeUInt16LE(1, 2);
  dir.writeUInt16LE(1, 4);
  dir[6] = 16;
  dir[7] = 16;
  dir.writeUInt16LE(1, 10);
  dir.writeUInt16LE(32, 12);
  dir.writeUInt32LE(png.length, 14);
  dir.writeUInt32LE(22, 18);
  return Buffer.concat([dir, png]);
}

/** An EXIF APP1 whose IFD0 claims 65535 entries and points back at itself (a loop). */
async function exifBomb(): Promise<Buffer> {
  const jpeg = await plainJpeg();
  const tiff = Buffer.alloc(8 + 2 + 12 + 4);
  tiff.write("II", 0, "latin1");
  tiff.writeUInt16LE(42, 2);
  tiff.writeUInt32LE(8, 4);
  tiff.writeUInt16LE(0xffff, 8);
  tiff.writeUInt16LE(0x8769, 10); // ExifIFD pointer …
  tiff.writeUInt16LE(4, 12);
  tiff.writeUInt32LE(1, 14);
  tiff.writeUInt32LE(8, 18); // … back to IFD0
  tiff.writeUInt32LE(8, 22); // next IFD: itself
  const payload = Buffer.concat([Buffer.from("Exif\0\0", "latin1"), tiff]);
  const app1 = Buffer.alloc(4);
  app1[0] = 0xff;
  app1[1] = 0xe1;
  app1.writeUInt16BE(payload.length + 2, 2);
  return Buffer.concat([jpeg.subarray(0, 2), app1, payload, jpeg.subarray(2)]);
}

/** An APNG: acTL + fcTL before the image data (the default image is frame 0), then a second frame. */
async function apng(): Promise<Buffer> {
  const png = await plainPng(16, 16);
  const parts = chunks(png);
  const idat = parts.find((c) => c.type === "IDAT")!.data;
  const actl = Buffer.alloc(8);
  actl.writeUInt32BE(2, 0);
  const fctl = (seq: number) => {
    const d = Buffer.alloc(26);
    d.writeUInt32BE(seq, 0);
    d.writeUInt32BE(16, 4);
    d.writeUInt32BE(16, 8);
    d.writeUInt16BE(1, 20);
    d.writeUInt16BE(10, 22);
    return d;
  };
  const fdat = Buffer.concat([Buffer.from([0, 0, 0, 2]), idat]);
  return rebuild([parts[0]!, { type: "acTL", data: actl }, { type: "fcTL", data: fctl(0) }, ...parts.filter((c) => c.type === "IDAT"), { type: "fcTL", data: fctl(1) }, { type: "fdAT", data: fdat }, { type: "IEND", data: Buffer.alloc(0) }]);
}

async function multiPageTiff(pages: number): Promise<Buffer> {
  const frames = await Promise.all(Array.from({ length: pages }, (_, i) => sharp({ create: { width: 8, height: 8, channels: 3, background: { r: i * 20, g: 0, b: 0 } } }).png().toBuffer()));
  return sharp(frames, { join: { animated: true } }).tiff().toBuffer();
}

type Expect = { status: 201 } | { status: 400 | 413 | 415; code?: string };
type HostileCase = { label: string; name: string; type?: string; build: () => Promise<Buffer> | Buffer; expect: Expect; why?: string };

const refused = (status: 400 | 413 | 415): Expect => ({ status, code: { 400: "validation_failed", 413: "too_large", 415: "unsupported_type" }[status] });

const CASES: HostileCase[] = [
  // Polyglots.
  {
    label: "PNG with an HTML/JS payload appended",
    name: "plate.png",
    build: async () => Buffer.concat([await plainPng(), Buffer.from("<html><script>alert(document.cookie)</script></html>")]),
    expect: { status: 201 },
    why: "A complete PNG; bytes after IEND are never decoded. Served as image/png with nosniff (checked below), previews re-encoded.",
  },
  {
    label: "GIFAR-like: PNG with a zip (jar) tail",
    name: "plate.png",
    build: async () => Buffer.concat([await plainPng(), Buffer.from("PK\u0003\u0004\u0014\u0000\u0000\u0000META-INF/MANIFEST.MFPK\u0005\u0006", "latin1"), Buffer.alloc(18)]),
    expect: { status: 201 },
    why: "Same as above: a valid PNG; the tail is inert bytes in a file only ever served as image/png with nosniff.",
  },
  { label: "PDF behind a PNG signature", name: "plate.png", build: () => Buffer.concat([PNG_SIG, Buffer.from("%PDF-1.4\n1 0 obj<</Type/Catalog>>endobj\n%%EOF")]), expect: refused(400) },
  {
    label: "SVG with <script> named .png",
    name: "plate.png",
    type: "image/png",
    build: () => Buffer.from('<svg xmlns="http://www.w3.org/2000/svg" width="10" height="10"><script>alert(1)</script></svg>'),
    expect: refused(415),
  },
  { label: "HTML page", name: "plate.html", type: "text/html", build: () => Buffer.from("<!doctype html><html><body onload=alert(1)></body></html>"), expect: refused(415) },
  { label: "plain text named .png", name: "plate.png", type: "image/png", build: () => Buffer.from("this is not an image\n"), expect: refused(415) },

  // Decompression bombs and huge declared sizes.
  { label: "PNG IHDR declaring 100000 × 100000", name: "bomb.png", build: () => Buffer.concat([PNG_SIG, ihdr(100000, 100000, 8, 2), chunk("IDAT", zlib.deflateSync(Buffer.alloc(64))), chunk("IEND", Buffer.alloc(0))]), expect: refused(413) },
  { label: "highly compressible 20000 × 20000 PNG", name: "bomb.png", build: () => zeroPng(20000, 20000), expect: refused(413) },
  { label: "JPEG SOF declaring 65000 × 65000", name: "bomb.jpg", build: async () => jpegWithDims(await plainJpeg(), 65000, 65000), expect: refused(413) },
  {
    label: "WebP VP8X declaring a 16384 × 16384 canvas",
    name: "bomb.webp",
    build: () => webpHugeCanvas(),
    // libwebp refuses a canvas that disagrees with its 4 × 4 frame before allocating anything.
    expect: refused(400),
  },

  // Truncated at several cut points.
  { label: "PNG cut after the signature", name: "cut.png", build: async () => (await plainPng()).subarray(0, 8), expect: refused(400) },
  { label: "PNG cut inside IHDR", name: "cut.png", build: async () => (await plainPng()).subarray(0, 20), expect: refused(400) },
  { label: "PNG cut inside IDAT", name: "cut.png", build: async () => { const b = await plainPng(64, 64); return b.subarray(0, Math.floor(b.length / 2)); }, expect: refused(400) },
  {
    label: "PNG missing only IEND",
    name: "cut.png",
    build: async () => { const b = await plainPng(); return b.subarray(0, b.length - 12); },
    expect: { status: 201 },
    why: "Every row of image data is present and decodes; only the empty end marker is missing, which the decoder tolerates.",
  },
  { label: "JPEG cut after the header", name: "cut.jpg", build: async () => (await plainJpeg()).subarray(0, 200), expect: refused(400) },
  { label: "JPEG cut inside the scan", name: "cut.jpg", build: async () => { const b = await plainJpeg(); return b.subarray(0, b.length - 300); }, expect: refused(400) },
  { label: "WebP cut in half", name: "cut.webp", build: async () => { const b = await sharp(await plainPng()).webp().toBuffer(); return b.subarray(0, Math.floor(b.length / 2)); }, expect: { status: 400 } },

  // Wrong magic, nothing, almost nothing.
  { label: "PNG with its first byte changed", name: "plate.png", build: async () => { const b = Buffer.from(await plainPng()); b[0] = 0x88; return b; }, expect: refused(415) },
  { label: "JPEG body behind a PNG signature", name: "plate.png", build: async () => Buffer.concat([PNG_SIG, (await plainJpeg()).subarray(2)]), expect: refused(400) },
  { label: "zero bytes", name: "empty.png", build: () => Buffer.alloc(0), expect: refused(400) },
  { label: "one byte", name: "one.png", build: () => Buffer.from([0x89]), expect: refused(415) },
  { label: "PNG signature then a megabyte of zeros", name: "zeros.png", build: () => Buffer.concat([PNG_SIG, Buffer.alloc(1 << 20)]), expect: refused(400) },
  { label: "PNG with a bad IDAT CRC", name: "crc.png", build: async () => { const p = chunks(await plainPng()); return Buffer.concat([PNG_SIG, ...p.map((c) => chunk(c.type, c.data, c.type === "IDAT"))]); }, expect: refused(400) },

  // Colour models and animation.
  { label: "CMYK JPEG", name: "cmyk.jpg", build: async () => sharp(await plainPng()).toColourspace("cmyk").jpeg().toBuffer(), expect: refused(415) },
  {
    label: "palette PNG",
    name: "palette.png",
    build: async () => sharp(await plainPng()).png({ palette: true, colours: 16 }).toBuffer(),
    expect: { status: 201 },
    why: "libvips expands a palette to RGB on decode (lib/stills/inspect.ts sees srgb, 3 channels): an ordinary 8-bit RGB still.",
  },
  { label: "animated GIF", name: "anim.gif", build: async () => sharp([await plainPng(16, 16), await plainPng(16, 16)], { join: { animated: true } }).gif().toBuffer(), expect: refused(415) },
  { label: "animated WebP", name: "anim.webp", build: async () => sharp([await plainPng(16, 16), await plainPng(16, 16)], { join: { animated: true } }).webp().toBuffer(), expect: refused(415) },
  {
    label: "APNG (two frames)",
    name: "anim.png",
    build: () => apng(),
    expect: { status: 201 },
    why: "The PNG decoder ignores the animation chunks and reads the default image, one 16 × 16 frame: a single still, as for any PNG viewer without APNG support.",
  },
  { label: "TIFF with 12 pages", name: "pages.tif", build: () => multiPageTiff(12), expect: refused(415) },
  {
    label: "16-bit grey + alpha PNG",
    name: "grey16a.png",
    build: async () => sharp(Buffer.from(new Uint16Array(32 * 24 * 2).map((_, i) => (i * 977) % 65536).buffer), { raw: { width: 32, height: 24, channels: 2, premultiplied: false } }).toColourspace("grey16").png().toBuffer(),
    expect: { status: 201 },
    why: "Grey with alpha at 16 bits is on the allow-list (grey16, 2 channels): plates and mattes come this way.",
  },

  // Metadata abuse.
  { label: "PNG with a 6 MB tEXt chunk", name: "meta.png", build: async () => withChunksAfterIhdr(await plainPng(), [chunk("tEXt", Buffer.concat([Buffer.from("Comment\0"), Buffer.alloc(6 << 20, 0x41)]))]), expect: { status: 201 }, why: "Under the size limit; text chunks are not decoded as pixels and previews are re-encoded without metadata." },
  { label: "PNG with a zTXt chunk inflating to 200 MB", name: "ztxt.png", build: async () => withChunksAfterIhdr(await plainPng(), [chunk("zTXt", Buffer.concat([Buffer.from("Comment\0\0"), zlib.deflateSync(Buffer.alloc(200 << 20), { level: 9 })]))]), expect: { status: 201 }, why: "Accepted quickly (the test's timeout bounds it): compressed text is not inflated by the decoder's pixel path." },
  { label: "JPEG with a looping 65535-entry EXIF IFD", name: "exif.jpg", build: () => exifBomb(), expect: { status: 201 }, why: "The pixels are a valid JPEG; the broken EXIF is skipped (no hang: the test's timeout bounds it) and previews drop metadata." },

  // Other formats off the allow-list.
  { label: "BMP", name: "plate.bmp", build: () => bmp2x2(), expect: refused(415) },
  { label: "ICO", name: "plate.ico", build: () => ico(), expect: refused(415) },
  { label: "HEIC-like ftyp header", name: "plate.heic", build: () => Buffer.concat([Buffer.from([0, 0, 0, 0x18]), Buffer.from("ftypheic\0\0\0\0mif1heic", "latin1"), Buffer.alloc(64)]), expect: refused(415) },
  { label: "GIF named .png", name: "plate.png", type: "image/png", build: async () => sharp(await plainPng(8, 8)).gif().toBuffer(), expect: refused(415) },
  { label: "PSD header", name: "plate.psd", build: () => Buffer.concat([Buffer.from("8BPS", "latin1"), Buffer.alloc(64)]), expect: refused(415) },
];

function filesUnder(dir: string): string[] {
  if (!fs.existsSync(dir)) return [];
  return fs
    .readdirSync(dir, { recursive: true, withFileTypes: true })
    .filter((e) => e.isFile())
    .map((e) => path.relative(dir, path.join(e.parentPath, e.name)))
    .sort();
}

async function stillRows(): Promise<number> {
  const [row] = await getDb().select({ n: count() }).from(stills);
  return row?.n ?? 0;
}

function uploadRequest(bytes: Buffer, name: string, type = "application/octet-stream", fields: Record<string, string> = {}): Request {
  const form = new FormData();
  form.set("file", new Blob([new Uint8Array(bytes)], { type }), name);
  form.set("alt", "Hostile upload");
  form.set("technique", techniqueSlug);
  for (const [k, v] of Object.entries(fields)) form.set(k, v);
  return new Request("http://localhost/api/stills", { method: "POST", body: form, headers: { Authorization: `Bearer ${senior.token}` } });
}

beforeAll(async () => {
  folders = useTempFolders();
  senior = await createPerson("senior");
  const lead = await createPerson("lead");
  techniqueSlug = await approvedTechnique(senior, lead);
}, 60_000);

afterAll(() => folders?.cleanup());

describe("hostile files through POST /api/stills (OWASP File Upload Cheat Sheet)", () => {
  it("has at least 30 hostile files", () => {
    expect(CASES.length).toBeGreaterThanOrEqual(30);
  });

  for (const c of CASES) {
    it(`${c.label} → ${c.expect.status}`, { timeout: 60_000 }, async () => {
      const bytes = await c.build();
      const filesBefore = filesUnder(folders.uploads).filter((f) => !f.startsWith("tmp"));
      const rowsBefore = await stillRows();
      const res = await POST(uploadRequest(bytes, c.name, c.type), params({}));
      const text = await res.clone().text();
      expect(res.status, `${c.label}: ${text.slice(0, 300)}`).toBe(c.expect.status);
      if (c.expect.status === 201) {
        // Accepted (why: see the case): stored under its content hash, never its name (rename on store).
        const body = JSON.parse(text) as { id: string; sha256: string };
        expect(filesUnder(folders.uploads).some((f) => f.includes(body.sha256))).toBe(true);
        expect(filesUnder(folders.uploads).some((f) => f.includes(c.name))).toBe(false);
        expect(await stillRows()).toBe(rowsBefore + 1);
        // Served back as an image with nosniff, so any appended payload is never read as HTML.
        const original = await getVariant(new Request(`http://localhost/api/stills/${body.id}/original`, { headers: { Authorization: `Bearer ${senior.token}` } }), params({ id: body.id, variant: "original" }));
        expect(original.status).toBe(200);
        expect(original.headers.get("content-type")).toMatch(/^image\/(png|jpeg|tiff|webp)/);
        expect(original.headers.get("x-content-type-options")).toBe("nosniff");
        return;
      }
      const error = await expectErrorShape(res, c.label);
      if ("code" in c.expect && c.expect.code) expect(error.code).toBe(c.expect.code);
      // Nothing refused is kept: no new stored file, no temp file, no row.
      expect(filesUnder(folders.uploads).filter((f) => !f.startsWith("tmp"))).toEqual(filesBefore);
      expect(filesUnder(path.join(folders.uploads, "tmp"))).toEqual([]);
      expect(await stillRows()).toBe(rowsBefore);
    });
  }
});

describe("hostile multipart bodies", () => {
  it("refuses two files, a wrong field, no file and NUL in the alt text, leaving nothing", async () => {
    const png = await plainPng();
    const rowsBefore = await stillRows();
    const filesBefore = filesUnder(folders.uploads).filter((f) => !f.startsWith("tmp"));

    const two = new FormData();
    two.append("file", new Blob([new Uint8Array(png)]), "a.png");
    two.append("file", new Blob([new Uint8Array(png)]), "b.png");
    two.set("alt", "x");
    const wrongField = new FormData();
    wrongField.set("image", new Blob([new Uint8Array(png)]), "a.png");
    wrongField.set("alt", "x");
    const noFile = new FormData();
    noFile.set("alt", "x");
    const auth = { Authorization: `Bearer ${senior.token}` };
    for (const [label, form] of [["two files", two], ["wrong field", wrongField], ["no file", noFile]] as const) {
      const res = await POST(new Request("http://localhost/api/stills", { method: "POST", body: form, headers: auth }), params({}));
      expect(res.status, label).toBe(400);
      await expectErrorShape(res, label);
    }
    // Not multipart at all.
    const raw = await POST(new Request("http://localhost/api/stills", { method: "POST", body: new Uint8Array(png), headers: { ...auth, "Content-Type": "image/png" } }), params({}));
    expect(raw.status).toBe(415);
    await expectErrorShape(raw, "raw body");
    // A NUL in a text field reaches no database column (PostgreSQL refuses U+0000).
    const nul = await POST(uploadRequest(png, "nul.png", "image/png", { alt: "a\u0000b", caption: "c\u0000" }), params({}));
    expect(nul.status).not.toBe(500);
    if (nul.status >= 400) await expectErrorShape(nul, "NUL alt");

    expect(filesUnder(path.join(folders.uploads, "tmp"))).toEqual([]);
    if (nul.status >= 400) {
      expect(await stillRows()).toBe(rowsBefore);
      expect(filesUnder(folders.uploads).filter((f) => !f.startsWith("tmp"))).toEqual(filesBefore);
    }
  });
});
