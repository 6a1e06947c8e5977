import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import sharp from "sharp";
import { afterAll, beforeAll, expect, it } from "vitest";
import { GET as getVariant } from "@/app/api/stills/[id]/[variant]/route";
import { GET as getPixel } from "@/app/api/stills/[id]/pixel/route";
import { POST } from "@/app/api/stills/route";
import { POST as labRun } from "@/app/api/lab/run/route";
import { env } from "@/lib/env";
import type { PixelBlockResponse, PixelResponse, StillCreatedResponse } from "@/lib/stills/schemas";
import { describeWithExrTools, float32ToHalf, halfPattern, rawExr, referenceDecode, refHeader, run, TOOLS, tempDir, type RefImage } from "@/tests/exr/reference";
import { createPerson, ctx, uploadRequest, type TestPerson } from "./factories";

/*
 * OpenEXR stills through the HTTP API, checked against OpenEXR itself: files made here at run
 * time by the reference tools (ImageMagick's OpenEXR delegate, exrmaketiled, exrmultiview,
 * exrstdattr), uploaded with POST /api/stills, read back value by value through
 * GET /api/stills/{id}/pixel (blocks) and compared with the reference's decode of the same
 * file; lab results downloaded as OpenEXR and read back by the reference.
 */

let dir: string;
let tmp: ReturnType<typeof tempDir>;
let senior: TestPerson;

beforeAll(async () => {
  dir = fs.mkdtempSync(path.join(os.tmpdir(), "plateroom-exr-stills-"));
  env.PLATEROOM_UPLOADS_DIR = dir;
  env.PLATEROOM_DATA_DIR = fs.mkdtempSync(path.join(os.tmpdir(), "plateroom-exr-data-"));
  tmp = tempDir();
  senior = await createPerson("senior");
});
afterAll(() => {
  fs.rmSync(dir, { recursive: true, force: true });
  tmp?.remove();
});

async function upload(file: string, fields: Record<string, string> = {}) {
  const req = uploadRequest({ bytes: fs.readFileSync(file), name: path.basename(file) }, { alt: "Invented linear plate", owner: "trial", ...fields }, senior.auth);
  const res = await POST(req, ctx({}));
  return { status: res.status, body: (await res.json()) as StillCreatedResponse & { error?: { code: string; message: string } } };
}

/** Every value of the still through the API, in blocks, as float32. */
async function valuesOf(id: string, width: number, height: number): Promise<{ channels: number; data: Float32Array }> {
  const rows = Math.max(1, Math.floor(65536 / width));
  const data: number[] = [];
  let channels = 0;
  for (let y = 0; y < height; y += rows) {
    const h = Math.min(rows, height - y);
    const res = await getPixel(new Request(`http://plateroom.test/api/stills/${id}/pixel?x=0&y=${y}&w=${width}&h=${h}`, { headers: senior.auth }), ctx({ id }));
    expect(res.status).toBe(200);
    const block = (await res.json()) as PixelBlockResponse;
    channels = block.channels;
    data.push(...block.floats);
  }
  return { channels, data: Float32Array.from(data) };
}

/** API values (display window) against the reference decode (data window), every sample. */
function expectReference(api: { channels: number; data: Float32Array }, ref: RefImage, names: string[], width: number, height: number): void {
  const [dx0, dy0] = ref.header.dataWindow;
  const [wx0, wy0] = ref.header.displayWindow;
  expect(api.channels).toBe(names.length);
  let compared = 0;
  for (let y = 0; y < height; y++) {
    for (let x = 0; x < width; x++) {
      const rx = x + wx0 - dx0, ry = y + wy0 - dy0;
      const inside = rx >= 0 && ry >= 0 && rx < ref.width && ry < ref.height;
      names.forEach((name, c) => {
        const expected = inside ? ref.channels.get(name)![ry * ref.width + rx]! : 0;
        const got = api.data[(y * width + x) * names.length + c]!;
        if (!Object.is(got, expected) && !(got === 0 && expected === 0)) throw new Error(`(${x}, ${y}) ${name}: API ${got}, OpenEXR ${expected}`);
        compared++;
      });
    }
  }
  expect(compared).toBe(width * height * names.length);
}

function hdr(width: number, height: number, names: string[], seed: number, windows?: { data: [number, number, number, number]; display: [number, number, number, number] }): Buffer {
  const data = windows?.data ?? [0, 0, width - 1, height - 1];
  const n = (data[2] - data[0] + 1) * (data[3] - data[1] + 1);
  return rawExr({ channels: names.map((name, k) => ({ name, type: "half", samples: halfPattern(n, seed + 31 * k) })), dataWindow: data, displayWindow: windows?.display });
}

describeWithExrTools("OpenEXR stills through the API match the reference implementation", () => {
  it("ImageMagick RGBA half, PIZ: 201 with the EXR facts, default space linear Rec.709 (no chromaticities), every value", async () => {
    const n = 45 * 30 * 4;
    const codes = Uint16Array.from({ length: n }, (_, i) => (Math.imul(i + 3, 40503) >>> 3) & 0xffff);
    await sharp(codes, { raw: { width: 45, height: 30, channels: 4 } }).toColourspace("rgb16").png().toFile(tmp.file("a.png"));
    run(TOOLS.convert, [tmp.file("a.png"), "-define", "exr:color-type=RGBA", "-compress", "Piz", tmp.file("a.exr")]);
    const { status, body } = await upload(tmp.file("a.exr"));
    expect(status).toBe(201);
    expect(body).toMatchObject({ width: 45, height: 30, format: "exr", bitDepth: 16, channels: 4, colourSpace: "lin-rec709", pixelAspectRatio: 1 });
    expect(body.exr).toMatchObject({ compression: "PIZ", tiled: false, parts: 1, layer: "0/layer:" });
    expectReference(await valuesOf(body.id, 45, 30), referenceDecode(tmp.file("a.exr")), ["R", "G", "B", "A"], 45, 30);
  });

  it("tiled PIZ with values outside 0..1 and ACEScg chromaticities (exrstdattr): space ACEScg by default, values kept exactly", async () => {
    fs.writeFileSync(tmp.file("h.exr"), hdr(70, 38, ["B", "G", "R"], 11));
    run(TOOLS.exrstdattr, ["-chromaticities", "0.713", "0.293", "0.165", "0.830", "0.128", "0.044", "0.32168", "0.33767", tmp.file("h.exr"), tmp.file("h2.exr")]);
    run(TOOLS.exrmaketiled, ["-z", "piz", "-t", "32", "16", tmp.file("h2.exr"), tmp.file("ht.exr")]);
    const { status, body } = await upload(tmp.file("ht.exr"));
    expect(status).toBe(201);
    expect(body.colourSpace).toBe("acescg");
    expect(body.exr?.tiled).toBe(true);
    const values = await valuesOf(body.id, 70, 38);
    expectReference(values, referenceDecode(tmp.file("ht.exr")), ["R", "G", "B"], 70, 38);
    expect(Math.max(...values.data)).toBeGreaterThan(1);
    expect(Math.min(...values.data)).toBeLessThan(0);
    // The probe names the space of the floats it shows.
    const probe = (await (await getPixel(new Request(`http://plateroom.test/api/stills/${body.id}/pixel?x=3&y=4`, { headers: senior.auth }), ctx({ id: body.id }))).json()) as PixelResponse;
    expect(probe.space).toBe("acescg");
    expect(probe.max).toBe(1);
    expect(probe.linear).toEqual(probe.values);
  });

  it("multi-view file: the layer field picks the second view; data window larger than the display window is cropped to it", async () => {
    const windows = { data: [-4, -2, 52, 33] as [number, number, number, number], display: [0, 0, 47, 31] as [number, number, number, number] };
    fs.writeFileSync(tmp.file("l.exr"), hdr(0, 0, ["B", "G", "R"], 21, windows));
    fs.writeFileSync(tmp.file("r.exr"), hdr(0, 0, ["B", "G", "R"], 22, windows));
    run(TOOLS.exrmultiview, ["-z", "zip", "left", tmp.file("l.exr"), "right", tmp.file("r.exr"), tmp.file("lr.exr")]);
    const { status, body } = await upload(tmp.file("lr.exr"), { layer: "0/layer:right", colourSpace: "aces2065-1" });
    expect(status).toBe(201);
    expect(body).toMatchObject({ width: 48, height: 32, colourSpace: "aces2065-1" });
    expect(body.exr?.layers.map((l) => l.id)).toEqual(["0/layer:", "0/layer:right"]);
    expect(body.exr?.dataWindow).toEqual({ xMin: -4, yMin: -2, xMax: 52, yMax: 33 });
    expectReference(await valuesOf(body.id, 48, 32), referenceDecode(tmp.file("lr.exr")), ["right.R", "right.G", "right.B"], 48, 32);
    const missing = await upload(tmp.file("lr.exr"), { layer: "0/layer:nope" });
    expect(missing.status).toBe(400);
  });

  it("identifying header attributes are dropped from the stored original, the colour description and every value kept", async () => {
    fs.writeFileSync(tmp.file("o.exr"), hdr(24, 16, ["B", "G", "R"], 31));
    run(TOOLS.exrstdattr, [
      "-owner", "Invented Person", "-comments", "/mnt/projects/slm/plates", "-latitude", "51.5", "-longitude", "-0.1", "-capDate", "2026:01:02 03:04:05",
      "-string", "cameraSerialNumber", "XYZ123",
      "-chromaticities", "0.7347", "0.2653", "0", "1", "0.0001", "-0.077", "0.32168", "0.33767",
      tmp.file("o.exr"), tmp.file("o2.exr"),
    ]);
    const { status, body } = await upload(tmp.file("o2.exr"));
    expect(status).toBe(201);
    expect(body.colourSpace).toBe("aces2065-1");
    const res = await getVariant(new Request(`http://plateroom.test/api/stills/${body.id}/original`, { headers: senior.auth }), ctx({ id: body.id, variant: "original" }));
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toBe("image/x-exr");
    fs.writeFileSync(tmp.file("stored.exr"), Buffer.from(await res.arrayBuffer()));
    const header = refHeader(tmp.file("stored.exr")).raw;
    for (const gone of ["owner", "comments", "latitude", "longitude", "capDate", "cameraSerialNumber", "Invented Person", "XYZ123"]) expect(header).not.toContain(gone);
    expect(header).toContain("chromaticities");
    const before = referenceDecode(tmp.file("o2.exr"));
    const after = referenceDecode(tmp.file("stored.exr"));
    for (const c of ["R", "G", "B"]) expect(Buffer.compare(Buffer.from(after.bits.get(c)!.buffer), Buffer.from(before.bits.get(c)!.buffer))).toBe(0);
  });

  it("preview, full-size display image and on-request exposure and range views", async () => {
    fs.writeFileSync(tmp.file("d.exr"), hdr(40, 20, ["B", "G", "R"], 41));
    const { body } = await upload(tmp.file("d.exr"));
    const get = async (variant: string, query = "") =>
      getVariant(new Request(`http://plateroom.test/api/stills/${body.id}/${variant}${query}`, { headers: senior.auth }), ctx({ id: body.id, variant }));
    const display = await get("display");
    expect(display.headers.get("content-type")).toBe("image/png");
    const meta = await sharp(Buffer.from(await display.arrayBuffer())).metadata();
    expect([meta.width, meta.height]).toEqual([40, 20]);
    const preview = await get("preview");
    expect(preview.headers.get("content-type")).toBe("image/webp");
    const range = await get("display", "?exposure=1&view=range");
    expect(range.status).toBe(200);
    expect(range.headers.get("etag")).not.toBe(display.headers.get("etag"));
    expect((await get("display", "?exposure=99")).status).toBe(400);
  });

  it("the lab writes OpenEXR that the reference reads back with the same values (float exactly; half rounded to nearest as numpy rounds, clamped to ±65504)", async () => {
    fs.writeFileSync(tmp.file("lab.exr"), hdr(36, 22, ["B", "G", "R"], 51));
    run(TOOLS.exrmaketiled, ["-z", "zip", tmp.file("lab.exr"), tmp.file("labt.exr")]);
    const { body } = await upload(tmp.file("labt.exr"));
    const source = referenceDecode(tmp.file("labt.exr"));
    const m = [[2, 0, 0], [0, -1, 0], [0.5, 0, 1.5]];
    const expected = { R: new Float32Array(36 * 22), G: new Float32Array(36 * 22), B: new Float32Array(36 * 22) };
    for (let i = 0; i < 36 * 22; i++) {
      const [r, g, b] = ["R", "G", "B"].map((c) => source.channels.get(c)![i]!) as [number, number, number];
      // float32 products as the engine computes them (Float32Array storage after each multiply-add row).
      expected.R[i] = Math.fround(2 * r);
      expected.G[i] = Math.fround(-1 * g);
      expected.B[i] = Math.fround(0.5 * r + 1.5 * b);
    }
    // Half output clamps to ±65504, the largest finite half, where numpy (and OpenEXR's half(float)) would give infinity.
    const clamped = Float32Array.from([...expected.R, ...expected.G, ...expected.B], (v) => Math.max(-65504, Math.min(65504, v)));
    const halves = float32ToHalf(clamped);
    const expectedHalf = { R: halves.subarray(0, 36 * 22), G: halves.subarray(36 * 22, 2 * 36 * 22), B: halves.subarray(2 * 36 * 22) };
    for (const [pixelType, compression] of [["float", "zip"], ["float", "none"], ["half", "zip"], ["half", "none"]] as const) {
      const req = new Request("http://plateroom.test/api/lab/run", {
        method: "POST",
        headers: { ...senior.auth, "content-type": "application/json" },
        body: JSON.stringify({ still: body.id, space: "linear", format: "exr", exr: { pixelType, compression }, steps: [{ op: "matrix", m }] }),
      });
      const res = await labRun(req, ctx({}));
      expect(res.status).toBe(200);
      expect(res.headers.get("content-disposition")).toMatch(/attachment; filename="lab-.*\.exr"/);
      const out = tmp.file(`lab-${pixelType}-${compression}.exr`);
      fs.writeFileSync(out, Buffer.from(await res.arrayBuffer()));
      const ref = referenceDecode(out);
      expect(ref.header.compression).toMatch(compression === "zip" ? /zip/ : /none/);
      expect(ref.header.raw).toContain("chromaticities");
      for (const c of ["R", "G", "B"] as const) {
        const want = pixelType === "float" ? expected[c] : expectedHalf[c];
        const got = pixelType === "float" ? ref.channels.get(c)! : ref.bits.get(c)!;
        for (let i = 0; i < want.length; i++) if (got[i] !== want[i]) throw new Error(`${pixelType} ${compression} ${c}[${i}]: file ${got[i]}, expected ${want[i]} (from ${expected[c][i]})`);
      }
    }
  });
});

describeWithExrTools("readStillLinear: a still's pixels as linear float RGB and the space they are in", () => {
  it("decodes sRGB-encoded stills by IEC 61966-2-1 and returns OpenEXR samples as stored, each with its space", async () => {
    const { readStillLinear } = await import("@/lib/stills/values");
    const { getDb } = await import("@/db/client");
    const { stills } = await import("@/db/schema");
    const { eq } = await import("drizzle-orm");
    // Code 128 of 255 is 0.501961 encoded → 0.215861 linear (IEC 61966-2-1 §5.2 decode, computed from the formula).
    fs.writeFileSync(tmp.file("grey.png"), await sharp({ create: { width: 4, height: 2, channels: 3, background: { r: 128, g: 128, b: 128 } } }).png().toBuffer());
    const png = await upload(tmp.file("grey.png"));
    expect(png.status).toBe(201);
    const [pngRow] = await getDb().select().from(stills).where(eq(stills.id, png.body.id));
    const linear = await readStillLinear(pngRow!);
    expect(linear.space).toBe("lin-rec709");
    expect(linear.data[0]).toBeCloseTo(((128 / 255 + 0.055) / 1.055) ** 2.4, 6);

    const samples = halfPattern(6 * 4, 77);
    fs.writeFileSync(tmp.file("lin.exr"), rawExr({ channels: [{ name: "Y", type: "half", samples }], dataWindow: [0, 0, 5, 3] }));
    const exr = await upload(tmp.file("lin.exr"), { colourSpace: "acescg" });
    expect(exr.status).toBe(201);
    const [exrRow] = await getDb().select().from(stills).where(eq(stills.id, exr.body.id));
    const values = await readStillLinear(exrRow!);
    expect(values.space).toBe("acescg");
    // A luminance-only file: the one channel in R, G and B, half → float exact (numpy, tests/exr/reference.ts).
    const { halfToFloat32 } = await import("@/tests/exr/reference");
    const expected = halfToFloat32(samples);
    for (let i = 0; i < 24; i++) for (let c = 0; c < 3; c++) expect(values.data[i * 3 + c]).toBe(expected[i]);
  });
});
