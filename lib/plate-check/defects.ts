import type { Channel } from "@/lib/plate-check/image";

/*
 * Dead, hot and stuck pixels: single photosites that disagree with every neighbour. Pure.
 *
 * A channel of a pixel is flagged when its stored value stands more than a threshold T above the
 * second-brightest of its eight neighbours (or below the second-darkest) — the second, not the
 * first, so two defects side by side are both found — and when no structure around it predicts
 * it: neither the mean of two opposite neighbours (a pixel on a line or an edge) nor a straight
 * extrapolation from two pixels on one side (the tip of a line or of a soft blob continues what
 * lies behind it) comes within T₂ of its value — and when no pixel two out has nearly its value
 * with a pixel partway there joining them (a thin line crossing the grid at an angle zig-zags,
 * so its pixels are not all predicted by their neighbours, but its value reappears along it). T is
 * 7σ of the frame's noise and T₂ 8σ, at least 2 % and 3 % of full scale (own rules; a Gaussian
 * tail beyond 7σ is about 1 in 10¹¹); a pixel out in all three channels the same way is judged
 * on the three together with lower thresholds (jointThresholds).
 */

export type DefectKind = "hot" | "dead" | "stuck";
export type Defect = {
  x: number;
  y: number;
  kind: DefectKind;
  /** Channels that disagree with the neighbours, and which way. */
  channels: Channel[];
  directions: ("up" | "down")[];
  /** How far past the threshold, as a multiple of it (≥ 1). */
  strength: number;
};

const NAMES: Channel[] = ["r", "g", "b"];

export type DefectOptions = {
  /** Noise sigma per channel, in code values on a 0..1 scale. */
  sigma: readonly [number, number, number];
  k?: number;
  minStep?: number;
  /** Stop after this many (a frame of noise with a bad threshold must not build a huge list). */
  limit?: number;
};

export function defectThresholds(opts: DefectOptions): [number, number, number] {
  const k = opts.k ?? 7, min = opts.minStep ?? 0.02;
  return opts.sigma.map((s) => Math.max(k * s, min)) as [number, number, number];
}

/** The second threshold: how far every structural prediction must miss. */
function predictionThresholds(opts: DefectOptions): [number, number, number] {
  return opts.sigma.map((s) => Math.max(8 * s, 0.03)) as [number, number, number];
}

/** The eight directions; a pixel's neighbours at distance 1 and 2 along each. */
const DIRS: [number, number][] = [[1, 0], [1, 1], [0, 1], [-1, 1], [-1, 0], [-1, -1], [0, -1], [1, -1]];

const RING2: [number, number][] = [];
for (let dy = -2; dy <= 2; dy++) for (let dx = -2; dx <= 2; dx++) if (Math.max(Math.abs(dx), Math.abs(dy)) === 2) RING2.push([dx, dy]);
const RING1: [number, number][] = [[-1, -1], [0, -1], [1, -1], [-1, 0], [1, 0], [-1, 1], [0, 1], [1, 1]];

/** Finds defects in interleaved RGB code values (0..1 scale); pixels within 2 of the border are not examined. */
export function findDefects(code: Float32Array, width: number, height: number, opts: DefectOptions): { defects: Defect[]; truncated: boolean } {
  const one = { step: defectThresholds(opts), miss: predictionThresholds(opts) };
  const all = jointThresholds(opts);
  const limit = opts.limit ?? 5000;
  const defects: Defect[] = [];
  const W3 = width * 3;
  const nb = new Float64Array(8);
  const q0 = 0.6 * one.step[0], q1 = 0.6 * one.step[1], q2 = 0.6 * one.step[2];
  const j0 = 0.6 * all.step[0]!, j1 = 0.6 * all.step[1]!, j2 = 0.6 * all.step[2]!;
  for (let y = 2; y < height - 2; y++) {
    for (let x = 2; x < width - 2; x++) {
      const i = y * W3 + x * 3;
      // Quick screen: the pixel against the mean of its four direct neighbours — one channel far
      // out, or all three out the same way.
      const d0 = code[i]! - (code[i - 3]! + code[i + 3]! + code[i - W3]! + code[i + W3]!) * 0.25;
      const d1 = code[i + 1]! - (code[i - 2]! + code[i + 4]! + code[i + 1 - W3]! + code[i + 1 + W3]!) * 0.25;
      const d2 = code[i + 2]! - (code[i - 1]! + code[i + 5]! + code[i + 2 - W3]! + code[i + 2 + W3]!) * 0.25;
      const single = (d0 < 0 ? -d0 : d0) > q0 || (d1 < 0 ? -d1 : d1) > q1 || (d2 < 0 ? -d2 : d2) > q2;
      const joint = (d0 > j0 && d1 > j1 && d2 > j2) || (d0 < -j0 && d1 < -j1 && d2 < -j2);
      if (!single && !joint) continue;
      const d = (joint ? examineJoint(code, i, x, y, W3, all, nb) : null) ?? examine(code, i, x, y, W3, one, nb);
      if (!d) continue;
      defects.push(d);
      if (defects.length >= limit) return { defects, truncated: true };
    }
  }
  return { defects, truncated: false };
}

type Thresholds = { step: readonly number[]; miss: readonly number[] };

/**
 * A pixel stepping the same way in all three channels is judged on the three together, with
 * lower thresholds (own rule: a step of 4σ and a miss of 3σ per channel, at least 1.2 % and 1 %
 * of full scale): for independent channels noise alone steps 4σ the same way in all three about
 * once in 10¹³ pixels, so a hot or dead photosite shows against a bright or grainy background that
 * a one-channel test would need 7σ for. (A miss is the smallest of twelve noisy predictions, each
 * with ~2.4σ of noise of its own, so it must be asked for less than the step.)
 */
function jointThresholds(opts: DefectOptions): Thresholds {
  return { step: opts.sigma.map((s) => Math.max(4 * s, 0.012)), miss: opts.sigma.map((s) => Math.max(3 * s, 0.01)) };
}

type ChannelVerdict = { dir: "up" | "down"; step: number } | null;

/** One channel of one pixel against its neighbours (see the module comment), with the given thresholds. */
function judgeChannel(code: Float32Array, i: number, c: number, W3: number, t: number, tMiss: number, nb: Float64Array, only?: "up" | "down"): ChannelVerdict {
  const v = code[i + c]!;
  for (let k = 0; k < 8; k++) nb[k] = code[i + c + RING1[k]![1] * W3 + RING1[k]![0] * 3]!;
  let max1 = -Infinity, max2 = -Infinity, min1 = Infinity, min2 = Infinity;
  for (let k = 0; k < 8; k++) {
    const u = nb[k]!;
    if (u > max1) { max2 = max1; max1 = u; } else if (u > max2) max2 = u;
    if (u < min1) { min2 = min1; min1 = u; } else if (u < min2) min2 = u;
  }
  let dir: "up" | "down" | null = null, step = 0;
  if (v - max2 > t && only !== "down") { dir = "up"; step = v - max2; }
  else if (min2 - v > t && only !== "up") { dir = "down"; step = min2 - v; }
  if (!dir) return null;
  // Does any structure around predict it? Opposite pairs (lines, edges), one-sided
  // extrapolations (tips). The smallest miss, in the flagged direction, must exceed tMiss.
  let miss = Infinity;
  for (let k = 0; k < 8; k++) {
    const [dx, dy] = DIRS[k]!;
    const n1 = code[i + c + dy * W3 + dx * 3]!, n2 = code[i + c + 2 * dy * W3 + 2 * dx * 3]!;
    const extrapolated = 2 * n1 - n2;
    const m1 = dir === "up" ? v - extrapolated : extrapolated - v;
    if (m1 < miss) miss = m1;
    if (k < 4) {
      const o = code[i + c - dy * W3 - dx * 3]!;
      const m2 = dir === "up" ? v - (n1 + o) / 2 : (n1 + o) / 2 - v;
      if (m2 < miss) miss = m2;
    }
  }
  if (miss <= tMiss) return null;
  // A line through it (a hair's zig-zag across the pixel grid) shows up two pixels out with
  // nearly its value, joined to it by a pixel partway there; an isolated pixel stands alone,
  // even when something dark or bright happens to sit two pixels away.
  const sorted = Array.from(nb).sort((a, b) => a - b);
  const dev = Math.abs(v - (sorted[3]! + sorted[4]!) / 2);
  for (const [dx, dy] of RING2) {
    const u = code[i + c + dy * W3 + dx * 3]!;
    if (Math.abs(v - u) >= 0.5 * dev) continue;
    for (let k = 0; k < 8; k++) {
      const [mx, my] = RING1[k]!;
      if (Math.abs(mx - dx) > 1 || Math.abs(my - dy) > 1) continue;
      if (Math.abs(v - nb[k]!) < 0.75 * dev) return null;
    }
  }
  return { dir, step };
}

/** All three channels out the same way, on the joint thresholds; null when they are not. */
function examineJoint(code: Float32Array, i: number, x: number, y: number, W3: number, t: Thresholds, nb: Float64Array): Defect | null {
  const first = judgeChannel(code, i, 0, W3, t.step[0]!, t.miss[0]!, nb);
  if (!first) return null;
  let strength = first.step / t.step[0]!;
  for (let c = 1; c < 3; c++) {
    const v = judgeChannel(code, i, c, W3, t.step[c]!, t.miss[c]!, nb, first.dir);
    if (!v) return null;
    strength = Math.min(strength, v.step / t.step[c]!);
  }
  return { x, y, kind: first.dir === "up" ? "hot" : "dead", channels: ["r", "g", "b"], directions: [first.dir, first.dir, first.dir], strength };
}

/** The full one-channel-at-a-time test of a pixel the quick screen let through; null when it is not a defect. */
function examine(code: Float32Array, i: number, x: number, y: number, W3: number, t: Thresholds, nb: Float64Array): Defect | null {
  const channels: Channel[] = [];
  const directions: ("up" | "down")[] = [];
  let strength = Infinity;
  for (let c = 0; c < 3; c++) {
    const v = judgeChannel(code, i, c, W3, t.step[c]!, t.miss[c]!, nb);
    if (!v) continue;
    channels.push(NAMES[c]!);
    directions.push(v.dir);
    strength = Math.min(strength, v.step / t.step[c]!);
  }
  if (!channels.length) return null;
  const allUp = channels.length === 3 && directions.every((d) => d === "up");
  const allDown = channels.length === 3 && directions.every((d) => d === "down");
  return { x, y, kind: allUp ? "hot" : allDown ? "dead" : "stuck", channels, directions, strength };
}

/** Replaces each defect pixel, in place, by the per-channel median of its eight neighbours. */
export function repairDefects(data: Float32Array, width: number, defects: readonly Defect[]): void {
  const W3 = width * 3;
  const nb = new Float64Array(8);
  for (const d of defects) {
    const i = d.y * W3 + d.x * 3;
    for (let c = 0; c < 3; c++) {
      for (let k = 0; k < 8; k++) nb[k] = data[i + c + RING1[k]![1] * W3 + RING1[k]![0] * 3]!;
      nb.sort();
      data[i + c] = (nb[3]! + nb[4]!) / 2;
    }
  }
}
