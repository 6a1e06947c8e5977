import fs from "node:fs";
import zlib from "node:zlib";
import { count } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { POST } from "@/app/api/stills/route";
import { getDb } from "@/db/client";
import { stills } from "@/db/schema";
import { createPerson, params, type TestPerson } from "@/tests/factories";
import { describeWithExrTools, halfPattern, rawExr, run, TOOLS, tempDir } from "@/tests/exr/reference";
import { filesUnder } from "@/tests/integration/stills/factories";
import { expectErrorShape, useTempFolders } from "./world";

/*
 * Hostile OpenEXR files through POST /api/stills: truncated, lying headers, offsets out of
 * range, decompression bombs, absurd dimensions, layouts the reader cannot take. Each must be
 * refused with the API's error shape and status (shared/API.md: 400 damaged, 413 too large,
 * 415 unsupported) before anything is stored, and the server must answer the next upload.
 * Byte positions follow "OpenEXR File Layout" (the OpenEXR project's documentation): magic,
 * version field, attributes name\0 type\0 int32 size value, null byte, offset table, chunks
 * (int32 y, int32 size, data).
 */

let folders: ReturnType<typeof useTempFolders>;
let senior: TestPerson;
let tmp: ReturnType<typeof tempDir>;

beforeAll(async () => {
  folders = useTempFolders();
  senior = await createPerson("senior");
  tmp = tempDir();
});
afterAll(() => {
  folders.cleanup();
  tmp.remove();
});

const W = 40, H = 20;

function base(opts: { names?: string[]; dataWindow?: [number, number, number, number] } = {}): Buffer {
  const names = opts.names ?? ["B", "G", "R"];
  const dw = opts.dataWindow ?? [0, 0, W - 1, H - 1];
  const n = (dw[2] - dw[0] + 1) * (dw[3] - dw[1] + 1);
  return rawExr({ channels: names.map((name, k) => ({ name, type: "half", samples: halfPattern(n, 90 + k) })), dataWindow: dw });
}

/** Byte offset of an attribute's value in a file made by rawExr. */
function valueAt(file: Buffer, name: string): { sizeAt: number; valueAt: number } {
  const at = file.indexOf(Buffer.from(`${name}\0`, "latin1"), 8);
  const typeEnd = file.indexOf(0, file.indexOf(0, at) + 1);
  return { sizeAt: typeEnd + 1, valueAt: typeEnd + 5 };
}

function headerEnd(file: Buffer): number {
  const { sizeAt } = valueAt(file, "screenWindowWidth");
  return sizeAt + 4 + file.readInt32LE(sizeAt) + 1;
}

function setInts(file: Buffer, at: number, ...values: number[]): Buffer {
  const out = Buffer.from(file);
  values.forEach((v, i) => out.writeInt32LE(v, at + 4 * i));
  return out;
}

/** A ZIP-compressed scan-line file whose chunks are the given zlib streams (16 lines each). */
function zipFile(stream: (rawSize: number) => Buffer): Buffer {
  const file = base();
  const header = Buffer.from(file.subarray(0, headerEnd(file)));
  header[valueAt(header, "compression").valueAt] = 3;
  const blocks = Math.ceil(H / 16);
  const table = Buffer.alloc(8 * blocks);
  const chunks: Buffer[] = [];
  let at = header.length + table.length;
  for (let b = 0; b < blocks; b++) {
    const lines = Math.min(16, H - 16 * b);
    const data = stream(lines * W * 3 * 2);
    const head = Buffer.alloc(8);
    head.writeInt32LE(16 * b, 0);
    head.writeInt32LE(data.length, 4);
    table.writeBigUInt64LE(BigInt(at), 8 * b);
    chunks.push(head, data);
    at += 8 + data.length;
  }
  return Buffer.concat([header, table, ...chunks]);
}

async function stillCount(): Promise<number> {
  const [row] = await getDb().select({ n: count() }).from(stills);
  return row?.n ?? 0;
}

async function post(bytes: Buffer): Promise<Response> {
  const form = new FormData();
  form.set("file", new Blob([new Uint8Array(bytes)]), "plate.exr");
  form.set("alt", "Hostile test file");
  form.set("owner", "trial");
  return POST(new Request("http://plateroom.test/api/stills", { method: "POST", body: form, headers: { Authorization: `Bearer ${senior.token}` } }), params({}));
}

type Case = { label: string; build: () => Buffer; status: 400 | 413 | 415; message?: RegExp };

const cases: Case[] = [
  { label: "truncated inside the header", build: () => base().subarray(0, 60), status: 400 },
  { label: "truncated inside the offset table", build: () => base().subarray(0, headerEnd(base()) + 12), status: 400 },
  { label: "truncated inside the pixel data", build: () => base().subarray(0, Math.floor(base().length * 0.7)), status: 400, message: /past the end|outside the file/ },
  { label: "channel list declaring a billion bytes", build: () => setInts(base(), valueAt(base(), "channels").sizeAt, 1_000_000_000), status: 400 },
  { label: "attribute with a negative size", build: () => setInts(base(), valueAt(base(), "pixelAspectRatio").sizeAt, -4), status: 400 },
  { label: "box2i of the wrong size", build: () => setInts(base(), valueAt(base(), "dataWindow").sizeAt, 12), status: 400 },
  { label: "unknown sample type in the channel list", build: () => setInts(base(), valueAt(base(), "channels").valueAt + 2, 7), status: 400 },
  { label: "data window 2^30 × 2^30 in a tiny file (absurd dimensions)", build: () => setInts(base(), valueAt(base(), "dataWindow").valueAt, 0, 0, 2 ** 30 - 1, 2 ** 30 - 1), status: 413 },
  { label: "data window 60 000 × 60 000 (more than the pixel limit)", build: () => setInts(base(), valueAt(base(), "dataWindow").valueAt, 0, 0, 59_999, 59_999), status: 413 },
  { label: "display window 20 000 × 20 000 around a small data window", build: () => setInts(base(), valueAt(base(), "displayWindow").valueAt, -10_000, -10_000, 9_999, 9_999), status: 413 },
  { label: "data window beyond the coordinates the layout allows", build: () => setInts(base(), valueAt(base(), "dataWindow").valueAt, -(2 ** 31) + 1, 0, 10, 10), status: 400 },
  { label: "inverted data window", build: () => setInts(base(), valueAt(base(), "dataWindow").valueAt, 30, 0, 10, 10), status: 400 },
  { label: "data window taller than the offset table and file (lying header)", build: () => setInts(base(), valueAt(base(), "dataWindow").valueAt, 0, 0, W - 1, 5000), status: 400 },
  { label: "offset pointing past the end of the file", build: () => { const f = Buffer.from(base()); f.writeBigUInt64LE(BigInt(f.length + 1000), headerEnd(f) + 8 * 3); return f; }, status: 400, message: /outside the file/ },
  { label: "offset pointing back into the header", build: () => { const f = Buffer.from(base()); f.writeBigUInt64LE(8n, headerEnd(f)); return f; }, status: 400 },
  { label: "offset of 2^63 (out of range)", build: () => { const f = Buffer.from(base()); f.writeBigUInt64LE(2n ** 63n, headerEnd(f) + 16); return f; }, status: 400 },
  { label: "zero offset (a chunk never written)", build: () => { const f = Buffer.from(base()); f.writeBigUInt64LE(0n, headerEnd(f) + 8 * 5); return f; }, status: 400, message: /incomplete/ },
  { label: "chunk claiming another line", build: () => { const f = Buffer.from(base()); const at = Number(f.readBigUInt64LE(headerEnd(f) + 8 * 2)); f.writeInt32LE(7, at); return f; }, status: 400 },
  { label: "chunk size larger than the file", build: () => { const f = Buffer.from(base()); const at = Number(f.readBigUInt64LE(headerEnd(f) + 8 * 4)); f.writeInt32LE(2 ** 30, at + 4); return f; }, status: 400 },
  {
    label: "ZIP decompression bomb (each chunk inflates to 500 × its size)",
    build: () => zipFile((raw) => zlib.deflateSync(Buffer.alloc(raw * 500), { level: 9 })),
    status: 400,
    message: /decompression bomb/,
  },
  { label: "ZIP chunk that is not a zlib stream", build: () => zipFile((raw) => Buffer.alloc(Math.floor(raw / 2), 0x55)), status: 400 },
  {
    label: "RLE decompression bomb (runs of 128 bytes per 2)",
    build: () => {
      const f = Buffer.from(base());
      f[valueAt(f, "compression").valueAt] = 1;
      const at = Number(f.readBigUInt64LE(headerEnd(f)));
      const size = f.readInt32LE(at + 4);
      const bomb = Buffer.alloc(size - 2);
      for (let i = 0; i < bomb.length; i += 2) bomb[i] = 127;
      bomb.copy(f, at + 8);
      f.writeInt32LE(bomb.length, at + 4);
      return f;
    },
    status: 400,
  },
  { label: "unknown compression number", build: () => { const f = Buffer.from(base()); f[valueAt(f, "compression").valueAt] = 42; return f; }, status: 415, message: /compression number 42/ },
  { label: "deep data flag", build: () => setInts(base(), 4, 2 | 0x800), status: 415, message: /Deep/ },
  { label: "unknown version", build: () => setInts(base(), 4, 3), status: 415 },
  { label: "unknown version flags", build: () => setInts(base(), 4, 2 | 0x10000), status: 415 },
  {
    label: "2 000 channels",
    build: () => rawExr({ channels: Array.from({ length: 2000 }, (_, i) => ({ name: `c${String(i).padStart(4, "0")}`, type: "half" as const, samples: new Uint16Array(4) })), dataWindow: [0, 0, 1, 1] }),
    status: 415,
  },
  { label: "sub-sampled channel", build: () => setInts(base(), valueAt(base(), "channels").valueAt + 2 + 8, 2, 2), status: 415, message: /sub-sampled/ },
  { label: "no magic number (a PNG-named file of text)", build: () => Buffer.from("v/1\u0001 not really"), status: 415 },
];

describe("hostile OpenEXR uploads are refused, nothing is stored, the server stays up", () => {
  it.each(cases)("$label → $status", async ({ build, status, message }) => {
    const before = { files: filesUnder(folders.uploads).filter((f) => !f.startsWith("tmp/")), rows: await stillCount() };
    const res = await post(build());
    expect(res.status).toBe(status);
    const error = await expectErrorShape(res, `${status}`);
    if (message) expect(error.message).toMatch(message);
    expect(filesUnder(folders.uploads).filter((f) => !f.startsWith("tmp/"))).toEqual(before.files);
    expect(filesUnder(`${folders.uploads}/tmp`)).toEqual([]);
    expect(await stillCount()).toBe(before.rows);
  });

  it("the server still takes a good OpenEXR after all of them", async () => {
    const res = await post(base());
    expect(res.status).toBe(201);
  });
});

describeWithExrTools("hostile files made from reference-written OpenEXR", () => {
  it("ImageMagick ZIP file cut anywhere after its header → 400, and the PIZ one too", async () => {
    fs.writeFileSync(tmp.file("src.exr"), base());
    for (const compression of ["Zip", "Piz"]) {
      run(TOOLS.convert, [tmp.file("src.exr"), "-compress", compression, tmp.file(`c.exr`)]);
      const whole = fs.readFileSync(tmp.file("c.exr"));
      for (const fraction of [0.35, 0.6, 0.9, 0.999]) {
        const rows = await stillCount();
        const res = await post(whole.subarray(0, Math.floor(whole.length * fraction)));
        expect(res.status).toBe(400);
        await expectErrorShape(res, `cut at ${fraction}`);
        expect(await stillCount()).toBe(rows);
      }
    }
  });

  it("flipped bytes inside PIZ data never crash or hang the reader: each upload answers 201 or 400", async () => {
    fs.writeFileSync(tmp.file("src2.exr"), base());
    run(TOOLS.convert, [tmp.file("src2.exr"), "-compress", "Piz", tmp.file("p.exr")]);
    const whole = fs.readFileSync(tmp.file("p.exr"));
    let seed = 7;
    for (let k = 0; k < 12; k++) {
      const f = Buffer.from(whole);
      for (let j = 0; j < 8; j++) {
        seed = (Math.imul(seed, 1103515245) + 12345) >>> 0;
        const at = whole.length - 1 - (seed % Math.floor(whole.length / 2));
        f[at] = f[at]! ^ (1 + (seed % 255));
      }
      const res = await post(f);
      expect([201, 400]).toContain(res.status);
    }
    expect((await post(base({ names: ["A", "B", "G", "R"] }))).status).toBe(201);
  });
});
