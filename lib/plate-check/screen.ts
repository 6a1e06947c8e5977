import { hueDegrees, hueDelta, luminance709, saturation } from "@/lib/plate-check/image";

/*
 * The backing screen: is there one, which colour, how much of the frame, how even. Pure.
 *
 * First guess from blocks of the frame: among blocks that are flat (their code values vary no
 * more than the grain) and saturated, the most common hue — if it is a backing hue (green through
 * blue; other saturated backgrounds are not counted, as backings in this trade are green or blue:
 * common practice, no published source) and enough blocks carry it. Then per pixel: screen-like
 * where the 3×3 mean's colour points the same way as the screen's (an RGB angle, which does not
 * change with brightness, so fall-off and hot spots stay screen).
 */

export type ScreenGuess = {
  hue: number;
  saturation: number;
  /** Unit vector of the screen's colour in code values. */
  direction: [number, number, number];
  /** Share of all blocks that voted for this hue. */
  support: number;
};

export const SCREEN_HUE_RANGE: [number, number] = [50, 290];
/** Least share of the frame a screen must cover to be called present (own rule). */
export const MIN_SCREEN_COVERAGE = 0.12;
/** Above this a screen is uneven enough to be worth flattening (rule of thumb, no published source). */
export const UNEVEN_SCREEN_PERCENT = 10;

export function guessScreen(
  code: Float32Array,
  linear: Float32Array,
  width: number,
  height: number,
  size: number,
  sigma: readonly number[],
): ScreenGuess | null {
  const gw = Math.ceil(width / size), gh = Math.ceil(height / size), nb = gw * gh;
  const lin = new Float64Array(nb * 3), cs = new Float64Array(nb * 3), cq = new Float64Array(nb * 3), cnt = new Float64Array(nb);
  // Every other pixel each way: a block's mean and spread need no more than a quarter of its pixels.
  for (let y = 0; y < height; y += 2) {
    const gr = ((y / size) | 0) * gw;
    for (let x = y & 2 ? 1 : 0; x < width; x += 2) {
      const g = gr + ((x / size) | 0), i = (y * width + x) * 3, o = g * 3;
      for (let c = 0; c < 3; c++) {
        const v = code[i + c]!;
        lin[o + c]! += linear[i + c]!;
        cs[o + c]! += v;
        cq[o + c]! += v * v;
      }
      cnt[g]!++;
    }
  }
  const hist = new Float64Array(360);
  const blocks: { hue: number; sat: number; dir: [number, number, number] }[] = [];
  for (let g = 0; g < nb; g++) {
    const k = cnt[g]!;
    if (k < size * size * 0.12) continue;
    let flat = true;
    for (let c = 0; c < 3; c++) {
      const m = cs[g * 3 + c]! / k;
      const sd = Math.sqrt(Math.max(0, cq[g * 3 + c]! / k - m * m));
      if (sd > 2.5 * sigma[c]! + 0.004) flat = false;
    }
    if (!flat) continue;
    const r = lin[g * 3]! / k, gg = lin[g * 3 + 1]! / k, b = lin[g * 3 + 2]! / k;
    const sat = saturation(r, gg, b);
    if (sat < 0.3 || Math.max(r, gg, b) < 0.005) continue;
    const hue = hueDegrees(r, gg, b);
    if (hue < SCREEN_HUE_RANGE[0] || hue > SCREEN_HUE_RANGE[1]) continue;
    const c0 = cs[g * 3]! / k, c1 = cs[g * 3 + 1]! / k, c2 = cs[g * 3 + 2]! / k, n = Math.hypot(c0, c1, c2);
    blocks.push({ hue, sat, dir: [c0 / n, c1 / n, c2 / n] });
    hist[Math.floor(hue) % 360]!++;
  }
  if (!blocks.length) return null;
  let peak = 0, best = -1;
  for (let h = 0; h < 360; h++) {
    let s = 0;
    for (let d = -5; d <= 5; d++) s += hist[(h + d + 360) % 360]!;
    if (s > best) { best = s; peak = h; }
  }
  const near = blocks.filter((b) => Math.abs(hueDelta(b.hue, peak + 0.5)) <= 15);
  const support = near.length / nb;
  if (support < 0.06) return null;
  const dir: [number, number, number] = [0, 0, 0];
  for (const b of near) { dir[0] += b.dir[0]; dir[1] += b.dir[1]; dir[2] += b.dir[2]; }
  const dn = Math.hypot(...dir);
  const sats = near.map((b) => b.sat).sort((a, b) => a - b);
  const hues = near.map((b) => b.hue);
  const meanHue = peak + 0.5 + hues.reduce((a, h) => a + hueDelta(h, peak + 0.5), 0) / hues.length;
  return { hue: (meanHue + 360) % 360, saturation: sats[sats.length >> 1]!, direction: [dir[0] / dn, dir[1] / dn, dir[2] / dn], support };
}

/** Screen-like pixels: the 3×3 mean's colour within `maxAngle` degrees of the screen's (code values). */
export function screenLikeMask(smooth: Float32Array, width: number, height: number, guess: ScreenGuess, out: Uint8Array, maxAngle = 10): number {
  const [u0, u1, u2] = guess.direction;
  const cosT = Math.cos((maxAngle * Math.PI) / 180);
  let count = 0;
  for (let p = 0, n = width * height; p < n; p++) {
    const i = p * 3;
    const a = smooth[i]!, b = smooth[i + 1]!, c = smooth[i + 2]!;
    const len = Math.sqrt(a * a + b * b + c * c);
    const ok = len > 0.02 && a * u0 + b * u1 + c * u2 >= cosT * len;
    out[p] = ok ? 1 : 0;
    if (ok) count++;
  }
  return count;
}

export type ScreenStats = {
  pixels: number;
  meanLinear: [number, number, number];
  hue: number;
  saturation: number;
  /** (P95 − P5) / P50 of block-mean luminance over full screen blocks, per cent. */
  unevenness: number;
  /** Blocks the unevenness was measured over. */
  blocks: number;
  /** Brightest and darkest screen block relative to the median (for the words on the page). */
  range: [number, number];
  /** Coarse map: share of each cell that is clean screen, 0..255. */
  grid: { width: number; height: number; cell: number; data: Uint8Array };
};

/**
 * Statistics of the clean screen (`mask`: screen-like and not part of any spot), read at every
 * `step`-th pixel each way (shares and means need no more; `pixels` is scaled back up).
 */
export function screenStats(linear: Float32Array, width: number, height: number, mask: Uint8Array, size: number, step = 1, maxGrid = 256): ScreenStats {
  const gw = Math.ceil(width / size), gh = Math.ceil(height / size);
  const sums = new Float64Array(gw * gh * 3), cnt = new Float64Array(gw * gh), tot = new Float64Array(gw * gh);
  const cell = Math.max(1, Math.ceil(Math.max(width, height) / maxGrid));
  const cw = Math.ceil(width / cell), ch = Math.ceil(height / cell);
  const cellHit = new Uint32Array(cw * ch), cellAll = new Uint32Array(cw * ch);
  const total: [number, number, number] = [0, 0, 0];
  let pixels = 0;
  const bx = new Int32Array(width), cx = new Int32Array(width);
  for (let x = 0; x < width; x++) { bx[x] = (x / size) | 0; cx[x] = (x / cell) | 0; }
  for (let y = 0; y < height; y += step) {
    const gr = ((y / size) | 0) * gw, cr = ((y / cell) | 0) * cw;
    for (let x = 0, p = y * width; x < width; x += step, p += step) {
      const g = gr + bx[x]!, q = cr + cx[x]!;
      tot[g]!++;
      cellAll[q]!++;
      if (!mask[p]) continue;
      cellHit[q]!++;
      const i = p * 3;
      sums[g * 3]! += linear[i]!; sums[g * 3 + 1]! += linear[i + 1]!; sums[g * 3 + 2]! += linear[i + 2]!;
      cnt[g]!++;
      pixels++;
    }
  }
  for (let g = 0; g < gw * gh; g++) { total[0] += sums[g * 3]!; total[1] += sums[g * 3 + 1]!; total[2] += sums[g * 3 + 2]!; }
  const meanLinear = total.map((v) => (pixels ? v / pixels : 0)) as [number, number, number];
  let ys: number[] = [];
  for (const share of [0.8, 0.5]) {
    ys = [];
    for (let g = 0; g < gw * gh; g++) {
      if (!tot[g] || cnt[g]! < share * tot[g]!) continue;
      const k = cnt[g]!;
      ys.push(luminance709(sums[g * 3]! / k, sums[g * 3 + 1]! / k, sums[g * 3 + 2]! / k));
    }
    if (ys.length >= 8) break;
  }
  ys.sort((a, b) => a - b);
  const q = (p: number): number => (ys.length ? ys[Math.min(ys.length - 1, Math.floor(p * (ys.length - 1)))]! : 0);
  const med = q(0.5);
  const data = new Uint8Array(cw * ch);
  for (let i = 0; i < data.length; i++) data[i] = cellAll[i] ? Math.round((255 * cellHit[i]!) / cellAll[i]!) : 0;
  return {
    pixels: pixels * step * step,
    meanLinear,
    hue: hueDegrees(...meanLinear),
    saturation: saturation(...meanLinear),
    unevenness: med > 0 ? ((q(0.95) - q(0.05)) / med) * 100 : 0,
    blocks: ys.length,
    range: med > 0 ? [q(1) / med, q(0) / med] : [1, 1],
    grid: { width: cw, height: ch, cell, data },
  };
}

/** Plain name for a screen hue (HSV hue of its linear colour). */
export function screenKind(hue: number): "green" | "cyan" | "blue" | "other" {
  if (hue >= 75 && hue < 165) return "green";
  if (hue >= 165 && hue < 195) return "cyan";
  if (hue >= 195 && hue < 265) return "blue";
  return "other";
}
