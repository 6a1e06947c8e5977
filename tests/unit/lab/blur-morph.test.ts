import sharp from "sharp";
import { describe, expect, it } from "vitest";
import { blurPlaneApprox, morphPlane } from "@/lib/lab/kernels";

function rand(seed: number): () => number {
  let a = seed >>> 0;
  return () => ((a = (Math.imul(a, 1664525) + 1013904223) >>> 0) / 2 ** 32);
}

function testPlane(width: number, height: number, seed: number): Float32Array {
  const r = rand(seed);
  const p = new Float32Array(width * height);
  // A matte-like plane: hard-edged blobs plus noise, values beyond 0..1 included.
  for (let y = 0; y < height; y++) for (let x = 0; x < width; x++) {
    const blob = ((x >> 4) + (y >> 3)) % 3 === 0 ? 1 : 0;
    p[y * width + x] = blob + (r() - 0.5) * 0.4;
  }
  return p;
}

describe("proxy (approximate) Gaussian blur against the sampled Gaussian it approximates", () => {
  // The exact Gaussian is checked against scipy in gaussian-reference.test.ts; here the proxy's
  // fast blur against the definition (bruteBlur below), everywhere including the borders.
  // [sigma, tolerance within 4σ of the border, tolerance further in]
  const cases: [number, number, number][] = [
    [1.5, 1e-6, 1e-6], // within the FIR range: the sampled kernel itself (float32 arithmetic)
    [3, 1e-6, 1e-6],
    [12, 6e-2, 5e-3], // reduced-resolution path (box-reduce, blur, bilinear): an approximation, worst at the borders
  ];
  for (const [sigma, tolBorder, tolInside] of cases) {
    it(`σ = ${sigma} agrees within ${tolBorder} near the borders and ${tolInside} inside`, () => {
      const w = 200, h = 150;
      const p = testPlane(w, h, 11);
      const ref = bruteBlur(p, w, h, sigma);
      const ours = new Float32Array(p);
      blurPlaneApprox(ours, w, h, sigma, new Float32Array(w * h));
      const m = Math.ceil(4 * sigma);
      let worst = 0, worstInside = 0, moved = 0;
      for (let y = 0; y < h; y++) for (let x = 0; x < w; x++) {
        const i = y * w + x, d = Math.abs(ours[i]! - ref[i]!);
        worst = Math.max(worst, d);
        if (x >= m && y >= m && x < w - m && y < h - m) worstInside = Math.max(worstInside, d);
        moved = Math.max(moved, Math.abs(ref[i]! - p[i]!));
      }
      expect(worst).toBeLessThan(tolBorder);
      expect(worstInside).toBeLessThan(tolInside);
      expect(moved).toBeGreaterThan(0.1); // the comparison means something only if the blur changed the plane
    });
  }
  it("keeps a constant plane constant (normalised kernel)", () => {
    for (const sigma of [0.7, 4, 30]) {
      const p = new Float32Array(90 * 70).fill(0.37);
      blurPlaneApprox(p, 90, 70, sigma, new Float32Array(90 * 70));
      for (const v of p) expect(v).toBeCloseTo(0.37, 6);
    }
  });
});

/** Running max/min over a (2r+1)² square, clipped to the frame: the definition (Serra 1982). */
function bruteMorph(p: Float32Array, w: number, h: number, px: number): Float32Array {
  const r = Math.abs(px), out = new Float32Array(w * h);
  for (let y = 0; y < h; y++) for (let x = 0; x < w; x++) {
    let m = px > 0 ? -Infinity : Infinity;
    for (let yy = Math.max(0, y - r); yy <= Math.min(h - 1, y + r); yy++) {
      for (let xx = Math.max(0, x - r); xx <= Math.min(w - 1, x + r); xx++) {
        const v = p[yy * w + xx]!;
        m = px > 0 ? Math.max(m, v) : Math.min(m, v);
      }
    }
    out[y * w + x] = m;
  }
  return out;
}

describe("grow / shrink (grey-level dilation / erosion)", () => {
  // Both code paths: direct running max (r ≤ 3) and van Herk / Gil–Werman (r > 3).
  for (const px of [1, 2, -3, 4, -7, 12]) {
    it(`equals the running max/min definition for ${px} px (Serra 1982)`, () => {
      const w = 53, h = 41;
      const p = testPlane(w, h, 100 + px);
      const ours = new Float32Array(p);
      morphPlane(ours, w, h, px);
      expect(Array.from(ours)).toEqual(Array.from(bruteMorph(p, w, h, px)));
    });
  }

  it("dilating a single pixel by r gives the (2r+1)² structuring element (Gonzalez & Woods)", () => {
    const w = 21, h = 21, p = new Float32Array(w * h);
    p[10 * w + 10] = 1;
    morphPlane(p, w, h, 4);
    for (let y = 0; y < h; y++) for (let x = 0; x < w; x++) {
      expect(p[y * w + x]).toBe(Math.abs(x - 10) <= 4 && Math.abs(y - 10) <= 4 ? 1 : 0);
    }
  });

  it("closing (dilate then erode) is idempotent (Serra 1982)", () => {
    const w = 64, h = 48;
    const close = (a: Float32Array): Float32Array => {
      const b = new Float32Array(a);
      morphPlane(b, w, h, 3);
      morphPlane(b, w, h, -3);
      return b;
    };
    const once = close(testPlane(w, h, 9));
    expect(Array.from(close(once))).toEqual(Array.from(once));
  });

  // libvips morphology on binary 0/255 mattes; its sense is inverted for white-on-black
  // (LAB-NOTES.md): sharp.erode(r) grows white by a (2r+1)² square, sharp.dilate(r) shrinks it.
  for (const px of [2, -2, 5]) {
    it(`agrees with libvips on a binary matte, ${px} px (away from the borders)`, async () => {
      const w = 80, h = 60, r = rand(px + 50);
      const bin = new Uint8Array(w * h);
      for (let i = 0; i < 25; i++) {
        const cx = Math.floor(r() * w), cy = Math.floor(r() * h), s = 1 + Math.floor(r() * 5);
        for (let y = cy - s; y <= cy + s; y++) for (let x = cx - s; x <= cx + s; x++) if (x >= 0 && y >= 0 && x < w && y < h) bin[y * w + x] = 255;
      }
      const img = sharp(Buffer.from(bin), { raw: { width: w, height: h, channels: 1 } });
      const ref = await (px > 0 ? img.erode(px) : img.dilate(-px)).toColourspace("b-w").raw().toBuffer();
      const ours = Float32Array.from(bin, (v) => v / 255);
      morphPlane(ours, w, h, px);
      const m = Math.abs(px);
      for (let y = m; y < h - m; y++) for (let x = m; x < w - m; x++) expect(ours[y * w + x]! * 255).toBe(ref[y * w + x]);
    });
  }
});

/** A marker-matte-like plane: zero except a few blobs, some touching the frame's edges. */
function sparsePlane(width: number, height: number, seed: number): Float32Array {
  const r = rand(seed), p = new Float32Array(width * height);
  const blobs: [number, number][] = [[0, 3], [width - 2, height - 1], [Math.floor(width / 2), 0], [5, Math.floor(height / 2)]];
  for (let i = 0; i < 4; i++) blobs.push([Math.floor(r() * width), Math.floor(r() * height)]);
  for (const [cx, cy] of blobs) {
    for (let y = cy - 1; y <= cy + 2; y++) for (let x = cx - 2; x <= cx + 1; x++) {
      if (x >= 0 && y >= 0 && x < width && y < height) p[y * width + x] = 0.2 + r();
    }
  }
  return p;
}

/** Separable Gaussian from the definition (cut at round(4σ)), border pixels repeated. */
function bruteBlur(p: Float32Array, w: number, h: number, sigma: number): Float64Array {
  const r = Math.floor(4 * sigma + 0.5);
  const k: number[] = [];
  let s = 0;
  for (let i = -r; i <= r; i++) { const v = Math.exp(-(i * i) / (2 * sigma * sigma)); k.push(v); s += v; }
  const tmp = new Float64Array(w * h), out = new Float64Array(w * h);
  const cl = (v: number, n: number): number => (v < 0 ? 0 : v >= n ? n - 1 : v);
  for (let y = 0; y < h; y++) for (let x = 0; x < w; x++) {
    let a = 0;
    for (let t = -r; t <= r; t++) a += (k[t + r]! / s) * p[y * w + cl(x + t, w)]!;
    tmp[y * w + x] = a;
  }
  for (let y = 0; y < h; y++) for (let x = 0; x < w; x++) {
    let a = 0;
    for (let t = -r; t <= r; t++) a += (k[t + r]! / s) * tmp[cl(y + t, h) * w + x]!;
    out[y * w + x] = a;
  }
  return out;
}

describe("mostly-zero planes (only each row's non-zero span is computed)", () => {
  // Widths give column blocks narrower than the radius (61: 2 columns) and wider (227: 8).
  for (const [px, w] of [[1, 61], [2, 61], [3, 61], [-2, 61], [2, 227], [3, 227]] as const) {
    it(`grow/shrink ${px} px equals the running max/min definition everywhere, ${w} wide (Serra 1982)`, () => {
      const h = 37;
      const p = sparsePlane(w, h, 200 + px);
      const ours = new Float32Array(p);
      morphPlane(ours, w, h, px);
      expect(Array.from(ours)).toEqual(Array.from(bruteMorph(p, w, h, px)));
    });
  }
  for (const [sigma, w] of [[0.6, 61], [1.2, 61], [3, 61], [1.2, 227], [3, 227]] as const) {
    it(`blur σ = ${sigma} equals the sampled Gaussian (edges repeated) everywhere, zeros far from the blobs, ${w} wide`, () => {
      const h = 37;
      const p = sparsePlane(w, h, 300);
      const ours = new Float32Array(p);
      blurPlaneApprox(ours, w, h, sigma, new Float32Array(w * h).fill(7)); // dirty scratch must not leak through
      const ref = bruteBlur(p, w, h, sigma);
      let worst = 0, moved = 0;
      for (let i = 0; i < p.length; i++) {
        worst = Math.max(worst, Math.abs(ours[i]! - ref[i]!));
        moved = Math.max(moved, Math.abs(ref[i]! - p[i]!));
        if (ref[i] === 0) expect(ours[i]).toBe(0);
      }
      expect(worst).toBeLessThan(1e-6); // float32 arithmetic against float64
      expect(moved).toBeGreaterThan(0.1);
    });
  }
});
