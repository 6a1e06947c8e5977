import crypto from "node:crypto";
import fs from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import { Matrix, pseudoInverse } from "ml-matrix";
import sharp from "sharp";
import { mean } from "simple-statistics";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { AppError } from "@/lib/api/errors";
import { eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { stills } from "@/db/schema";
import { env } from "@/lib/env";
import { LabInputError, LabOverflowError } from "@/lib/lab/engine";
import { LabBusyError, LabTimeoutError } from "@/lib/lab/runner";
import { variantPath } from "@/lib/stills/storage";
import { POST as stillsPost } from "@/app/api/stills/route";
import { POST as run } from "@/app/api/lab/run/route";
import { POST as solve } from "@/app/api/lab/solve/route";
import { POST as analyse } from "@/app/api/lab/analyse/route";
import { POST as sample } from "@/app/api/lab/sample/route";
import { labAppError } from "@/lib/lab/service";
import type { LabAnalyseResponse, LabSampleResponse } from "@/lib/lab/analysis-schemas";
import type { LabSolveResponse } from "@/lib/lab/recipe";
import { apiRequest, createPerson, params, type TestPerson } from "@/tests/factories";

const ctx = params({});
const W = 40, H = 24;
const IDENTITY = [[1, 0, 0], [0, 1, 0], [0, 0, 1]];

let tmp = "";
let artist: TestPerson;
let stillId = "";
let codes: Uint16Array;

/** A 16-bit RGB PNG of seeded random codes (invented test data). */
async function makePng16(): Promise<{ png: Buffer; codes: Uint16Array }> {
  const c = new Uint16Array(W * H * 3);
  let seed = 12345;
  for (let i = 0; i < c.length; i++) {
    seed = (seed * 1103515245 + 12345) >>> 0;
    c[i] = seed >>> 16;
  }
  const png = await sharp(c, { raw: { width: W, height: H, channels: 3 } }).toColourspace("rgb16").png().toBuffer();
  return { png, codes: c };
}

async function upload(person: TestPerson, png: Buffer): Promise<string> {
  const form = new FormData();
  form.set("file", new Blob([new Uint8Array(png)], { type: "image/png" }), "trial.png");
  form.set("alt", "Invented test still");
  form.set("owner", "trial");
  const req = new Request("http://localhost/api/stills", { method: "POST", body: form, headers: { Authorization: `Bearer ${person.token}` } });
  const res = await stillsPost(req, ctx);
  expect(res.status).toBe(201);
  return ((await res.json()) as { id: string }).id;
}

async function stored16(bytes: Uint8Array): Promise<Uint16Array> {
  // ignoreIcc: stored values, not colour-managed ones (LAB-NOTES.md, "ICC profiles").
  const { data } = await sharp(bytes, { ignoreIcc: true }).toColourspace("rgb16").raw({ depth: "ushort" }).toBuffer({ resolveWithObject: true });
  return new Uint16Array(data.buffer, data.byteOffset, data.length / 2);
}

beforeAll(async () => {
  tmp = await fs.mkdtemp(path.join(os.tmpdir(), "plateroom-lab-"));
  // lib/env was already read by the test setup (db client); point its folders at this run's temp dir.
  env.PLATEROOM_UPLOADS_DIR = path.join(tmp, "uploads");
  env.PLATEROOM_DATA_DIR = path.join(tmp, "data");
  artist = await createPerson("artist");
  const made = await makePng16();
  codes = made.codes;
  stillId = await upload(artist, made.png);
});

afterAll(async () => {
  if (tmp) await fs.rm(tmp, { recursive: true, force: true });
});

const runReq = (who: TestPerson | null, body: unknown, query = "") => apiRequest("POST", `/api/lab/run${query}`, who, body);

async function expect400(res: Response, stepIndex: number): Promise<{ message: string; fields: Record<string, string> }> {
  expect(res.status).toBe(400);
  const { error } = (await res.json()) as { error: { code: string; message: string; fields: Record<string, string> } };
  expect(error.code).toBe("validation_failed");
  // The step's index appears in the field keys and in the message (API.md: "names the step's index").
  expect(Object.keys(error.fields).some((k) => k === `steps.${stepIndex}` || k.startsWith(`steps.${stepIndex}.`))).toBe(true);
  expect(error.message).toContain(`steps.${stepIndex}`);
  return error;
}

describe("lab routes: who may call", () => {
  it("answers 401 to everyone signed out", async () => {
    const calls: [typeof run, string, unknown][] = [
      [run, "/api/lab/run", { still: stillId, steps: [] }],
      [solve, "/api/lab/solve", { markers: [[0.2, 0.5, 0.4]], screen: [[0.1, 0.6, 0.2]], goal: { kind: "hide", channel: "r" } }],
      [analyse, "/api/lab/analyse", { still: stillId, histogram: true }],
      [sample, "/api/lab/sample", { still: stillId, boxes: [{ x: 0, y: 0, w: 2, h: 2 }] }],
    ];
    for (const [handler, url, body] of calls) {
      const res = await handler(apiRequest("POST", url, null, body), ctx);
      expect(res.status).toBe(401);
      expect(((await res.json()) as { error: { code: string } }).error.code).toBe("unauthorized");
    }
  });

  it("answers 404 for another person's private trial still", async () => {
    const other = await createPerson("artist");
    const res = await run(runReq(other, { still: stillId, steps: [] }), ctx);
    expect(res.status).toBe(404);
  });
});

describe("POST /api/lab/run validation names the step", () => {
  const ok = { op: "matrix", m: IDENTITY };
  it("refuses an unknown op", async () => {
    await expect400(await run(runReq(artist, { still: stillId, steps: [ok, { op: "sharpen", amount: 2 }] }), ctx), 1);
  });
  it("refuses a 4×4 matrix", async () => {
    const m4 = [[1, 0, 0, 0], [0, 1, 0, 0], [0, 0, 1, 0], [0, 0, 0, 1]];
    await expect400(await run(runReq(artist, { still: stillId, steps: [ok, ok, { op: "matrix", m: m4 }] }), ctx), 2);
  });
  it("refuses a channel that does not exist", async () => {
    const e = await expect400(await run(runReq(artist, { still: stillId, steps: [ok, { op: "copy", from: "a", to: "g" }] }), ctx), 1);
    expect(Object.keys(e.fields)).toContain("steps.1.from");
  });
  it("refuses a negative sigma", async () => {
    const steps = [ok, { op: "matte", channel: "g", black: 0.1, white: 0.6 }, { op: "soften", sigma: -3 }];
    const e = await expect400(await run(runReq(artist, { still: stillId, steps }), ctx), 2);
    expect(Object.keys(e.fields)).toContain("steps.2.sigma");
  });
  it("refuses NaN sent as a string", async () => {
    const e = await expect400(await run(runReq(artist, { still: stillId, steps: [{ op: "matrix", m: [["NaN", 0, 0], [0, 1, 0], [0, 0, 1]] }] }), ctx), 0);
    expect(Object.keys(e.fields)).toContain("steps.0.m.0.0");
  });
  it("never changes the stored still, whether the recipe is bad or good", async () => {
    const file = variantPath(await shaOf(stillId), "original");
    const before = await fs.readFile(file);
    await run(runReq(artist, { still: stillId, steps: [{ op: "matrix", m: [[1, 0]] }] }), ctx);
    await run(runReq(artist, { still: stillId, space: "stored", steps: [{ op: "matrix", m: [[0, 0, 1], [0, 1, 0], [1, 0, 0]] }] }), ctx);
    const after = await fs.readFile(file);
    expect(Buffer.compare(before, after)).toBe(0);
    // The file is still at its content address: its sha256 is its name.
    expect(crypto.createHash("sha256").update(after).digest("hex")).toBe(path.basename(file, ".bin"));
  });
});

async function shaOf(id: string): Promise<string> {
  const [row] = await getDb().select({ sha256: stills.sha256 }).from(stills).where(eq(stills.id, id));
  return row!.sha256;
}

describe("POST /api/lab/run on an uploaded 16-bit PNG", () => {
  for (const space of ["stored", "linear"] as const) {
    it(`returns the identity matrix bit-exact as png16 (space ${space})`, async () => {
      const res = await run(runReq(artist, { still: stillId, space, format: "png16", steps: [{ op: "matrix", m: IDENTITY, offset: [0, 0, 0] }] }), ctx);
      expect(res.status).toBe(200);
      expect(res.headers.get("content-type")).toBe("image/png");
      expect(res.headers.get("cache-control")).toBe("private, no-store");
      const report = JSON.parse(Buffer.from(res.headers.get("x-lab-report")!, "base64url").toString("utf8"));
      expect(report).toEqual([{ index: 0, op: "matrix" }]);
      const bytes = new Uint8Array(await res.arrayBuffer());
      const meta = await sharp(bytes).metadata();
      expect(meta.depth).toBe("ushort");
      // Decoded independently by sharp (libvips): every 16-bit code equals the uploaded one.
      const out = await stored16(bytes);
      expect(out.length).toBe(codes.length);
      let diffs = 0;
      for (let i = 0; i < codes.length; i++) if (out[i] !== codes[i]) diffs++;
      expect(diffs).toBe(0);
    });
  }

  it("answers the step reports as JSON with ?report=1", async () => {
    const res = await run(runReq(artist, { still: stillId, space: "stored", steps: [{ op: "copy", from: "r", to: "g" }] }, "?report=1"), ctx);
    expect(res.status).toBe(200);
    expect(await res.json()).toMatchObject({ width: W, height: H, contentType: "image/png", approximate: false, reports: [{ index: 0, op: "copy" }] });
  });

  it("answers 422 naming the step whose values overflowed (twenty gains of 100, then twenty of 0.01)", async () => {
    const gain = (k: number) => ({ op: "matrix", m: [[k, 0, 0], [0, k, 0], [0, 0, k]] });
    const steps = [...Array.from({ length: 20 }, () => gain(100)), ...Array.from({ length: 20 }, () => gain(0.01))];
    const res = await run(runReq(artist, { still: stillId, steps }), ctx);
    expect(res.status).toBe(422);
    const { error } = (await res.json()) as { error: { code: string; message: string; fields: Record<string, string> } };
    expect(error.code).toBe("unprocessable");
    expect(Object.keys(error.fields)).toEqual(["steps.19"]);
    expect(error.message).toContain("steps.19");
  });

  it("says whether a render is exact or an approximate proxy, and how many pixels flatten filled", async () => {
    const steps = [{ op: "matte", channel: "g", source: "plate", black: 0.2, white: 0.8 }, { op: "flatten", sigma: 3, color: [0.1, 0.5, 0.2] }];
    const exact = await run(runReq(artist, { still: stillId, space: "stored", steps }), ctx);
    expect(exact.status).toBe(200);
    expect(exact.headers.get("X-Lab-Render")).toBe("exact");
    const reports = JSON.parse(Buffer.from(exact.headers.get("X-Lab-Report")!, "base64url").toString("utf8")) as { op: string; thin?: number }[];
    expect(exact.headers.get("X-Lab-Flatten-Thin")).toBe(String(reports[1]!.thin));
    const proxy = await run(runReq(artist, { still: stillId, space: "stored", steps, width: 20, format: "webp" }), ctx);
    expect(proxy.status).toBe(200);
    expect(proxy.headers.get("X-Lab-Render")).toBe("approximate");
    expect(proxy.headers.get("X-Lab-Width")).toBe("20");
  });
});

/*
 * Independent closed form (LAB-NOTES.md "Solver"; minimum-norm solution of an underdetermined
 * consistent system = Moore–Penrose pseudoinverse times the right-hand side, computed with
 * ml-matrix pseudoInverse): stack the constraints as rows instead of using the projector.
 *  hide:  d·(m_i − s) = −(m_i − s)_c and d·s = 0, r = e_c + d.
 *  matte: r·m_i = 1 and r·s = 0.
 */
function referenceRow(markers: number[][], s: number[], kind: "hide" | "matte", c: number): number[] {
  const rows = markers.map((m) => (kind === "hide" ? m.map((v, j) => v - s[j]!) : m));
  const rhs = markers.map((m) => (kind === "hide" ? -(m[c]! - s[c]!) : 1));
  const A = new Matrix([...rows, s]);
  const x = pseudoInverse(A).mmul(Matrix.columnVector([...rhs, 0])).to1DArray();
  if (kind === "hide") x[c] = x[c]! + 1;
  return x;
}
const dot = (a: number[], b: number[]) => a[0]! * b[0]! + a[1]! * b[1]! + a[2]! * b[2]!;

describe("POST /api/lab/solve", () => {
  // API.md's own example samples.
  const markers = [[0.15, 0.5, 0.45], [0.2, 0.55, 0.5]];
  const screen = [0.1, 0.6, 0.2];

  for (const channel of ["r", "g", "b"] as const) {
    it(`hide in ${channel}: markers match the screen, screen level kept, equal to the ml-matrix closed form`, async () => {
      const res = await solve(apiRequest("POST", "/api/lab/solve", artist, { markers, screen: [screen], goal: { kind: "hide", channel } }), ctx);
      expect(res.status).toBe(200);
      const body = (await res.json()) as LabSolveResponse;
      const c = { r: 0, g: 1, b: 2 }[channel];
      for (const m of markers) expect(Math.abs(dot(body.row, m) - dot(body.row, screen))).toBeLessThan(1e-9);
      expect(Math.abs(dot(body.row, screen) - screen[c]!)).toBeLessThan(1e-9);
      const ref = referenceRow(markers, screen, "hide", c);
      for (let j = 0; j < 3; j++) expect(body.row[j]).toBeCloseTo(ref[j]!, 9);
      expect(body.matrix[c]).toEqual(body.row);
      expect(body.residual).toBeLessThan(1e-9);
    });
  }

  it("matte: markers → 1 and screen → 0, equal to the ml-matrix closed form", async () => {
    const res = await solve(apiRequest("POST", "/api/lab/solve", artist, { markers, screen: [screen], goal: { kind: "matte", channel: "g" } }), ctx);
    const body = (await res.json()) as LabSolveResponse;
    for (const m of markers) expect(Math.abs(dot(body.row, m) - 1)).toBeLessThan(1e-9);
    expect(Math.abs(dot(body.row, screen))).toBeLessThan(1e-9);
    const ref = referenceRow(markers, screen, "matte", 1);
    for (let j = 0; j < 3; j++) expect(body.row[j]).toBeCloseTo(ref[j]!, 9);
  });

  it("refuses non-numbers with the field named", async () => {
    const res = await solve(apiRequest("POST", "/api/lab/solve", artist, { markers: [["NaN", 0.5, 0.4]], screen: [screen], goal: { kind: "hide", channel: "q" } }), ctx);
    expect(res.status).toBe(400);
    const { error } = (await res.json()) as { error: { fields: Record<string, string> } };
    expect(Object.keys(error.fields)).toEqual(expect.arrayContaining(["markers.0.0", "goal.channel"]));
  });
});

describe("POST /api/lab/sample and /api/lab/analyse", () => {
  it("averages boxes of stored values like simple-statistics' mean over the decoded codes", async () => {
    const boxes = [{ x: 3, y: 2, w: 5, h: 4 }, { x: 30, y: 20, w: 20, h: 20 }];
    const res = await sample(apiRequest("POST", "/api/lab/sample", artist, { still: stillId, space: "stored", boxes }), ctx);
    expect(res.status).toBe(200);
    const body = (await res.json()) as LabSampleResponse;
    boxes.forEach((b, i) => {
      for (let ch = 0; ch < 3; ch++) {
        const vals: number[] = [];
        for (let y = b.y; y < Math.min(H, b.y + b.h); y++) for (let x = b.x; x < Math.min(W, b.x + b.w); x++) vals.push(codes[(y * W + x) * 3 + ch]! / 65535);
        // Engine floats are float32: agreement to ~1e-7 relative.
        expect(body.samples[i]![ch]).toBeCloseTo(mean(vals), 6);
      }
    });
    expect(body.pixels).toEqual([20, 40]);
  });

  it("refuses a box outside the still, naming it", async () => {
    const res = await sample(apiRequest("POST", "/api/lab/sample", artist, { still: stillId, boxes: [{ x: 1, y: 1, w: 2, h: 2 }, { x: W + 5, y: 0, w: 2, h: 2 }] }), ctx);
    expect(res.status).toBe(400);
    expect(Object.keys(((await res.json()) as { error: { fields: Record<string, string> } }).error.fields)).toEqual(["boxes.1"]);
  });

  it("profiles a row of pixels and counts every pixel in the histograms", async () => {
    const y = 5;
    const res = await analyse(
      apiRequest("POST", "/api/lab/analyse", artist, {
        still: stillId, space: "stored", steps: [{ op: "copy", from: "r", to: "b" }], line: { x0: 0, y0: y, x1: W - 1, y1: y }, histogram: true, bins: 16,
      }),
      ctx,
    );
    expect(res.status).toBe(200);
    const body = (await res.json()) as LabAnalyseResponse;
    const before = body.before.profile!;
    expect(before.r.length).toBe(W);
    for (let x = 0; x < W; x++) {
      expect(before.r[x]).toBeCloseTo(codes[(y * W + x) * 3]! / 65535, 6);
      expect(body.after!.profile!.b[x]).toBeCloseTo(codes[(y * W + x) * 3]! / 65535, 6);
    }
    for (const side of [body.before, body.after!]) {
      const h = side.histogram!;
      (["r", "g", "b"] as const).forEach((ch, i) => expect(h[ch].reduce((a, v) => a + v, 0) + h.below[i]! + h.above[i]!).toBe(W * H));
    }
  });
});

describe("engine errors become the API error shape", () => {
  const codeOf = (e: unknown) => {
    const err = labAppError(e);
    return err instanceof AppError ? [err.code, err.fields] : ["other"];
  };
  it("maps busy, timeout, input and overflow errors", () => {
    expect(codeOf(new LabBusyError())[0]).toBe("rate_limited");
    expect(codeOf(new LabTimeoutError(1000))[0]).toBe("unavailable");
    expect(codeOf(new LabInputError("bad", 3))).toEqual(["validation_failed", { "steps.3": "bad" }]);
    expect(codeOf(new LabOverflowError(19, "matrix"))[0]).toBe("unprocessable");
    expect(codeOf(new Error("x"))).toEqual(["other"]);
  });
});
