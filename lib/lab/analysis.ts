/*
 * Plot data for the lab page: line profiles and channel histograms of an interleaved RGB
 * float image. Client-safe (the page may compute them from a decoded preview too).
 */

export type FloatImage = { width: number; height: number; data: Float32Array };
export type Point = { x: number; y: number };
export type LineProfile = { t: number[]; x: number[]; y: number[]; r: number[]; g: number[]; b: number[] };

/** Bilinear sample of channel c at pixel-centre coordinates (x, y), edges clamped. */
function sampleBilinear(img: FloatImage, x: number, y: number, c: number): number {
  const { width, height, data } = img;
  const cx = Math.min(Math.max(x, 0), width - 1), cy = Math.min(Math.max(y, 0), height - 1);
  const x0 = Math.floor(cx), y0 = Math.floor(cy);
  const x1 = Math.min(x0 + 1, width - 1), y1 = Math.min(y0 + 1, height - 1);
  const fx = cx - x0, fy = cy - y0;
  const at = (xx: number, yy: number): number => data[(yy * width + xx) * 3 + c]!;
  const top = at(x0, y0) + (at(x1, y0) - at(x0, y0)) * fx;
  const bot = at(x0, y1) + (at(x1, y1) - at(x0, y1)) * fx;
  return top + (bot - top) * fy;
}

/** R, G, B along the segment p0 → p1; one sample per pixel of length unless `samples` is given. */
export function lineProfile(img: FloatImage, p0: Point, p1: Point, samples?: number): LineProfile {
  const len = Math.hypot(p1.x - p0.x, p1.y - p0.y);
  const n = Math.max(2, Math.min(10_000, samples ?? Math.round(len) + 1));
  const out: LineProfile = { t: [], x: [], y: [], r: [], g: [], b: [] };
  for (let i = 0; i < n; i++) {
    const t = i / (n - 1);
    const x = p0.x + (p1.x - p0.x) * t, y = p0.y + (p1.y - p0.y) * t;
    out.t.push(t * len);
    out.x.push(x);
    out.y.push(y);
    out.r.push(sampleBilinear(img, x, y, 0));
    out.g.push(sampleBilinear(img, x, y, 1));
    out.b.push(sampleBilinear(img, x, y, 2));
  }
  return out;
}

export type Histograms = { edges: number[]; r: number[]; g: number[]; b: number[]; below: number[]; above: number[] };

/** Per-channel counts in `bins` equal bins over [lo, hi]; values outside are counted apart. */
export function channelHistograms(img: FloatImage, bins = 256, lo = 0, hi = 1): Histograms {
  const counts = [new Float64Array(bins), new Float64Array(bins), new Float64Array(bins)];
  const below = [0, 0, 0], above = [0, 0, 0];
  const k = bins / (hi - lo);
  const { data } = img;
  for (let i = 0; i < data.length; i += 3) {
    for (let c = 0; c < 3; c++) {
      const v = data[i + c]!;
      // The top edge belongs to the last bin, so a 0..1 image's white is not "above".
      const bin = v === hi ? bins - 1 : Math.floor((v - lo) * k);
      if (bin < 0 || Number.isNaN(v)) below[c]!++;
      else if (bin >= bins) above[c]!++;
      else counts[c]![bin]!++;
    }
  }
  const edges = Array.from({ length: bins + 1 }, (_, i) => lo + (i * (hi - lo)) / bins);
  return { edges, r: Array.from(counts[0]!), g: Array.from(counts[1]!), b: Array.from(counts[2]!), below, above };
}

/** Mean RGB over a box (the solver's samples); the box is clipped to the image. */
export function boxMean(img: FloatImage, x: number, y: number, w: number, h: number): [number, number, number] {
  const x0 = Math.max(0, Math.floor(x)), y0 = Math.max(0, Math.floor(y));
  const x1 = Math.min(img.width, Math.ceil(x + w)), y1 = Math.min(img.height, Math.ceil(y + h));
  const s: [number, number, number] = [0, 0, 0];
  let n = 0;
  for (let yy = y0; yy < y1; yy++) for (let xx = x0; xx < x1; xx++) {
    const o = (yy * img.width + xx) * 3;
    s[0] += img.data[o]!; s[1] += img.data[o + 1]!; s[2] += img.data[o + 2]!;
    n++;
  }
  return n ? [s[0] / n, s[1] / n, s[2] / n] : [0, 0, 0];
}
