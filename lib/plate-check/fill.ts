import { CHANNEL_INDEX, type Channel, type RecipeStep, type Rect } from "@/lib/lab/recipe";
import { solveRow } from "@/lib/lab/solver";
import type { Findings, Rgb } from "@/lib/plate-check/schemas";

/*
 * A technique's recipe filled with what the plate check measured on this frame. Pure.
 *
 * - The recipe's working channel (the row its marker-hiding matrix changes, else the channel it
 *   copies from) becomes the frame's screen channel (its strongest linear channel): a recipe
 *   written on a green screen tried on a blue one has its channels swapped throughout.
 * - A marker-hiding matrix (identity but one row) is solved again (lib/lab/solver, goal "hide")
 *   from the detected marker shades and the screen around them; a solved matte row likewise
 *   (goal "matte"). Hand-made matrices with more than one changed row are kept as written.
 * - A level fit's rectangle becomes the largest stretch of clean screen the check found.
 * - Screen flattening's target colour becomes the screen's measured mean colour.
 * - A grain step is left out: a dropped frame has no denoised twin to take the grain from.
 * Everything else (sizes in pixels, black and white points) runs as the technique wrote it.
 */

export type FillResult = {
  recipe: RecipeStep[];
  filled: string[];
  skipped: string[];
  /** Why the recipe cannot be tried on this frame (then `recipe` is empty). */
  problem: string | null;
  targetChannel: Channel;
  hide: { row: Rgb; residualPerShade: number[]; noiseGain: number } | null;
};

const NAMES: Channel[] = ["r", "g", "b"];
const round6 = (v: number): number => Math.round(v * 1e6) / 1e6;

/** Index of the only row that differs from identity, or -1 (none) / -2 (several). */
function changedRow(m: readonly (readonly number[])[]): number {
  let found = -1;
  for (let i = 0; i < 3; i++) {
    const differs = [0, 1, 2].some((j) => Math.abs(m[i]![j]! - (i === j ? 1 : 0)) > 1e-9);
    if (!differs) continue;
    if (found >= 0) return -2;
    found = i;
  }
  return found;
}

/** The channel the recipe works in, as written. */
export function recipeChannel(recipe: readonly RecipeStep[]): Channel | null {
  for (const s of recipe) {
    if (s.op === "matrix") {
      const row = changedRow(s.m);
      if (row >= 0) return NAMES[row]!;
    }
    if (s.op === "copy") return s.from;
  }
  return null;
}

/** Strongest channel of the screen's linear mean: the one markers are hidden in. */
export function screenChannel(findings: Findings): Channel | null {
  const m = findings.screen.meanLinear;
  if (!findings.screen.present || !m) return null;
  return NAMES[m.indexOf(Math.max(...m))]!;
}

function swapper(a: Channel, b: Channel): (c: Channel) => Channel {
  return (c) => (c === a ? b : c === b ? a : c);
}

function swapVec<T>(v: readonly T[], a: number, b: number): T[] {
  const out = [...v];
  [out[a], out[b]] = [out[b]!, out[a]!];
  return out;
}

/**
 * Largest axis-aligned rectangle of clean screen, from the findings' screen map (cells at least
 * 95 % screen) with the cells under markers and dust taken out; full-resolution pixels. The
 * maximal-rectangle search is the stack method over per-row histograms of clear cells.
 */
export function cleanScreenRect(findings: Findings): Rect | null {
  const mask = findings.screen.mask;
  if (!mask) return null;
  const { width: gw, height: gh, cell } = mask;
  const bytes = Uint8Array.from(atob(mask.data), (ch) => ch.charCodeAt(0));
  const clear = new Uint8Array(gw * gh);
  for (let i = 0; i < clear.length; i++) clear[i] = bytes[i]! >= 242 ? 1 : 0;
  const block = (b: { x: number; y: number; w: number; h: number }, pad: number): void => {
    for (let y = Math.max(0, Math.floor((b.y - pad) / cell)); y <= Math.min(gh - 1, Math.floor((b.y + b.h + pad) / cell)); y++) {
      for (let x = Math.max(0, Math.floor((b.x - pad) / cell)); x <= Math.min(gw - 1, Math.floor((b.x + b.w + pad) / cell)); x++) clear[y * gw + x] = 0;
    }
  };
  for (const m of findings.markers.items) block(m.box, 4);
  for (const d of findings.dust.items) block(d.box, 4);
  const heights = new Int32Array(gw);
  let best = { area: 0, x: 0, y: 0, w: 0, h: 0 };
  for (let y = 0; y < gh; y++) {
    for (let x = 0; x < gw; x++) heights[x] = clear[y * gw + x] ? heights[x]! + 1 : 0;
    const stack: number[] = [];
    for (let x = 0; x <= gw; x++) {
      const h = x < gw ? heights[x]! : 0;
      while (stack.length && heights[stack[stack.length - 1]!]! >= h) {
        const top = stack.pop()!;
        const height = heights[top]!;
        const left = stack.length ? stack[stack.length - 1]! + 1 : 0;
        const area = height * (x - left);
        if (area > best.area) best = { area, x: left, y: y - height + 1, w: x - left, h: height };
      }
      stack.push(x);
    }
  }
  if (!best.area) return null;
  const x = best.x * cell, y = best.y * cell;
  return {
    x,
    y,
    w: Math.max(1, Math.min(findings.width - x, best.w * cell)),
    h: Math.max(1, Math.min(findings.height - y, best.h * cell)),
  };
}

export function fillRecipe(recipe: readonly RecipeStep[], findings: Findings): FillResult {
  const filled: string[] = [];
  const skipped: string[] = [];
  const target = screenChannel(findings);
  const fail = (problem: string): FillResult => ({ recipe: [], filled, skipped, problem, targetChannel: target ?? "g", hide: null });
  if (!recipe.length) return fail("This technique has no recipe to run.");
  const needsScreen = recipe.some((s) => s.op === "matrix" || s.op === "matte" || s.op === "flatten" || s.op === "level");
  if (needsScreen && !target) return fail("Its recipe samples the backing screen, and this frame has none.");
  const written = recipeChannel(recipe);
  const swap = written && target && written !== target ? swapper(written, target) : (c: Channel) => c;
  if (written && target && written !== target) filled.push(`Channels ${written.toUpperCase()} and ${target.toUpperCase()} swapped: the recipe was written for a ${written.toUpperCase()} screen, this one is strongest in ${target.toUpperCase()}.`);
  const ia = written ? CHANNEL_INDEX[written] : 0, ib = target ? CHANNEL_INDEX[target] : 0;

  const shades = findings.markers.shades;
  const markerSamples = shades.map((s) => s.colourLinear);
  const screenSample: Rgb | null = findings.screen.meanLinear;
  let hide: FillResult["hide"] = null;
  let rect: Rect | null | undefined;
  const out: RecipeStep[] = [];

  for (const [index, step] of recipe.entries()) {
    switch (step.op) {
      case "matrix": {
        const row = changedRow(step.m);
        if (row < 0) {
          // Identity or hand-made: swap channels only.
          const m = swapVec(step.m.map((r) => swapVec(r, ia, ib)), ia, ib) as typeof step.m;
          out.push({ ...step, m, ...(step.offset ? { offset: swapVec(step.offset, ia, ib) as Rgb } : {}) });
          break;
        }
        if (!markerSamples.length || !screenSample) return fail("Its recipe hides tracking markers, and the check found none on this frame.");
        const solved = solveRow({ markers: markerSamples, screen: [screenSample], goal: { kind: "hide", channel: target! } });
        hide = { row: solved.row.map(round6) as Rgb, residualPerShade: solved.perShade, noiseGain: solved.noiseGain };
        out.push({ op: "matrix", m: solved.matrix.map((r) => r.map(round6)) as typeof step.m });
        filled.push(`Step ${index + 1} (matrix): row ${target!.toUpperCase()} solved to hide ${shades.length} marker shade${shades.length === 1 ? "" : "s"} against the screen's mean colour.`);
        break;
      }
      case "copy":
        out.push({ ...step, from: swap(step.from), to: swap(step.to) });
        break;
      case "level": {
        const next = { ...step, channel: swap(step.channel), ref: swap(step.ref) };
        if (step.rect) {
          rect ??= cleanScreenRect(findings);
          if (!rect) return fail("Its recipe fits levels over clean screen, and the check found no clear stretch of it.");
          next.rect = rect;
          filled.push(`Step ${index + 1} (level): fitted over clean screen at ${rect.x},${rect.y} (${rect.w}×${rect.h} px).`);
        }
        out.push(next);
        break;
      }
      case "matte": {
        if (Array.isArray(step.channel)) {
          if (!markerSamples.length || !screenSample) return fail("Its recipe pulls a marker matte, and the check found no markers on this frame.");
          const solved = solveRow({ markers: markerSamples, screen: [screenSample], goal: { kind: "matte", channel: target! } });
          out.push({ ...step, channel: solved.row.map(round6) as Rgb });
          filled.push(`Step ${index + 1} (matte): row solved to map the markers to 1 and the screen to 0.`);
        } else {
          out.push({ ...step, channel: swap(step.channel) });
        }
        break;
      }
      case "soften":
        out.push(step.target === "matte" ? step : { ...step, target: swap(step.target) });
        break;
      case "flatten": {
        if (!screenSample) return fail("Its recipe flattens the backing screen, and this frame has none.");
        out.push({ ...step, color: screenSample.map(round6) as Rgb });
        filled.push(`Step ${index + 1} (flatten): target colour set to the screen's mean (${screenSample.map((v) => v.toFixed(3)).join(", ")}, linear).`);
        break;
      }
      case "grain":
        skipped.push(`Step ${index + 1} (grain) left out: a dropped frame has no denoised twin to take its grain from, so the steps run on the plate as shot.`);
        break;
      default:
        out.push(step);
    }
  }
  if (!out.length) return fail(`Nothing of its recipe runs on a dropped frame. ${skipped.join(" ")}`);
  return { recipe: out, filled, skipped, problem: null, targetChannel: target ?? "g", hide };
}
