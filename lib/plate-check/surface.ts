import { median } from "@/lib/plate-check/noise";

/*
 * A smooth model of the backing (or of any flat background) in code values, and each pixel's
 * departure from it in units of noise. Pure.
 *
 * The model is a grid of block means taken only over pixels of the surface being modelled (the
 * screen-coloured pixels, or every pixel when there is no screen), interpolated bilinearly
 * between block centres: lighting on a screen changes slowly, so a block of ~1/64 of the frame
 * follows it. Blocks with too few such pixels are filled from their neighbours (a normalised
 * average on the block grid). Anything that departs from the model by many times the noise of a
 * 3×3 mean is a candidate spot: a marker, dust, a hair, a foreground edge.
 */

export type SurfaceGrid = {
  size: number;
  gw: number;
  gh: number;
  /** Block means, 3 values per block (code values). */
  mean: Float32Array;
  /** Pixels that went into each block's mean. */
  count: Float32Array;
};

export function blockSize(width: number, height: number): number {
  return Math.max(8, Math.round(Math.max(width, height) / 64));
}

/** 3×3 box mean of interleaved RGB (borders clamp), with three rows of horizontal sums in flight. */
export function boxMean3(src: Float32Array, width: number, height: number, out: Float32Array): void {
  const W3 = width * 3;
  const rows = [new Float32Array(W3), new Float32Array(W3), new Float32Array(W3)];
  const sumRow = (y: number, dst: Float32Array): void => {
    const r = y * W3;
    // Along a row, the same channel of the neighbours sits 3 values away.
    for (let j = 3, e = W3 - 3; j < e; j++) dst[j] = src[r + j - 3]! + src[r + j]! + src[r + j + 3]!;
    const k = width > 1 ? 3 : 0;
    for (let c = 0; c < 3; c++) {
      dst[c] = 2 * src[r + c]! + src[r + c + k]!;
      dst[W3 - 3 + c] = 2 * src[r + W3 - 3 + c]! + src[r + W3 - 3 + c - k]!;
    }
  };
  const ninth = 1 / 9;
  sumRow(0, rows[1]!);
  rows[0]!.set(rows[1]!);
  for (let y = 0; y < height; y++) {
    const up = rows[y % 3]!, mid = rows[(y + 1) % 3]!, dn = rows[(y + 2) % 3]!;
    if (y + 1 < height) sumRow(y + 1, dn);
    else dn.set(mid);
    const o = y * W3;
    for (let j = 0; j < W3; j++) out[o + j] = (up[j]! + mid[j]! + dn[j]!) * ninth;
  }
}

/** Block column of every x. */
export function blockColumns(width: number, size: number): Int32Array {
  const out = new Int32Array(width);
  for (let x = 0; x < width; x++) out[x] = (x / size) | 0;
  return out;
}

/**
 * Sets `out` to `hits` grown by `r` pixels (a square of side 2r + 1): along rows, then along
 * columns, each as a forward and a backward scan for the nearest hit.
 */
export function dilateMask(hits: Uint8Array, width: number, height: number, r: number, out: Uint8Array): void {
  const tmp = new Uint8Array(width * height);
  for (let y = 0; y < height; y++) dilateRow(hits, tmp, y * width, width, r);
  const last = new Int32Array(width).fill(-1 << 30);
  for (let y = 0; y < height; y++) {
    const o = y * width;
    for (let x = 0; x < width; x++) {
      if (tmp[o + x]) last[x] = y;
      out[o + x] = y - last[x]! <= r ? 1 : 0;
    }
  }
  last.fill(1 << 30);
  for (let y = height - 1; y >= 0; y--) {
    const o = y * width;
    for (let x = 0; x < width; x++) {
      if (tmp[o + x]) last[x] = y;
      if (last[x]! - y <= r) out[o + x] = 1;
    }
  }
}

function dilateRow(src: Uint8Array, dst: Uint8Array, o: number, width: number, r: number): void {
  let last = -1 << 30;
  for (let x = 0; x < width; x++) {
    if (src[o + x]) last = x;
    dst[o + x] = x - last <= r ? 1 : 0;
  }
  last = 1 << 30;
  for (let x = width - 1; x >= 0; x--) {
    if (src[o + x]) last = x;
    if (last - x <= r) dst[o + x] = 1;
  }
}

/**
 * Block means of `code` over pixels where `include` is set (all pixels when absent). With
 * `step` > 1 only every step-th pixel each way is read — pass 3×3 means as `code` then, so every
 * pixel still counts.
 */
export function blockMeans(code: Float32Array, width: number, height: number, size: number, include?: Uint8Array, step = 1): SurfaceGrid {
  const gw = Math.ceil(width / size), gh = Math.ceil(height / size);
  const sum = new Float64Array(gw * gh * 3), count = new Float32Array(gw * gh);
  const bx = blockColumns(width, size);
  for (let y = 0; y < height; y += step) {
    const gr = ((y / size) | 0) * gw;
    for (let x = 0, p = y * width; x < width; x += step, p += step) {
      if (include && !include[p]) continue;
      const g = gr + bx[x]!, i = p * 3;
      sum[g * 3]! += code[i]!;
      sum[g * 3 + 1]! += code[i + 1]!;
      sum[g * 3 + 2]! += code[i + 2]!;
      count[g]!++;
    }
  }
  const mean = new Float32Array(gw * gh * 3);
  for (let g = 0; g < gw * gh; g++) {
    const k = count[g]!;
    if (!k) continue;
    mean[g * 3] = sum[g * 3]! / k;
    mean[g * 3 + 1] = sum[g * 3 + 1]! / k;
    mean[g * 3 + 2] = sum[g * 3 + 2]! / k;
  }
  const grid = { size, gw, gh, mean, count };
  fillSparseBlocks(grid, Math.max(4, (0.15 * size * size) / (step * step)));
  return grid;
}

/**
 * Blocks with fewer than `minCount` pixels take a count-weighted average of the blocks around
 * them, the neighbourhood widening until some are found (normalised averaging on the grid).
 */
function fillSparseBlocks(grid: SurfaceGrid, minCount: number): void {
  const { gw, gh, mean, count } = grid;
  const sparse: number[] = [];
  for (let g = 0; g < gw * gh; g++) if (count[g]! < minCount) sparse.push(g);
  if (!sparse.length || sparse.length === gw * gh) return;
  const filled = new Float32Array(mean);
  for (const g of sparse) {
    const bx = g % gw, by = (g / gw) | 0;
    // The block's own few pixels count too, with their weight.
    for (let r = 1; r < Math.max(gw, gh); r *= 2) {
      let s0 = mean[g * 3]! * count[g]!, s1 = mean[g * 3 + 1]! * count[g]!, s2 = mean[g * 3 + 2]! * count[g]!, w = count[g]!;
      let strong = 0;
      for (let yy = Math.max(0, by - r); yy <= Math.min(gh - 1, by + r); yy++) {
        for (let xx = Math.max(0, bx - r); xx <= Math.min(gw - 1, bx + r); xx++) {
          const h = yy * gw + xx;
          if (h === g || count[h]! < minCount) continue;
          const d2 = (xx - bx) ** 2 + (yy - by) ** 2;
          const k = count[h]! / (1 + d2);
          s0 += mean[h * 3]! * k; s1 += mean[h * 3 + 1]! * k; s2 += mean[h * 3 + 2]! * k; w += k;
          strong++;
        }
      }
      if (strong) {
        filled[g * 3] = s0 / w; filled[g * 3 + 1] = s1 / w; filled[g * 3 + 2] = s2 / w;
        break;
      }
    }
  }
  grid.mean.set(filled);
}

/** Per column: the left block and the weight of the right one, for modelRow. */
export type ColumnTaps = { x0: Int32Array; x1: Int32Array; t: Float32Array };

export function columnTaps(grid: SurfaceGrid, width: number): ColumnTaps {
  const x0 = new Int32Array(width), x1 = new Int32Array(width), t = new Float32Array(width);
  for (let x = 0; x < width; x++) {
    const fx = Math.min(grid.gw - 1, Math.max(0, (x + 0.5) / grid.size - 0.5));
    x0[x] = Math.floor(fx);
    x1[x] = Math.min(grid.gw - 1, x0[x]! + 1);
    t[x] = fx - x0[x]!;
  }
  return { x0, x1, t };
}

/** The model's value along row y, 3 values per pixel (bilinear between block centres, ends held). */
export function modelRow(grid: SurfaceGrid, y: number, width: number, out: Float32Array, colBuf: Float32Array, taps: ColumnTaps = columnTaps(grid, width)): void {
  const { size, gw, gh, mean } = grid;
  const fy = Math.min(gh - 1, Math.max(0, (y + 0.5) / size - 0.5));
  const y0 = Math.floor(fy), y1 = Math.min(gh - 1, y0 + 1), ty = fy - y0;
  for (let bx = 0; bx < gw; bx++) {
    const a = (y0 * gw + bx) * 3, b = (y1 * gw + bx) * 3;
    colBuf[bx * 3] = mean[a]! + (mean[b]! - mean[a]!) * ty;
    colBuf[bx * 3 + 1] = mean[a + 1]! + (mean[b + 1]! - mean[a + 1]!) * ty;
    colBuf[bx * 3 + 2] = mean[a + 2]! + (mean[b + 2]! - mean[a + 2]!) * ty;
  }
  const { x0: X0, x1: X1, t: T } = taps;
  for (let x = 0; x < width; x++) {
    const tx = T[x]!, a = X0[x]! * 3, b = X1[x]! * 3, o = x * 3;
    out[o] = colBuf[a]! + (colBuf[b]! - colBuf[a]!) * tx;
    out[o + 1] = colBuf[a + 1]! + (colBuf[b + 1]! - colBuf[a + 1]!) * tx;
    out[o + 2] = colBuf[a + 2]! + (colBuf[b + 2]! - colBuf[a + 2]!) * tx;
  }
}

/** The model at one pixel (for the few pixels of a spot). */
export function modelAt(grid: SurfaceGrid, x: number, y: number, out: [number, number, number]): [number, number, number] {
  const { size, gw, gh, mean } = grid;
  const fy = Math.min(gh - 1, Math.max(0, (y + 0.5) / size - 0.5)), fx = Math.min(gw - 1, Math.max(0, (x + 0.5) / size - 0.5));
  const y0 = Math.floor(fy), y1 = Math.min(gh - 1, y0 + 1), ty = fy - y0;
  const x0 = Math.floor(fx), x1 = Math.min(gw - 1, x0 + 1), tx = fx - x0;
  for (let c = 0; c < 3; c++) {
    const a = mean[(y0 * gw + x0) * 3 + c]!, b = mean[(y0 * gw + x1) * 3 + c]!;
    const d = mean[(y1 * gw + x0) * 3 + c]!, e = mean[(y1 * gw + x1) * 3 + c]!;
    const top = a + (b - a) * tx, bot = d + (e - d) * tx;
    out[c] = top + (bot - top) * ty;
  }
  return out;
}

/**
 * Noise of the 3×3 means around the model, per channel: 1.4826 × the median absolute residual
 * over sampled pixels where `include` is set (a normal's MAD scale; robust to spots).
 */
export function residualSigma(smooth: Float32Array, grid: SurfaceGrid, width: number, height: number, include?: Uint8Array, step = 3): [number, number, number] {
  const cap = Math.ceil(height / step) * Math.ceil(width / step);
  const res = [new Float64Array(cap), new Float64Array(cap), new Float64Array(cap)];
  let count = 0;
  const row = new Float32Array(width * 3), col = new Float32Array(grid.gw * 3);
  const xs = columnTaps(grid, width);
  // Sample positions on the even grid, where fitSurface marks what to leave out.
  for (let y = step; y < height - 1; y += step) {
    modelRow(grid, y, width, row, col, xs);
    for (let x = step; x < width - 1; x += step) {
      const p = y * width + x;
      if (include && !include[p]) continue;
      for (let c = 0; c < 3; c++) res[c]![count] = Math.abs(smooth[p * 3 + c]! - row[x * 3 + c]!);
      count++;
    }
  }
  return res.map((r) => (count ? 1.4826 * median(r.subarray(0, count)) : 0)) as [number, number, number];
}

/** z² per pixel: Σ_c ((3×3 mean − model) / σ_c)². */
export function deviationMap(smooth: Float32Array, grid: SurfaceGrid, width: number, height: number, sigma: readonly number[], out: Float32Array): void {
  const row = new Float32Array(width * 3), col = new Float32Array(grid.gw * 3);
  const xs = columnTaps(grid, width);
  const k0 = 1 / Math.max(sigma[0]!, 1e-7) ** 2, k1 = 1 / Math.max(sigma[1]!, 1e-7) ** 2, k2 = 1 / Math.max(sigma[2]!, 1e-7) ** 2;
  for (let y = 0, p = 0; y < height; y++) {
    modelRow(grid, y, width, row, col, xs);
    for (let x = 0; x < width; x++, p++) {
      const i = p * 3, o = x * 3;
      const d0 = smooth[i]! - row[o]!, d1 = smooth[i + 1]! - row[o + 1]!, d2 = smooth[i + 2]! - row[o + 2]!;
      out[p] = d0 * d0 * k0 + d1 * d1 * k1 + d2 * d2 * k2;
    }
    // The outermost pixels' 3×3 means repeat edge values, so their noise is not the interior's:
    // nothing is judged there.
    out[y * width] = 0;
    out[y * width + width - 1] = 0;
    if (y === 0 || y === height - 1) out.fill(0, y * width, (y + 1) * width);
  }
}

/**
 * Marks pixels on the every-`step`-th grid whose sampled neighbours (this one and the eight around
 * it on that grid) include one departing by more than z² > `threshold` from the model.
 */
export function strongNearSampled(smooth: Float32Array, grid: SurfaceGrid, width: number, height: number, sigma: readonly number[], threshold: number, step: number): Uint8Array {
  const sw = Math.ceil(width / step), sh = Math.ceil(height / step);
  const hits = new Uint8Array(sw * sh);
  const k0 = 1 / Math.max(sigma[0]!, 1e-7) ** 2, k1 = 1 / Math.max(sigma[1]!, 1e-7) ** 2, k2 = 1 / Math.max(sigma[2]!, 1e-7) ** 2;
  const row = new Float32Array(width * 3), col = new Float32Array(grid.gw * 3);
  const xs = columnTaps(grid, width);
  for (let j = 0; j < sh; j++) {
    const y = j * step;
    modelRow(grid, y, width, row, col, xs);
    for (let i = 0; i < sw; i++) {
      const x = i * step, q = (y * width + x) * 3, o = x * 3;
      const d0 = smooth[q]! - row[o]!, d1 = smooth[q + 1]! - row[o + 1]!, d2 = smooth[q + 2]! - row[o + 2]!;
      if (d0 * d0 * k0 + d1 * d1 * k1 + d2 * d2 * k2 > threshold) hits[j * sw + i] = 1;
    }
  }
  const near = new Uint8Array(sw * sh);
  dilateMask(hits, sw, sh, 1, near);
  const out = new Uint8Array(width * height);
  for (let j = 0; j < sh; j++) for (let i = 0; i < sw; i++) if (near[j * sw + i]) out[j * step * width + i * step] = 1;
  return out;
}

/** Sets `out` where a 3×3 neighbourhood of `map` has a value above `threshold` (dilation by 1). */
export function dilateThreshold(map: Float32Array, width: number, height: number, threshold: number, out: Uint8Array): void {
  const hits = new Uint8Array(width * height);
  for (let p = 0; p < hits.length; p++) hits[p] = map[p]! > threshold ? 1 : 0;
  dilateMask(hits, width, height, 1, out);
}

/**
 * Takes out of `mask` the blocks of screen colour that cannot be screen: those departing from the
 * median of the blocks around them (7×7) by more than `maxDeparture` of its value in some channel
 * (lighting on a screen changes slowly), and those outside `globalRange` × the median of all such
 * blocks (a screen lit from under half to twice its usual level is not keyable; rule of thumb) —
 * a costume or prop in a similar hue, only darker or brighter. Returns how many were taken out.
 */
export function dropDepartingBlocks(grid: SurfaceGrid, mask: Uint8Array, width: number, height: number, globalRange: [number, number], maxDeparture = 0.12, step = 2): number {
  const { size, gw, gh, mean, count } = grid;
  const full = (size * size) / (step * step);
  const considered = (g: number) => count[g]! >= 0.25 * full;
  const dropped: number[] = [];
  const considered8 = new Uint8Array(gw * gh);
  for (let g = 0; g < gw * gh; g++) considered8[g] = considered(g) ? 1 : 0;
  const all = new Float64Array(gw * gh);
  const globalMedian = [0, 0, 0].map((_, c) => {
    let k = 0;
    for (let g = 0; g < gw * gh; g++) if (considered8[g]) all[k++] = mean[g * 3 + c]!;
    return k ? all.subarray(0, k).sort()[k >> 1]! : 0;
  });
  const near = new Float64Array(49);
  for (let by = 0; by < gh; by++) {
    for (let bx = 0; bx < gw; bx++) {
      const g = by * gw + bx;
      if (!considered8[g]) continue;
      let departs = false;
      for (let c = 0; c < 3 && !departs; c++) {
        const k = mean[g * 3 + c]! / Math.max(globalMedian[c]!, 1e-6);
        if (k < globalRange[0] || k > globalRange[1]) departs = true;
      }
      for (let c = 0; c < 3 && !departs; c++) {
        let k = 0;
        for (let yy = Math.max(0, by - 3); yy <= Math.min(gh - 1, by + 3); yy++) {
          for (let xx = Math.max(0, bx - 3); xx <= Math.min(gw - 1, bx + 3); xx++) {
            const h = yy * gw + xx;
            if (considered8[h]) near[k++] = mean[h * 3 + c]!;
          }
        }
        if (k < 9) break;
        const med = near.subarray(0, k).sort()[k >> 1]!;
        if (Math.abs(mean[g * 3 + c]! - med) > maxDeparture * Math.max(med, 0.02)) departs = true;
      }
      if (departs) dropped.push(g);
    }
  }
  for (const g of dropped) {
    const bx = g % gw, by = (g / gw) | 0;
    for (let y = by * size; y < Math.min(height, (by + 1) * size); y++) mask.fill(0, y * width + bx * size, y * width + Math.min(width, (bx + 1) * size));
  }
  return dropped.length;
}
