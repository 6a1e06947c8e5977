/*
 * Single-frame noise estimate: J. Immerkær, "Fast Noise Variance Estimation", Computer Vision
 * and Image Understanding 64(2):300–302, 1996. The frame is convolved with the 3×3 mask
 *     N = [ 1 −2  1 ; −2  4 −2 ; 1 −2  1 ]
 * (the difference of two Laplacian masks; it is the outer product of [1 −2 1] with itself and
 * gives zero on any image that is a polynomial of degree ≤ 2 in x alone, y alone or xy), and
 *     σ = √(π/2) / (6 (W−2)(H−2)) · Σ |I ∗ N|
 * because for white Gaussian noise I ∗ N is Gaussian with standard deviation 6σ (the mask's
 * weights square-sum to 36) and E|X| = σ_X √(2/π). Pure and client-safe.
 *
 * `mask` restricts the sum to chosen centre pixels (the plate check leaves out markers, edges,
 * defects and clipped areas, which are structure, not noise); the normalisation then uses the
 * number of pixels summed instead of (W−2)(H−2). With no mask this is exactly the paper's estimate.
 */

export const IMMERKAER_SCALE = Math.sqrt(Math.PI / 2) / 6;

export type NoiseSum = { sumAbs: number; count: number };

/**
 * Σ |I ∗ N| and the number of terms over interior pixels (x, y in 1..W−2, 1..H−2) of channel `c`
 * of an interleaved image with `stride` values per pixel; only where `mask` is non-zero when given.
 */
export function laplacianAbsSum(data: Float32Array, width: number, height: number, stride: number, c: number, mask?: Uint8Array): NoiseSum {
  const all = laplacianAbsSums(data, width, height, stride, [c], mask);
  return { sumAbs: all.sums[0]!, count: all.count };
}

/**
 * Σ |I ∗ N| of all three channels of interleaved RGB in one pass (see laplacianAbsSum). With
 * `step` > 1 only centre pixels whose x and y are multiples of `step` are summed (each term is
 * still the full 3×3 mask).
 */
export function laplacianAbsSumsRgb(data: Float32Array, width: number, height: number, mask?: Uint8Array, step = 1): { sums: [number, number, number]; count: number } {
  let s0 = 0, s1 = 0, s2 = 0, count = 0;
  if (width < 3 || height < 3) return { sums: [0, 0, 0], count };
  if (step > 1) {
    const W3 = width * 3;
    for (let y = step; y < height - 1; y += step) {
      for (let x = step; x < width - 1; x += step) {
        if (mask !== undefined && mask[y * width + x] === 0) continue;
        const i = y * W3 + x * 3, u = i - W3, d = i + W3;
        const v0 = data[u - 3]! - 2 * data[u]! + data[u + 3]! - 2 * (data[i - 3]! - 2 * data[i]! + data[i + 3]!) + data[d - 3]! - 2 * data[d]! + data[d + 3]!;
        const v1 = data[u - 2]! - 2 * data[u + 1]! + data[u + 4]! - 2 * (data[i - 2]! - 2 * data[i + 1]! + data[i + 4]!) + data[d - 2]! - 2 * data[d + 1]! + data[d + 4]!;
        const v2 = data[u - 1]! - 2 * data[u + 2]! + data[u + 5]! - 2 * (data[i - 1]! - 2 * data[i + 2]! + data[i + 5]!) + data[d - 1]! - 2 * data[d + 2]! + data[d + 5]!;
        s0 += v0 < 0 ? -v0 : v0;
        s1 += v1 < 0 ? -v1 : v1;
        s2 += v2 < 0 ? -v2 : v2;
        count++;
      }
    }
    return { sums: [s0, s1, s2], count };
  }
  const W3 = width * 3;
  const rows = [new Float64Array(W3), new Float64Array(W3), new Float64Array(W3)];
  const second = (y: number, out: Float64Array): void => {
    const b = y * W3;
    for (let j = 3; j < W3 - 3; j++) out[j] = data[b + j - 3]! - 2 * data[b + j]! + data[b + j + 3]!;
  };
  second(0, rows[0]!);
  second(1, rows[1]!);
  for (let y = 1; y < height - 1; y++) {
    const a = rows[(y - 1) % 3]!, m = rows[y % 3]!, d = rows[(y + 1) % 3]!;
    second(y + 1, d);
    const mrow = y * width;
    for (let x = 1; x < width - 1; x++) {
      if (mask !== undefined && mask[mrow + x] === 0) continue;
      const o = x * 3;
      const v0 = a[o]! - 2 * m[o]! + d[o]!, v1 = a[o + 1]! - 2 * m[o + 1]! + d[o + 1]!, v2 = a[o + 2]! - 2 * m[o + 2]! + d[o + 2]!;
      s0 += v0 < 0 ? -v0 : v0;
      s1 += v1 < 0 ? -v1 : v1;
      s2 += v2 < 0 ? -v2 : v2;
      count++;
    }
  }
  return { sums: [s0, s1, s2], count };
}

/** As laplacianAbsSum for several channels in one pass over the rows. */
export function laplacianAbsSums(data: Float32Array, width: number, height: number, stride: number, channels: readonly number[], mask?: Uint8Array): { sums: number[]; count: number } {
  const k = channels.length;
  const sums = new Array<number>(k).fill(0);
  let count = 0;
  if (width < 3 || height < 3) return { sums, count };
  // N is separable: second difference along x of each row (all channels), then along y.
  const rows = [new Float64Array(width * k), new Float64Array(width * k), new Float64Array(width * k)];
  const second = (y: number, out: Float64Array): void => {
    const base = y * width * stride;
    for (let x = 1; x < width - 1; x++) {
      const i = base + x * stride;
      for (let j = 0; j < k; j++) {
        const c = channels[j]!;
        out[x * k + j] = data[i + c - stride]! - 2 * data[i + c]! + data[i + c + stride]!;
      }
    }
  };
  second(0, rows[0]!);
  second(1, rows[1]!);
  const acc = new Float64Array(k);
  for (let y = 1; y < height - 1; y++) {
    const above = rows[(y - 1) % 3]!, mid = rows[y % 3]!, below = rows[(y + 1) % 3]!;
    second(y + 1, below);
    const mrow = y * width;
    for (let x = 1; x < width - 1; x++) {
      if (mask && !mask[mrow + x]) continue;
      const o = x * k;
      for (let j = 0; j < k; j++) {
        const v = above[o + j]! - 2 * mid[o + j]! + below[o + j]!;
        acc[j]! += v < 0 ? -v : v;
      }
      count++;
    }
  }
  for (let j = 0; j < k; j++) sums[j] = acc[j]!;
  return { sums, count };
}

/** Immerkær's σ for one channel (in the units of `data`); NaN when nothing was summed. */
export function immerkaerSigma(data: Float32Array, width: number, height: number, stride = 1, c = 0, mask?: Uint8Array): { sigma: number; count: number } {
  const { sumAbs, count } = laplacianAbsSum(data, width, height, stride, c, mask);
  return { sigma: count ? (IMMERKAER_SCALE * sumAbs) / count : Number.NaN, count };
}

/**
 * A rough, robust σ per channel for thresholds: the median of |I ∗ N| over the whole frame
 * divided by 6 × 0.67449 (the median of |X| for a standard normal X is its 75th percentile,
 * 0.67449). Structure covering well under half the frame does not move a median; the final
 * figure the check reports is the mean form above over flat areas.
 */
export function robustSigma(data: Float32Array, width: number, height: number, stride: number, c: number, step = 2): number {
  if (width < 3 || height < 3) return 0;
  const values = new Float64Array(Math.ceil((height - 2) / step) * Math.ceil((width - 2) / step) + 1);
  let count = 0;
  for (let y = 1; y < height - 1; y += step) {
    const r = y * width * stride + c;
    for (let x = 1 + (y % step); x < width - 1; x += step) {
      const i = r + x * stride, up = i - width * stride, dn = i + width * stride;
      const v =
        data[up - stride]! - 2 * data[up]! + data[up + stride]! -
        2 * (data[i - stride]! - 2 * data[i]! + data[i + stride]!) +
        data[dn - stride]! - 2 * data[dn]! + data[dn + stride]!;
      values[count++] = v < 0 ? -v : v;
    }
  }
  if (!count) return 0;
  return median(values.subarray(0, count)) / (6 * 0.67449);
}

/** Median by selection (Hoare's quickselect), reordering `a`. */
export function median(a: Float64Array): number {
  const k = a.length >> 1;
  let lo = 0, hi = a.length - 1;
  while (lo < hi) {
    const pivot = a[(lo + hi) >> 1]!;
    let i = lo, j = hi;
    while (i <= j) {
      while (a[i]! < pivot) i++;
      while (a[j]! > pivot) j--;
      if (i <= j) {
        const t = a[i]!;
        a[i] = a[j]!;
        a[j] = t;
        i++;
        j--;
      }
    }
    if (k <= j) hi = j;
    else if (k >= i) lo = i;
    else break;
  }
  return a[k]!;
}
