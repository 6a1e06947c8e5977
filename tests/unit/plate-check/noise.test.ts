import { describe, expect, it } from "vitest";
import { immerkaerSigma, laplacianAbsSums, laplacianAbsSumsRgb, median, robustSigma } from "@/lib/plate-check/noise";
import { mulberry32 } from "@/lib/random";
import { hasScipy, runPython } from "@/tests/plate-check/python";
import { gaussianSource } from "@/lib/lab/synthetic";

/*
 * The single-frame noise estimate. Source: J. Immerkær, "Fast Noise Variance Estimation",
 * Computer Vision and Image Understanding 64(2):300–302, 1996 — the citation verified against
 * independent write-ups and implementations of the method found with the search tool (same
 * journal, volume, issue and pages; mask [1 −2 1; −2 4 −2; 1 −2 1]; σ = √(π/2)/(6(W−2)(H−2))·Σ|I∗N|);
 * the paper itself was not read. Its behaviour on white Gaussian noise follows from the mask: I∗N
 * is Gaussian with standard deviation 6σ (weights square-sum to 36) and E|X| = σ_X·√(2/π), so the
 * estimate is unbiased on pure Gaussian noise.
 */

function noise(width: number, height: number, sigma: number, seed: number, offset = 0.5): Float32Array {
  const g = gaussianSource(mulberry32(seed));
  const a = new Float32Array(width * height);
  for (let i = 0; i < a.length; i++) a[i] = offset + sigma * g();
  return a;
}

describe("Immerkær's estimate on pure Gaussian noise (unbiased, by the paper's construction)", () => {
  for (const sigma of [0.002, 0.01, 0.05]) {
    it(`σ = ${sigma}: estimate within 1 % on 512×512 (expected standard error ≈ 0.2 %)`, () => {
      const { sigma: est, count } = immerkaerSigma(noise(512, 512, sigma, 11 + sigma * 1000), 512, 512);
      expect(count).toBe(510 * 510);
      expect(Math.abs(est / sigma - 1)).toBeLessThan(0.01);
    });
  }

  it("is unbiased over many frames: the mean of 40 estimates on 128×128 lies within 1 % of σ", () => {
    const ests = Array.from({ length: 40 }, (_, k) => immerkaerSigma(noise(128, 128, 0.02, 100 + k), 128, 128).sigma);
    const mean = ests.reduce((a, b) => a + b, 0) / ests.length;
    expect(Math.abs(mean / 0.02 - 1)).toBeLessThan(0.01);
  });

  it("ignores structure the mask annihilates: adding a plane and x², y² and xy terms changes nothing", () => {
    const W = 200, H = 150;
    const base = noise(W, H, 0.01, 5);
    const shaped = new Float32Array(base.length);
    for (let y = 0; y < H; y++) for (let x = 0; x < W; x++) {
      const u = x / W, v = y / H;
      shaped[y * W + x] = base[y * W + x]! + 0.2 * u - 0.1 * v + 0.3 * u * u + 0.25 * v * v - 0.2 * u * v;
    }
    const a = immerkaerSigma(base, W, H).sigma, b = immerkaerSigma(shaped, W, H).sigma;
    expect(Math.abs(b / a - 1)).toBeLessThan(1e-3);
  });

  it("the robust (median) form agrees with the mean form on Gaussian noise within 2 %", () => {
    const a = noise(400, 300, 0.01, 9);
    expect(Math.abs(robustSigma(a, 400, 300, 1, 0, 1) / 0.01 - 1)).toBeLessThan(0.02);
  });

  it("sums three interleaved channels in one pass exactly as one at a time, and sampled as the mask says", () => {
    const W = 64, H = 48;
    const rgb = new Float32Array(W * H * 3);
    const g = gaussianSource(mulberry32(3));
    for (let i = 0; i < rgb.length; i++) rgb[i] = 0.4 + 0.01 * g();
    const one = laplacianAbsSums(rgb, W, H, 3, [0, 1, 2]);
    const all = laplacianAbsSumsRgb(rgb, W, H);
    for (let c = 0; c < 3; c++) expect(all.sums[c]).toBeCloseTo(one.sums[c]!, 9);
    const mask = new Uint8Array(W * H);
    for (let y = 2; y < H - 1; y += 2) for (let x = 2; x < W - 1; x += 2) mask[y * W + x] = 1;
    const sampled = laplacianAbsSumsRgb(rgb, W, H, undefined, 2), masked = laplacianAbsSums(rgb, W, H, 3, [0, 1, 2], mask);
    expect(sampled.count).toBe(masked.count);
    for (let c = 0; c < 3; c++) expect(sampled.sums[c]).toBeCloseTo(masked.sums[c]!, 9);
  });

  it("median by selection equals the sorted middle", () => {
    const r = mulberry32(4);
    for (const n of [1, 2, 7, 100, 1001]) {
      const a = Float64Array.from({ length: n }, () => r());
      const sorted = Float64Array.from(a).sort();
      expect(median(a)).toBe(sorted[n >> 1]);
    }
  });
});

describe("against an independent reference: scipy.signal.convolve2d with the paper's mask (Debian python3-scipy)", () => {
  const script = `
import sys, json, numpy as np
from scipy.signal import convolve2d
d = sys.argv[1]
out = {}
for name, (w, h) in json.loads(open(d + "/meta.json").read()).items():
    img = np.fromfile(d + "/" + name + ".f32", dtype=np.float32).astype(np.float64).reshape(h, w)
    N = np.array([[1, -2, 1], [-2, 4, -2], [1, -2, 1]], dtype=np.float64)
    s = np.abs(convolve2d(img, N, mode="valid")).sum()
    out[name] = {"sum": float(s), "sigma": float(s * np.sqrt(0.5 * np.pi) / (6 * (w - 2) * (h - 2)))}
print(json.dumps(out))
`;
  it.skipIf(!hasScipy())("gives the same Σ|I∗N| and σ on noise and on a structured frame (relative 1e-9)", () => {
    const planes: Record<string, Float32Array> = { noise: noise(160, 90, 0.01, 21) };
    const structured = new Float32Array(160 * 90);
    const g = gaussianSource(mulberry32(8));
    for (let y = 0; y < 90; y++) for (let x = 0; x < 160; x++) structured[y * 160 + x] = (Math.hypot(x - 80, y - 45) < 20 ? 0.8 : 0.3) + 0.005 * g();
    planes.structured = structured;
    const ref = runPython(script, planes, { noise: [160, 90], structured: [160, 90] }) as Record<string, { sum: number; sigma: number }>;
    for (const name of Object.keys(planes)) {
      const ours = immerkaerSigma(planes[name]!, 160, 90);
      const sums = laplacianAbsSums(planes[name]!, 160, 90, 1, [0]);
      expect(Math.abs(sums.sums[0]! / ref[name]!.sum - 1), name).toBeLessThan(1e-9);
      expect(Math.abs(ours.sigma / ref[name]!.sigma - 1), name).toBeLessThan(1e-9);
    }
  });
});
