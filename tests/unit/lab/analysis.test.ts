import { describe, expect, it } from "vitest";
import { boxMean, channelHistograms, lineProfile, type FloatImage } from "@/lib/lab/analysis";

// An image whose channels are affine in x and y: bilinear interpolation reproduces affine
// functions exactly (definition of bilinear interpolation; common practice, no published source).
function affine(w: number, h: number): FloatImage {
  const data = new Float32Array(w * h * 3);
  for (let y = 0; y < h; y++) for (let x = 0; x < w; x++) {
    const o = (y * w + x) * 3;
    data[o] = 0.01 * x;
    data[o + 1] = 0.02 * y;
    data[o + 2] = 0.5 + 0.01 * x - 0.005 * y;
  }
  return { width: w, height: h, data };
}

describe("line profile", () => {
  it("samples R, G, B along the line, bilinear between pixels", () => {
    const img = affine(50, 40);
    const p = lineProfile(img, { x: 3.25, y: 5.5 }, { x: 40.75, y: 30.1 }, 17);
    expect(p.t).toHaveLength(17);
    for (let i = 0; i < 17; i++) {
      expect(p.r[i]).toBeCloseTo(0.01 * p.x[i]!, 6);
      expect(p.g[i]).toBeCloseTo(0.02 * p.y[i]!, 6);
      expect(p.b[i]).toBeCloseTo(0.5 + 0.01 * p.x[i]! - 0.005 * p.y[i]!, 6);
    }
    expect(p.t[16]).toBeCloseTo(Math.hypot(37.5, 24.6), 9);
  });
});

describe("histograms and sample boxes", () => {
  it("counts every value once per channel, with out-of-range values apart", () => {
    const data = new Float32Array([0, 0.5, 1, 0.25, -0.1, 0.999, 0.75, 2, 0.5]);
    const h = channelHistograms({ width: 3, height: 1, data }, 4);
    expect(h.r).toEqual([1, 1, 0, 1]);
    expect(h.g).toEqual([0, 0, 1, 0]);
    expect(h.b).toEqual([0, 0, 1, 2]); // 1.0 falls in the last bin
    expect(h.below).toEqual([0, 1, 0]);
    expect(h.above).toEqual([0, 1, 0]);
    expect(h.edges).toEqual([0, 0.25, 0.5, 0.75, 1]);
  });
  it("box means average the pixels inside the box", () => {
    const img = affine(20, 10);
    const m = boxMean(img, 4, 2, 3, 2); // x 4..6, y 2..3
    expect(m[0]).toBeCloseTo(0.05, 6);
    expect(m[1]).toBeCloseTo(0.05, 6);
  });
});
