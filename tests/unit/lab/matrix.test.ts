import { Matrix } from "ml-matrix";
import sharp from "sharp";
import { describe, expect, it } from "vitest";
import { runRecipe } from "@/lib/lab/engine";
import { matrixInPlace } from "@/lib/lab/kernels";
import { recipeSchema } from "@/lib/lab/recipe";
import { allocSimdRgb } from "@/lib/lab/simd";

function rand(seed: number): () => number {
  let a = seed >>> 0;
  return () => ((a = (Math.imul(a, 1664525) + 1013904223) >>> 0) / 2 ** 32);
}

describe("colour matrix step", () => {
  // Reference: ml-matrix (npm) products M · rgb + offset on random inputs, float32 tolerance 1e-6·scale.
  for (const [label, alloc] of [["SIMD buffer", allocSimdRgb], ["plain Float32Array", (n: number) => new Float32Array(n)]] as const) {
    it(`matches ml-matrix on random matrices and pixels (${label})`, () => {
      const r = rand(label.length * 97);
      for (let trial = 0; trial < 20; trial++) {
        const m = [0, 1, 2].map(() => [0, 1, 2].map(() => (r() * 2 - 1) * 3));
        const offset = [0, 1, 2].map(() => r() - 0.5);
        // Some rows kept as identity to exercise the row-skipping path.
        if (trial % 3 === 1) m[0] = [1, 0, 0];
        if (trial % 3 === 1) offset[0] = 0;
        const pixels = 1 + Math.floor(r() * 257);
        const a = alloc(pixels * 3);
        for (let i = 0; i < a.length; i++) a[i] = (r() * 2 - 1) * 2;
        const input = Array.from(a);
        const before = Matrix.from1DArray(pixels, 3, input).transpose();
        const expected = new Matrix(m).mmul(before).addColumnVector(offset);
        // Scale of the terms summed, so the float32 tolerance is 1e-6 relative to it.
        const scale = new Matrix(m).abs().mmul(before.clone().abs()).addColumnVector(offset.map(Math.abs));
        matrixInPlace(a, m, offset);
        for (let p = 0; p < pixels; p++) {
          for (let c = 0; c < 3; c++) {
            expect(Math.abs(a[p * 3 + c]! - expected.get(c, p))).toBeLessThanOrEqual(1e-6 * Math.max(scale.get(c, p), 1e-3));
          }
        }
      }
    });
  }

  it("applies the W3C Filter Effects saturate matrix, s = 0.4: (0.2, 0.6, 0.3) → (0.37592, 0.53592, 0.41592)", () => {
    // W3C Filter Effects Module Level 1, feColorMatrix type="saturate" (rows as in the spec):
    const s = 0.4;
    const m = [
      [0.213 + 0.787 * s, 0.715 - 0.715 * s, 0.072 - 0.072 * s],
      [0.213 - 0.213 * s, 0.715 + 0.285 * s, 0.072 - 0.072 * s],
      [0.213 - 0.213 * s, 0.715 - 0.715 * s, 0.072 + 0.928 * s],
    ];
    const a = allocSimdRgb(12);
    for (let p = 0; p < 4; p++) a.set([0.2, 0.6, 0.3], p * 3);
    matrixInPlace(a, m);
    const expected = [0.37592, 0.53592, 0.41592];
    for (let p = 0; p < 4; p++) for (let c = 0; c < 3; c++) expect(a[p * 3 + c]).toBeCloseTo(expected[c]!, 6);
  });

  it("does not clip between steps: values outside 0..1 come back through an inverse matrix", async () => {
    const w = 8, h = 4;
    const u = new Uint16Array(w * h * 3).map((_, i) => (i * 4099) % 65536);
    const png = await sharp(u, { raw: { width: w, height: h, channels: 3 } }).toColourspace("rgb16").png().toBuffer();
    const gain = 4;
    const steps = recipeSchema.parse([
      { op: "matrix", m: [[gain, 0, 0], [0, gain, 0], [0, 0, gain]], offset: [-1, -1, -1] },
      { op: "matrix", m: [[1 / gain, 0, 0], [0, 1 / gain, 0], [0, 0, 1 / gain]], offset: [1 / gain, 1 / gain, 1 / gain] },
    ]);
    const r = await runRecipe({ still: png, steps, space: "stored", format: "png16" });
    const { data } = await sharp(r.bytes).toColourspace("rgb16").raw({ depth: "ushort" }).toBuffer({ resolveWithObject: true });
    const out = new Uint16Array(data.buffer, data.byteOffset, data.length / 2);
    for (let i = 0; i < u.length; i++) expect(Math.abs(out[i]! - u[i]!)).toBeLessThanOrEqual(1);
  });
});

describe("identity recipe", () => {
  async function png16(w: number, h: number, channels: 1 | 3 | 4) {
    const u = new Uint16Array(w * h * channels);
    const r = rand(w * h + channels);
    for (let i = 0; i < u.length; i++) u[i] = Math.floor(r() * 65536);
    u[0] = 0; u[1] = 65535;
    const colourspace = channels === 1 ? "grey16" : "rgb16";
    return { u, png: await sharp(u, { raw: { width: w, height: h, channels } }).toColourspace(colourspace).png().toBuffer() };
  }
  async function decode16(bytes: Buffer) {
    const { data } = await sharp(bytes, { ignoreIcc: true }).toColourspace("rgb16").raw({ depth: "ushort" }).toBuffer({ resolveWithObject: true });
    return new Uint16Array(data.buffer, data.byteOffset, data.length / 2);
  }
  const identity = recipeSchema.parse([{ op: "matrix", m: [[1, 0, 0], [0, 1, 0], [0, 0, 1]], offset: [0, 0, 0] }, { op: "copy", from: "g", to: "g" }]);

  // Issue 5: "A 16-bit still through an identity recipe comes back bit-exact" (both spaces).
  for (const space of ["linear", "stored"] as const) {
    it(`leaves a 16-bit RGB still bit-exact (${space})`, async () => {
      const { u, png } = await png16(67, 23, 3);
      const r = await runRecipe({ still: png, steps: identity, space, format: "png16" });
      expect(r.contentType).toBe("image/png");
      const out = await decode16(r.bytes);
      expect(out.length).toBe(u.length);
      let diff = 0;
      for (let i = 0; i < u.length; i++) if (out[i] !== u[i]) diff++;
      expect(diff).toBe(0);
    });
  }

  it("leaves a 16-bit grey still bit-exact in every channel", async () => {
    const { u, png } = await png16(31, 9, 1);
    const out = await decode16((await runRecipe({ still: png, steps: identity, space: "linear", format: "png16" })).bytes);
    for (let p = 0; p < u.length; p++) for (let c = 0; c < 3; c++) expect(out[p * 3 + c]).toBe(u[p]);
  });

  it("leaves an 8-bit RGBA still's colour bit-exact as 8-bit PNG", async () => {
    const w = 40, h = 10, r = rand(5);
    const u8 = Buffer.from(Array.from({ length: w * h * 4 }, () => Math.floor(r() * 256)));
    const png = await sharp(u8, { raw: { width: w, height: h, channels: 4 } }).png().toBuffer();
    const res = await runRecipe({ still: png, steps: identity, space: "linear", format: "png" });
    const { data, info } = await sharp(res.bytes).raw().toBuffer({ resolveWithObject: true });
    expect(info.channels).toBe(3);
    for (let p = 0; p < w * h; p++) for (let c = 0; c < 3; c++) expect(data[p * 3 + c]).toBe(u8[p * 4 + c]);
  });

  it("renders a proxy at the requested width and a webp preview", async () => {
    const { png } = await png16(400, 100, 3);
    const r = await runRecipe({ still: png, steps: identity, space: "linear", format: "webp", width: 100 });
    expect(r.contentType).toBe("image/webp");
    expect([r.width, r.height, r.sourceWidth]).toEqual([100, 25, 400]);
    const meta = await sharp(r.bytes).metadata();
    expect([meta.format, meta.width]).toEqual(["webp", 100]);
  });
});
