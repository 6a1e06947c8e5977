import { describe, expect, it } from "vitest";
import { codeLut, quantise, quantise8Consuming, quantiser, srgbDecode, srgbEncode, srgbDecodeExt, srgbEncodeExt } from "@/lib/lab/srgb";

describe("sRGB transfer (IEC 61966-2-1:1999)", () => {
  it("decodes encoded 0.5 to linear 0.214041", () => {
    // IEC 61966-2-1 decode: ((V + 0.055) / 1.055)^2.4 above 0.04045; value via REFERENCES.md
    expect(srgbDecode(0.5)).toBeCloseTo(0.214041, 6);
  });
  it("encodes linear 0.18 to 0.461356", () => {
    expect(srgbEncode(0.18)).toBeCloseTo(0.461356, 6);
  });
  it("uses the linear segment below the breakpoints (V/12.92, L·12.92)", () => {
    expect(srgbDecode(0.04)).toBeCloseTo(0.04 / 12.92, 12);
    expect(srgbEncode(0.003)).toBeCloseTo(0.003 * 12.92, 12);
  });
  it("round-trips within 1e-6", () => {
    for (let i = 0; i <= 1000; i++) {
      const v = i / 1000;
      expect(Math.abs(srgbEncode(srgbDecode(v)) - v)).toBeLessThan(1e-6);
      expect(Math.abs(srgbEncodeExt(srgbDecodeExt(-v)) + v)).toBeLessThan(1e-6);
    }
  });
  it("decode tables equal the formula for every 8- and 16-bit code", () => {
    for (const bits of [8, 16] as const) {
      const lut = codeLut(bits, true), max = bits === 8 ? 255 : 65535;
      for (let k = 0; k <= max; k += bits === 8 ? 1 : 7) expect(lut[k]).toBe(Math.fround(srgbDecode(k / max)));
    }
  });
  it("quantising gives round(encode(x) · max), and 16-bit codes survive decode → quantise", () => {
    const q = quantiser(16, true);
    const xs = new Float32Array(20000);
    for (let i = 0; i < xs.length; i++) xs[i] = Math.random();
    const out = new Uint16Array(xs.length);
    quantise(xs, out, q);
    for (let i = 0; i < xs.length; i++) expect(out[i]).toBe(Math.round(srgbEncode(xs[i]!) * 65535));
    const lut = codeLut(16, true);
    const all = new Float32Array(65536);
    for (let k = 0; k < 65536; k++) all[k] = lut[k]!;
    const back = new Uint16Array(65536);
    quantise(all, back, q);
    for (let k = 0; k < 65536; k++) if (back[k] !== k) expect(back[k]).toBe(k);
  });
  it("quantising picks the code whose rounding interval holds x, also for floats next to an interval's edge", () => {
    // Rounding in encoded space: code k covers decode((k − ½)/max) ≤ x < decode((k + ½)/max),
    // decode being monotonic (IEC 61966-2-1); the reference counts edges in float64.
    const f = new Float32Array(1), u = new Uint32Array(f.buffer);
    const near = (x: number, d: number): number => { f[0] = x; u[0] = u[0]! + d; return f[0]; };
    for (const bits of [8, 16] as const) {
      for (const linear of [true, false]) {
        const max = bits === 8 ? 255 : 65535;
        const edge = (k: number): number => (linear ? srgbDecode((k + 0.5) / max) : (k + 0.5) / max);
        const xs: number[] = [];
        for (let k = 0; k < max; k += bits === 8 ? 1 : 13) for (const d of [-1, 0, 1]) xs.push(near(edge(k), d));
        for (let i = 0; i < 5000; i++) xs.push(Math.random() ** 3);
        const src = Float32Array.from(xs);
        const out = bits === 8 ? new Uint8Array(src.length) : new Uint16Array(src.length);
        quantise(src, out, quantiser(bits, linear));
        for (let i = 0; i < src.length; i++) {
          const x = src[i]!;
          let lo = 0, hi = max; // smallest k with edge(k) > x
          while (lo < hi) { const mid = (lo + hi) >> 1; if (edge(mid) > x) hi = mid; else lo = mid + 1; }
          if (out[i] !== lo) expect({ bits, linear, x, code: out[i] }).toEqual({ bits, linear, x, code: lo });
        }
      }
    }
  });
  it("8-bit linear: one compare per cell gives round(encode(x) · 255) at every cell's first and last float", () => {
    // Rounding in encoded space per IEC 61966-2-1; cells are the float's exponent and top 8
    // mantissa bits, so these are the floats where the cell table could go wrong.
    const q = quantiser(8, true);
    expect(q.cells).not.toBeNull();
    const f = new Float32Array(1), u = new Uint32Array(f.buffer);
    const xs: number[] = [];
    for (let b = 0x38000000; b < 0x3f800000; b += 1 << 15) for (const d of [0, -1, 1, 1 << 14]) { u[0] = b + d; xs.push(f[0]!); }
    const src = Float32Array.from(xs), out = new Uint8Array(src.length);
    quantise(src, out, q);
    for (let i = 0; i < src.length; i++) {
      const want = Math.round(srgbEncode(src[i]!) * 255);
      if (out[i] !== want) expect({ x: src[i], code: out[i] }).toEqual({ x: src[i], code: want });
    }
    const lut = codeLut(8, true), back = new Uint8Array(256);
    quantise(Float32Array.from(lut), back, q);
    expect(Array.from(back)).toEqual(Array.from({ length: 256 }, (_, k) => k));
  });
  it("8-bit in place in WebAssembly gives the same codes as the JS quantiser (edges, clips, NaN)", async () => {
    const { takeSimdRgb, releaseSimdRgb } = await import("@/lib/lab/simd");
    const q = quantiser(8, true);
    const f = new Float32Array(1), u = new Uint32Array(f.buffer);
    const xs: number[] = [-1, -0, 0, 1e-9, 1, 1.5, Infinity, -Infinity, NaN, 0.5];
    for (let k = 0; k < 255; k++) for (const d of [-1, 0, 1]) { f[0] = srgbDecode((k + 0.5) / 255); u[0] = u[0]! + d; xs.push(f[0]); }
    for (let i = 0; i < 3000; i++) xs.push(Math.sin(i) * 1.3);
    while (xs.length % 3) xs.push(0.25);
    const want = new Uint8Array(xs.length);
    quantise(Float32Array.from(xs), want, q);
    const a = takeSimdRgb(xs.length);
    a.set(xs);
    const got = quantise8Consuming(a, q);
    expect(got).not.toBeNull();
    expect(Array.from(got!)).toEqual(Array.from(want));
    releaseSimdRgb(a);
    expect(quantise8Consuming(Float32Array.from(xs), q)).toBeNull(); // not wasm memory: the JS path
  });
  it("clips only at quantisation: below 0 → 0, above 1 → max, NaN → 0", () => {
    const out = new Uint8Array(4);
    quantise(new Float32Array([-0.5, 1.5, NaN, 1]), out, quantiser(8, false));
    expect([...out]).toEqual([0, 255, 0, 255]);
  });
});
