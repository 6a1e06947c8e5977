import { angleBetween, type Box } from "@/lib/plate-check/image";
import { modelAt, type SurfaceGrid } from "@/lib/plate-check/surface";

/*
 * Spots: connected groups of pixels that depart from the surface model, found with hysteresis
 * (a spot needs at least one pixel above `hi` and grows through 8-connected pixels above `lo`),
 * then measured and sorted into tracking markers, dust specks, hairs and everything else. Pure.
 *
 * The sorting rules are our own, from how these things look on a plate (common practice, no
 * published source):
 * - a marker sits on the screen (most of the ring around it is screen), is not a thin stroke, is
 *   smaller than a few per cent of the frame, and differs from the screen in colour, not just in
 *   brightness — or, when it is only a darker or lighter patch of the screen's own colour (tape or
 *   a dot of the screen's hue), belongs to a set of alike ones (markSameHueSets);
 * - dust is a speck that darkens or lightens the surface by the same factor in every channel (it
 *   blocks light; it has no colour of its own) and belongs to no such set, or is coloured but too
 *   small to be a marker;
 * - a hair is long, thin and colourless: at least ~1 % of the frame long, its stroke a few pixels wide;
 * - anything larger, or not on a flat surface, is structure (foreground, edges) and is not reported.
 */

export type SpotKind = "marker" | "dust" | "hair" | "other";

export type Spot = {
  /** Its number in the label map `findSpots` returns. */
  label: number;
  kind: SpotKind;
  box: Box;
  area: number;
  /** Centroid weighted by departure from the surface. */
  x: number;
  y: number;
  /** Square root of the largest z² in the spot: contrast in units of the 3×3 mean's noise. */
  peakZ: number;
  /** Share of the ring around the spot that is clean surface (screen, when there is one). */
  ringSurface: number;
  /** Stroke width estimate 2·area / boundary pixels, px (a dot of radius r gives ≈ r, a line of width w ≈ w). */
  strokeWidth: number;
  /** Mean linear colour of the spot's core (pixels at ≥ half its peak departure) and of the surface model there. */
  core: [number, number, number];
  surface: [number, number, number];
  /** Σ over the spot of (linear pixel − linear surface): the direction a matrix sees. */
  direction: [number, number, number];
  /** Spread of log(core / surface) across channels over (15 % of its largest size + 0.05), the smaller of linear light and code values: > 1 means coloured; ≈ 0 for a colourless speck. */
  chroma: number;
  /** A colourless spot a marker could be drawn as: its brightness against the surface (log of the ratio of channel sums) and √area. */
  sameHue: { level: number; size: number } | null;
  confidence: number;
};

export type SpotRules = {
  width: number;
  height: number;
  hi: number;
  lo: number;
  /** The surface is a backing screen (markers are only looked for on one). */
  isScreen: boolean;
  /** Pixels that belong to the clean surface (for the ring test). */
  surfaceMask: Uint8Array;
  toLinear: (v: number) => number;
  toCode: (l: number) => number;
  /** Grain sigma per channel in code values (0..1 scale): how far a spot's colour can stray by noise alone. */
  sigma?: readonly [number, number, number];
};

type Raw = { label: number; area: number; x0: number; y0: number; x1: number; y1: number; sx: number; sy: number; sw: number; peak: number; big: boolean };

/** Frame-relative size limits (own rules, scaled with the frame's longer side). */
export function spotLimits(width: number, height: number) {
  const D = Math.max(width, height);
  return {
    maxSide: Math.max(24, 0.06 * D),
    maxArea: Math.max(400, 0.004 * width * height),
    /** A coloured spot smaller than this is a speck, not a marker. */
    minChromaticMarkerArea: Math.max(6, 1e-5 * width * height),
    minHairLength: Math.max(10, 0.01 * D),
    /** A colourless spot must span at least this to be taken for tape of the screen's hue (≈ 10 px at 2K). */
    minTapeSide: Math.max(9, 0.005 * D),
  };
}

export function findSpots(z2: Float32Array, linear: Float32Array, grid: SurfaceGrid, rules: SpotRules): { spots: Spot[]; labels: Int32Array } {
  const { width: W, height: H, hi, lo } = rules;
  const n = W * H;
  const labels = new Int32Array(n);
  let stack = new Int32Array(1 << 16);
  const limits = spotLimits(W, H);
  const raws: Raw[] = [];
  let next = 0;
  for (let p0 = 0; p0 < n; p0++) {
    if (labels[p0] || z2[p0]! <= hi) continue;
    const label = ++next;
    const r: Raw = { label, area: 0, x0: W, y0: H, x1: -1, y1: -1, sx: 0, sy: 0, sw: 0, peak: 0, big: false };
    let top = 0;
    stack[top++] = p0;
    labels[p0] = label;
    while (top > 0) {
      const p = stack[--top]!;
      const x = p % W, y = (p / W) | 0, z = z2[p]!;
      r.area++;
      if (x < r.x0) r.x0 = x;
      if (x > r.x1) r.x1 = x;
      if (y < r.y0) r.y0 = y;
      if (y > r.y1) r.y1 = y;
      const w = Math.sqrt(z);
      r.sx += x * w; r.sy += y * w; r.sw += w;
      if (z > r.peak) r.peak = z;
      for (let dy = -1; dy <= 1; dy++) {
        const yy = y + dy;
        if (yy < 0 || yy >= H) continue;
        for (let dx = -1; dx <= 1; dx++) {
          const xx = x + dx;
          if (xx < 0 || xx >= W) continue;
          const q = yy * W + xx;
          if (labels[q] || z2[q]! <= lo) continue;
          labels[q] = label;
          if (top === stack.length) {
            const grown = new Int32Array(stack.length * 2);
            grown.set(stack);
            stack = grown;
          }
          stack[top++] = q;
        }
      }
    }
    r.big = r.area > limits.maxArea || r.x1 - r.x0 + 1 > limits.maxSide || r.y1 - r.y0 + 1 > limits.maxSide;
    raws.push(r);
  }
  const spots = raws.filter((r) => !r.big && r.area >= 2).map((r) => measure(r, z2, linear, labels, grid, rules, limits));
  markSameHueSets(spots);
  return { spots: absorbFragments(spots), labels };
}

/** Least number of alike spots that make a set of markers (own rule: a planar track needs four points; common practice, no published source). */
export const SAME_HUE_SET = 4;
/** Alike: brightness against the screen within ±15 % (0.14 in log) and √area within a factor 1.35 (own rule). */
const SAME_LEVEL = 0.14;
const SAME_SIZE = 1.35;

/**
 * Colourless spots on a screen: dust, or markers of the screen's own hue. In linear light both
 * are the screen's colour scaled (dust blocks light; same-hue tape reflects less or more of it),
 * so colour cannot part them; what does is that markers come as a set of one make — the same
 * tape at the same size, so the same brightness against the screen and the same area, put up
 * in fours or more — while dust specks differ in opacity and size and come alone. A candidate
 * with at least SAME_HUE_SET − 1 alike others is a marker, whatever its shape (a dot or a cross).
 */
function markSameHueSets(spots: Spot[]): void {
  const cands = spots.filter((s) => (s.kind === "dust" || s.kind === "hair") && s.sameHue);
  for (const s of cands) {
    const a = s.sameHue!;
    const alike = cands.filter((o) => o !== s && Math.abs(o.sameHue!.level - a.level) <= SAME_LEVEL && Math.max(o.sameHue!.size / a.size, a.size / o.sameHue!.size) <= SAME_SIZE).length;
    if (alike + 1 >= SAME_HUE_SET) s.kind = "marker";
  }
}

/**
 * A motion-blurred marker can fall apart where its thin parts smear below the threshold; the
 * pieces lie within a few pixels of its main body. A smaller marker spot whose box comes within a
 * quarter of the larger one's size (at least 3 px) joins it: one marker, the union of the boxes.
 */
function absorbFragments(spots: Spot[]): Spot[] {
  const markers = spots.filter((s) => s.kind === "marker").sort((a, b) => b.area - a.area);
  const gone = new Set<Spot>();
  for (const big of markers) {
    if (gone.has(big)) continue;
    const gap = Math.max(3, 0.25 * Math.max(big.box.w, big.box.h));
    for (const small of markers) {
      if (small === big || gone.has(small) || small.area > big.area) continue;
      const dx = Math.max(0, big.box.x - (small.box.x + small.box.w), small.box.x - (big.box.x + big.box.w));
      const dy = Math.max(0, big.box.y - (small.box.y + small.box.h), small.box.y - (big.box.y + big.box.h));
      if (dx > gap || dy > gap) continue;
      const x0 = Math.min(big.box.x, small.box.x), y0 = Math.min(big.box.y, small.box.y);
      big.box = { x: x0, y: y0, w: Math.max(big.box.x + big.box.w, small.box.x + small.box.w) - x0, h: Math.max(big.box.y + big.box.h, small.box.y + small.box.h) - y0 };
      big.area += small.area;
      gone.add(small);
    }
  }
  return spots.filter((s) => !gone.has(s));
}

/**
 * Spread of log(core / surface) across channels over (15 % of its largest size + 0.05 + what the
 * grain alone spreads it by). `se` is the standard error of each channel's core mean: a core
 * within two of them of zero is read at that floor (its log says nothing finer), and the grain's
 * spread is three standard errors of the difference of the two extreme channels' logs.
 */
function chromaOf(core: readonly number[], surf: readonly number[], se: readonly number[] = [0, 0, 0]): number {
  const l = [0, 1, 2].map((c) => Math.log(Math.max(core[c]!, 1e-4, 2 * se[c]!) / Math.max(surf[c]!, 1e-4)));
  const spread = Math.max(...l) - Math.min(...l), mag = Math.max(...l.map(Math.abs));
  const hi = l.indexOf(Math.max(...l)), lo = l.indexOf(Math.min(...l));
  const logSe = (c: number): number => se[c]! / Math.max(core[c]!, se[c]!, 1e-4);
  return spread / (0.15 * mag + 0.05 + 3 * Math.hypot(logSe(hi), logSe(lo)));
}

function measure(r: Raw, z2: Float32Array, linear: Float32Array, labels: Int32Array, grid: SurfaceGrid, rules: SpotRules, limits: ReturnType<typeof spotLimits>): Spot {
  const { width: W, height: H } = rules;
  const core: [number, number, number] = [0, 0, 0], surf: [number, number, number] = [0, 0, 0], surfCode: [number, number, number] = [0, 0, 0], dir: [number, number, number] = [0, 0, 0];
  const s: [number, number, number] = [0, 0, 0];
  let coreN = 0, eroded = 0;
  const corePeak = r.peak * 0.5;
  for (let y = r.y0; y <= r.y1; y++) {
    for (let x = r.x0; x <= r.x1; x++) {
      const p = y * W + x;
      if (labels[p] !== r.label) continue;
      modelAt(grid, x, y, s);
      const i = p * 3;
      const s0 = rules.toLinear(s[0]), s1 = rules.toLinear(s[1]), s2 = rules.toLinear(s[2]);
      dir[0] += linear[i]! - s0; dir[1] += linear[i + 1]! - s1; dir[2] += linear[i + 2]! - s2;
      if (z2[p]! >= corePeak) {
        core[0] += linear[i]!; core[1] += linear[i + 1]!; core[2] += linear[i + 2]!;
        surf[0] += s0; surf[1] += s1; surf[2] += s2;
        surfCode[0] += s[0]; surfCode[1] += s[1]; surfCode[2] += s[2];
        coreN++;
      }
      if (x > 0 && x < W - 1 && y > 0 && y < H - 1 && labels[p - 1] === r.label && labels[p + 1] === r.label && labels[p - W] === r.label && labels[p + W] === r.label) eroded++;
    }
  }
  for (let c = 0; c < 3; c++) { core[c]! /= coreN; surf[c]! /= coreN; surfCode[c]! /= coreN; }
  // Ring: the box grown by a margin, outside the spot itself.
  const g = 3 + Math.ceil(0.15 * Math.max(r.x1 - r.x0 + 1, r.y1 - r.y0 + 1));
  let ringTotal = 0, ringSurface = 0;
  for (let y = Math.max(0, r.y0 - g); y <= Math.min(H - 1, r.y1 + g); y++) {
    for (let x = Math.max(0, r.x0 - g); x <= Math.min(W - 1, r.x1 + g); x++) {
      if (x >= r.x0 && x <= r.x1 && y >= r.y0 && y <= r.y1) continue;
      const p = y * W + x;
      if (labels[p] === r.label) continue;
      ringTotal++;
      if (!labels[p] && rules.surfaceMask[p]) ringSurface++;
    }
  }
  const ring = ringTotal ? ringSurface / ringTotal : 0;
  // Colourless in light (dust on the sensor or film blocks every channel alike) or in the stored
  // code values (a speck that scales the encoded values alike): either way it has no colour of its own.
  const coreCode = core.map(rules.toCode);
  // Standard error of the core's mean per channel from the grain: σ in code values, carried to
  // linear light by the slope of the transfer at the surface's level, over √(core pixels).
  const se = [0, 0, 0], seCode = [0, 0, 0];
  if (rules.sigma) {
    for (let c = 0; c < 3; c++) {
      const sg = rules.sigma[c]!, sc = surfCode[c]!;
      const slope = Math.abs(rules.toLinear(sc + sg) - rules.toLinear(sc - sg)) / (2 * sg);
      se[c] = (sg * slope) / Math.sqrt(coreN);
      seCode[c] = sg / Math.sqrt(coreN);
    }
  }
  const chroma = Math.min(chromaOf(core, surf, se), chromaOf(coreCode, surfCode, seCode));
  const boundary = r.area - eroded;
  const strokeWidth = boundary ? (2 * r.area) / boundary : r.area;
  const side = Math.max(r.x1 - r.x0 + 1, r.y1 - r.y0 + 1);
  const box: Box = { x: r.x0, y: r.y0, w: r.x1 - r.x0 + 1, h: r.y1 - r.y0 + 1 };
  const peakZ = Math.sqrt(r.peak);
  let kind: SpotKind = "other";
  const isColoured = chroma > 1;
  const elongation = Math.max(r.area / (strokeWidth * strokeWidth), side / strokeWidth);
  // The 3×3 mean widens every spot by about two pixels; a hair's stroke stays narrow and long.
  const isHair = !isColoured && strokeWidth <= 6 && elongation >= 4.5 && side >= limits.minHairLength;
  // A colourless spot big enough to be drawn as a marker may be one of the screen's own hue: the
  // set it belongs to decides (markSameHueSets).
  // (A cross of thin tape passes for a short hair on its own; the set decides for it too.)
  const sameHueCandidate = !isColoured && rules.isScreen && side >= limits.minTapeSide && elongation < 12;
  if (ring >= 0.6) {
    if (isHair) kind = "hair";
    else if (!isColoured) kind = "dust";
    else if (r.area < limits.minChromaticMarkerArea) kind = "dust";
    else if (rules.isScreen && elongation < 12) kind = "marker";
  }
  // Own confidence rule: contrast well past the detection threshold and a clean ring around it.
  const margin = Math.min(1, Math.max(0, (peakZ - Math.sqrt(rules.hi)) / Math.sqrt(rules.hi)));
  const confidence = Math.round(100 * (0.5 + 0.5 * margin) * Math.min(1, ring / 0.8)) / 100;
  return {
    label: r.label,
    kind,
    box,
    area: r.area,
    x: r.sx / r.sw,
    y: r.sy / r.sw,
    peakZ,
    ringSurface: ring,
    strokeWidth,
    core,
    surface: surf,
    direction: dir,
    chroma,
    sameHue: ring >= 0.6 && sameHueCandidate ? { level: Math.log(Math.max(core[0] + core[1] + core[2], 1e-6) / Math.max(surf[0] + surf[1] + surf[2], 1e-6)), size: Math.sqrt(r.area) } : null,
    confidence,
  };
}

export type ShadeGroup = {
  /** Indices into the marker list. */
  members: number[];
  /** Unit direction of (marker − screen) in linear RGB. */
  direction: [number, number, number];
};

/**
 * Marker shades: markers whose (marker − screen) directions lie within `maxAngle` degrees of a
 * group's mean direction belong to it. The direction is what a colour matrix sees — it does not
 * change with lighting or with how much of the pixel the marker covers (a blurred or soft edge
 * mixes marker and screen along that same line) — so groups are exactly the distinct constraints
 * the solver has to meet. Greedy assignment strongest first, then one re-assignment pass.
 */
export function groupShades(directions: readonly (readonly number[])[], weights: readonly number[], maxAngle = 12): ShadeGroup[] {
  const unit = (v: readonly number[]): [number, number, number] => {
    const n = Math.hypot(v[0]!, v[1]!, v[2]!) || 1;
    return [v[0]! / n, v[1]! / n, v[2]! / n];
  };
  const order = directions.map((_, i) => i).sort((a, b) => weights[b]! - weights[a]!);
  let centres: [number, number, number][] = [];
  const sums: [number, number, number][] = [];
  for (const i of order) {
    const u = unit(directions[i]!);
    const j = centres.findIndex((c) => angleBetween(c, u) <= maxAngle);
    if (j < 0) {
      centres.push(u);
      sums.push([u[0] * weights[i]!, u[1] * weights[i]!, u[2] * weights[i]!]);
    } else {
      const s = sums[j]!;
      s[0] += u[0] * weights[i]!; s[1] += u[1] * weights[i]!; s[2] += u[2] * weights[i]!;
      centres[j] = unit(s);
    }
  }
  // Merge centres that ended up close, then assign every marker to its nearest centre.
  const merged: [number, number, number][] = [];
  for (const c of centres) if (!merged.some((m) => angleBetween(m, c) <= maxAngle / 2)) merged.push(c);
  centres = merged;
  const members: number[][] = centres.map(() => []);
  directions.forEach((d, i) => {
    const u = unit(d);
    let best = 0, bestAngle = Infinity;
    centres.forEach((c, j) => {
      const a = angleBetween(c, u);
      if (a < bestAngle) { bestAngle = a; best = j; }
    });
    members[best]!.push(i);
  });
  return centres
    .map((_, j) => {
      const acc: [number, number, number] = [0, 0, 0];
      for (const i of members[j]!) {
        const u = unit(directions[i]!);
        acc[0] += u[0] * weights[i]!; acc[1] += u[1] * weights[i]!; acc[2] += u[2] * weights[i]!;
      }
      return { members: members[j]!, direction: unit(acc) };
    })
    .filter((g) => g.members.length > 0);
}
