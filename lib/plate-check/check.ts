import { countClipping } from "@/lib/plate-check/clipping";
import { findDefects, repairDefects } from "@/lib/plate-check/defects";
import { quantisationFloor } from "@/lib/plate-check/frame";
import { CHANNELS, codeToLinear, linearToCode, round, type PlateFrame } from "@/lib/plate-check/image";
import { IMMERKAER_SCALE, laplacianAbsSumsRgb, robustSigma } from "@/lib/plate-check/noise";
import type { CompressionFinding, DustFinding, Findings, MarkerFinding, MarkerShade, NoiseFinding, OverlayGrid, Rgb, ScreenFinding } from "@/lib/plate-check/schemas";
import { guessScreen, MIN_SCREEN_COVERAGE, screenKind, screenLikeMask, screenStats, type ScreenStats } from "@/lib/plate-check/screen";
import { findSpots, groupShades, type Spot } from "@/lib/plate-check/spots";
import { blockMeans, blockSize, boxMean3, deviationMap, dilateMask, dropDepartingBlocks, residualSigma, strongNearSampled, type SurfaceGrid } from "@/lib/plate-check/surface";
import { giveBack, takeBuffer } from "@/lib/plate-check/scratch";
import { problemTagsFor } from "@/lib/plate-check/tags";

/*
 * The plate check: every detector in turn on one frame, into one Findings record. Pure (no I/O);
 * `pause` lets the caller hand the event loop back between stages.
 *
 * Order matters: a rough noise figure sets the defect threshold; defects are repaired before
 * anything averages pixels; the screen model is fitted without the spots on it; the reported
 * noise is measured only where nothing else was found.
 */

/** Bump when any detector's output for the same frame changes: stored findings are then re-run. */
export const DETECTOR_VERSION = 3;

/** Spot thresholds on z² (three channels): a core beyond 40 (p ≈ 2·10⁻⁸ for pure noise), grown through 16. */
const SPOT_HI = 40;
const SPOT_LO = 16;
const STRONG = 200;
/**
 * The noise estimate sums every other pixel each way: a quarter of the positions is still
 * 10⁵–10⁶ terms at 2K, a fraction of a per cent of standard error, for a quarter of the work.
 */
const NOISE_STEP = 2;

export type CheckStage = "noise estimate" | "dead and hot pixels" | "clipping" | "screen" | "markers and dust" | "noise" | "done";

export type CheckOptions = {
  /** How the still's file stores its pixels (lib/plate-check/compression.ts); lossless when absent. */
  compression?: CompressionFinding;
  onStage?: (stage: CheckStage, done: number, total: number) => void;
  pause?: () => Promise<void>;
};

const toBase64 = (bytes: Uint8Array): string => {
  let s = "";
  for (let i = 0; i < bytes.length; i += 0x8000) s += String.fromCharCode(...bytes.subarray(i, i + 0x8000));
  return btoa(s);
};
const overlay = (g: { width: number; height: number; cell: number; data: Uint8Array }): OverlayGrid => ({ width: g.width, height: g.height, cell: g.cell, data: toBase64(g.data) });
const pct = (v: number, digits = 1): string => `${(v * 100).toFixed(digits)} %`;

type Surface = { grid: SurfaceGrid; z2: Float32Array; sigmaSmooth: [number, number, number] };

/**
 * Fits the surface model over `mask` twice — the second time without pixels near strong
 * departures — and maps every pixel's departure. The fits read the 3×3 means at every other
 * pixel each way (each mean already averages its neighbours); the map is full resolution.
 */
function fitSurface(frame: PlateFrame, smooth: Float32Array, mask: Uint8Array, size: number, floor: number): Surface {
  const { width: W, height: H } = frame;
  const n = W * H;
  const step = 2 * Math.max(1, Math.round(Math.sqrt(n / 60_000) / 2));
  const grid0 = blockMeans(smooth, W, H, size, mask, 2);
  const s0 = residualSigma(smooth, grid0, W, H, mask, step).map((v) => Math.max(v, floor));
  const strong = strongNearSampled(smooth, grid0, W, H, s0, STRONG, 2);
  const include = andNot(mask, strong);
  const grid = blockMeans(smooth, W, H, size, include, 2);
  const sigmaSmooth = residualSigma(smooth, grid, W, H, include, step).map((v) => Math.max(v, floor)) as [number, number, number];
  const z2 = new Float32Array(takeBuffer(n * 4));
  deviationMap(smooth, grid, W, H, sigmaSmooth, z2);
  return { grid, z2, sigmaSmooth };
}

/**
 * Runs the check. Takes ownership of `frame`: its arrays are changed in place (defects repaired).
 */
export async function checkFrame(frame: PlateFrame, options: CheckOptions = {}): Promise<Findings> {
  const { width: W, height: H, code, linear } = frame;
  const n = W * H;
  const timings: Record<string, number> = {};
  const total = 6;
  let t = performance.now();
  const stage = async (name: CheckStage, done: number): Promise<void> => {
    const now = performance.now();
    timings[name] = round(now - t, 1);
    t = now;
    options.onStage?.(name, done, total);
    if (options.pause) await options.pause();
  };
  const toLinear = (v: number): number => codeToLinear(frame, v);
  const toCode = (l: number): number => linearToCode(frame, l);
  // A floor for noise figures: quantisation of the stored depth (uniform: step/√12).
  const quantFloor = quantisationFloor(frame);

  // 1. Rough noise for thresholds.
  const sampleStep = Math.max(1, Math.round(Math.sqrt(n / 100_000)));
  const rough = CHANNELS.map((_, c) => Math.max(robustSigma(code, W, H, 3, c, sampleStep), quantFloor)) as Rgb;
  await stage("noise estimate", 1);

  // 2. Dead, hot and stuck pixels; repaired in both views before anything averages them.
  const found = findDefects(code, W, H, { sigma: rough });
  const { truncated } = found;
  let defects = found.defects;
  const saved = defects.map((d) => {
    const i = (d.y * W + d.x) * 3;
    return { code: code.slice(i, i + 3), linear: linear.slice(i, i + 3) };
  });
  repairDefects(code, W, defects);
  repairDefects(linear, W, defects);
  await stage("dead and hot pixels", 2);

  // 3. Clipping.
  const clip = countClipping(code, W, H, defects);
  await stage("clipping", 3);

  // 4. Screen: guess from blocks, screen-like pixels, surface model.
  const size = blockSize(W, H);
  const smoothBuffer = takeBuffer(n * 12);
  const smooth = new Float32Array(smoothBuffer);
  boxMean3(code, W, H, smooth);
  const floorSmooth = quantFloor / 3;
  const guess = guessScreen(code, linear, W, H, size, rough);
  const mask = new Uint8Array(n);
  let isScreen = false;
  let surface: Surface | null = null;
  let spots: Spot[] = [];
  let labels: Int32Array | null = null;
  let stats: ScreenStats | null = null;
  let coverage = 0;
  if (guess) {
    screenLikeMask(smooth, W, H, guess, mask);
    // 0.4× to 2× in linear light; in sRGB code values that is 0.4^(1/2.4) to 2^(1/2.4).
    const range: [number, number] = frame.colourSpace === "srgb" ? [0.683, 1.335] : [0.4, 2];
    dropDepartingBlocks(blockMeans(smooth, W, H, size, mask, 2), mask, W, H, range);
    surface = fitSurface(frame, smooth, mask, size, floorSmooth);
    await stage("screen", 4);
    ({ spots, labels } = findSpots(surface.z2, linear, surface.grid, { width: W, height: H, hi: SPOT_HI, lo: SPOT_LO, isScreen: true, surfaceMask: mask, toLinear, toCode, sigma: rough }));
    stats = screenStats(linear, W, H, cleanScreen(mask, labels), size, 2);
    const onScreen = spots.filter((s) => s.kind !== "other").reduce((a, s) => a + s.area, 0);
    coverage = (stats.pixels + onScreen) / n;
    isScreen = coverage >= MIN_SCREEN_COVERAGE;
  } else {
    await stage("screen", 4);
  }
  if (!isScreen) {
    // No screen: model the whole frame as a surface, to find dust and hairs on its flat areas.
    if (surface) giveBack(surface.z2.buffer as ArrayBuffer);
    mask.fill(1);
    surface = fitSurface(frame, smooth, mask, size, floorSmooth);
    ({ spots, labels } = findSpots(surface.z2, linear, surface.grid, { width: W, height: H, hi: SPOT_HI, lo: SPOT_LO, isScreen: false, surfaceMask: flatMask(surface, W, H), toLinear, toCode, sigma: rough }));
  }
  // A flagged pixel inside a spot that is there without it (the end of a hair, a fleck of a
  // marker) is structure, not a defect: give it back its value.
  if (labels && defects.length) {
    const structure = new Set(spots.filter((s) => s.kind !== "other").map((s) => s.label));
    const keep: typeof defects = [];
    defects.forEach((d, k) => {
      const l = labels[d.y * W + d.x]!;
      if (l && structure.has(l)) {
        const i = (d.y * W + d.x) * 3;
        code.set(saved[k]!.code, i);
        linear.set(saved[k]!.linear, i);
      } else keep.push(d);
    });
    defects = keep;
  }
  await stage("markers and dust", 5);

  // 5. Noise where nothing else is: away from spots, departures, clipping and defects.
  const include = noiseMask(frame, surface!.z2, defects, NOISE_STEP);
  const noise = measureNoise(frame, include, rough);
  const flatShare = isScreen ? (stats?.pixels ?? 0) / n : shareOf(flatMask(surface!, W, H));
  // Nothing reads the scratch buffers after this; another check may take them at the next pause.
  giveBack(smoothBuffer, surface!.z2.buffer as ArrayBuffer);
  await stage("noise", 6);

  const screen = screenFinding(guess !== null, isScreen, stats, coverage);
  const markers = markerFinding(isScreen, spots, stats);
  const dustItems = spots.filter((s) => s.kind === "dust" || s.kind === "hair");
  const dust: DustFinding = {
    summary: dustSummary(dustItems, isScreen, flatShare),
    dust: dustItems.filter((s) => s.kind === "dust").length,
    hairs: dustItems.filter((s) => s.kind === "hair").length,
    items: dustItems.map((s) => ({ kind: s.kind as "dust" | "hair", box: s.box, confidence: s.confidence })),
    searchedShare: round(flatShare, 4),
    confidence: round(Math.min(1, flatShare / 0.3) * (dustItems.length ? mean(dustItems.map((s) => s.confidence)) : 0.8), 2),
    tags: [],
  };
  const defectFinding = {
    summary: defects.length
      ? `${defects.length} pixel${defects.length === 1 ? "" : "s"} that disagree with all their neighbours${truncated ? " (listing stopped at the limit)" : ""}.`
      : "No dead, hot or stuck pixels: no pixel stands out from all its neighbours by more than the threshold.",
    count: defects.length,
    items: defects.map((d) => ({ x: d.x, y: d.y, kind: d.kind, channels: d.channels })),
    truncated,
    threshold: rough.map((s) => round(Math.max(7 * s, 0.02), 6)) as Rgb,
    confidence: defects.length ? round(Math.min(1, 0.6 + 0.1 * mean(defects.map((d) => Math.min(4, d.strength)))), 2) : 0.9,
    tags: [],
  };
  const clipping = {
    summary: clippingSummary(clip.clippedAny / n, clip.crushedAny / n, frame.hasCodeCeiling),
    clipped: clip.clipped,
    crushed: clip.crushed,
    clippedShare: round(clip.clippedAny / n, 6),
    crushedShare: round(clip.crushedAny / n, 6),
    hardCeiling: frame.hasCodeCeiling,
    clippedMask: clip.clippedAny ? overlay({ ...clip.grid, data: clip.grid.clipped }) : null,
    crushedMask: clip.crushedAny ? overlay({ ...clip.grid, data: clip.grid.crushed }) : null,
    confidence: 1,
    tags: [],
  };
  const findings: Findings = {
    detectorVersion: DETECTOR_VERSION,
    width: W,
    height: H,
    colourSpace: frame.colourSpace,
    screen,
    markers,
    defects: defectFinding,
    dust,
    noise: { ...noise, codeMax: frame.codeMax },
    clipping,
    compression: options.compression ?? { lossy: false, method: "not told", summary: "The file's coding was not given to the check; its values are taken as stored.", confidence: 0.5, tags: [] },
    problemTags: [],
    plateTags: [],
    timings,
  };
  if (findings.compression.lossy) markLossy(findings);
  const tagged = problemTagsFor(findings);
  findings.problemTags = tagged.problemTags;
  findings.plateTags = tagged.plateTags;
  await stage("done", total);
  return findings;
}

/**
 * A lossy still (JPEG, lossy WebP, lossy OpenEXR): its compression smooths grain and smears or
 * invents single-pixel detail, so the noise, defect and dust figures are rough; they say so and
 * claim half their confidence.
 */
function markLossy(f: Findings): void {
  const note = ` The still is lossy-compressed (${f.compression.method}): compression smooths grain and smears single pixels, so this is a rough figure.`;
  f.noise.summary += note;
  f.noise.confidence = round(f.noise.confidence * 0.5, 2);
  f.defects.summary += note;
  f.defects.confidence = round(f.defects.confidence * 0.5, 2);
  f.dust.summary += note;
  f.dust.confidence = round(f.dust.confidence * 0.5, 2);
}

/** a ∧ ¬b, per pixel. */
function andNot(a: Uint8Array, b: Uint8Array): Uint8Array {
  const out = new Uint8Array(a.length);
  for (let p = 0; p < a.length; p++) out[p] = a[p] === 1 && b[p] === 0 ? 1 : 0;
  return out;
}

/** Screen-like pixels that belong to no spot. */
function cleanScreen(mask: Uint8Array, labels: Int32Array): Uint8Array {
  const out = new Uint8Array(mask.length);
  for (let p = 0; p < mask.length; p++) out[p] = mask[p] === 1 && labels[p] === 0 ? 1 : 0;
  return out;
}

/**
 * Where noise may be measured, at the centres the estimate samples (every `step`-th pixel each
 * way): two pixels clear of any departure from the surface or any defect, one clear of clipping.
 */
function noiseMask(frame: PlateFrame, z2: Float32Array, defects: readonly { x: number; y: number }[], step: number): Uint8Array {
  const { width: W, height: H, code } = frame;
  const n = W * H;
  const hits = new Uint8Array(n);
  for (let p = 0; p < n; p++) if (z2[p]! > SPOT_LO) hits[p] = 1;
  for (const d of defects) hits[d.y * W + d.x] = 1;
  const away = new Uint8Array(n);
  dilateMask(hits, W, H, 2, away);
  // Clipped values are rare: mark their 3×3 neighbourhoods directly.
  for (let j = 0; j < n * 3; j++) {
    const v = code[j]!;
    if (v < 1 && v > 0) continue;
    const p = (j / 3) | 0, x = p % W, y = (p / W) | 0;
    for (let yy = Math.max(0, y - 1); yy <= Math.min(H - 1, y + 1); yy++) away.fill(1, yy * W + Math.max(0, x - 1), yy * W + Math.min(W - 1, x + 1) + 1);
  }
  const out = hits;
  out.fill(0);
  for (let y = step; y < H - 1; y += step) for (let x = step, p = y * W + step; x < W - 1; x += step, p += step) if (away[p] === 0) out[p] = 1;
  return out;
}

const mean = (a: readonly number[]): number => (a.length ? a.reduce((s, v) => s + v, 0) / a.length : 0);

function shareOf(mask: Uint8Array): number {
  let k = 0;
  for (let i = 0; i < mask.length; i++) k += mask[i]!;
  return mask.length ? k / mask.length : 0;
}

/** Pixels of a frame with no screen that sit on a flat stretch (their 3×3 mean matches the block model within noise). */
function flatMask(surface: Surface, width: number, height: number): Uint8Array {
  const out = new Uint8Array(width * height);
  for (let p = 0; p < out.length; p++) out[p] = surface.z2[p]! <= SPOT_LO ? 1 : 0;
  return out;
}

function measureNoise(frame: PlateFrame, include: Uint8Array, rough: Rgb): Omit<NoiseFinding, "codeMax"> {
  const { width: W, height: H, code, codeMax } = frame;
  const n = W * H;
  let pixels = 0;
  for (let p = 0; p < n; p++) pixels += include[p]!;
  const flatEnough = pixels >= Math.max(500, (0.01 * n) / (NOISE_STEP * NOISE_STEP));
  const sums = flatEnough ? laplacianAbsSumsRgb(code, W, H, include, NOISE_STEP) : null;
  const sigma = CHANNELS.map((_, c) => (sums ? (IMMERKAER_SCALE * sums.sums[c]!) / sums.count : rough[c]!)) as Rgb;
  // Relative standard error of a mean of |N ∗ I| over `pixels` terms: √((π/2 − 1)/N_eff), with
  // N_eff = N/4 for the overlap of neighbouring 3×3 masks (own allowance, not from the paper).
  const used = flatEnough ? pixels : n / 4;
  const rel = Math.sqrt((Math.PI / 2 - 1) / Math.max(1, used / 4));
  const noisiest = CHANNELS[sigma.indexOf(Math.max(...sigma))]!;
  // Float stills: the stored values themselves (linear light for a still in a linear space).
  const codes = sigma.map((s) => round(s * codeMax, frame.hasCodeCeiling ? 3 : 6)) as Rgb;
  const units = frame.hasCodeCeiling ? `code values (of ${codeMax})` : frame.colourSpace === "linear" ? "in the still's linear float values" : "in the still's stored float values";
  const summary = flatEnough
    ? `Noise σ R ${codes[0]} · G ${codes[1]} · B ${codes[2]} ${units}; ${noisiest.toUpperCase()} is noisiest. Measured on ${pct((pixels * NOISE_STEP * NOISE_STEP) / n, 0)} of the frame where nothing else was found.`
    : `Too little flat area to measure noise on its own; σ R ${codes[0]} · G ${codes[1]} · B ${codes[2]} ${units} from the whole frame's median response, which counts fine texture as noise.`;
  return {
    summary,
    sigma: sigma.map((s) => round(s, 7)) as Rgb,
    sigmaCodes: codes,
    noisiest,
    relativeError: [rel, rel, rel].map((v) => round(v, 5)) as Rgb,
    pixels,
    method: flatEnough ? "flat-areas" : "whole-frame-median",
    confidence: round(flatEnough ? Math.min(1, 0.7 + pixels / n) : 0.35, 2),
    tags: [],
  };
}

function screenFinding(guessed: boolean, present: boolean, stats: ScreenStats | null, coverage: number): ScreenFinding {
  if (!present || !stats) {
    return {
      present: false,
      confidence: round(guessed ? Math.max(0.5, 1 - coverage / MIN_SCREEN_COVERAGE) : 0.9, 2),
      summary: guessed
        ? `No backing screen: the largest even, saturated green-to-blue area covers only ${pct(coverage)} of the frame (a screen needs at least ${pct(MIN_SCREEN_COVERAGE, 0)}).`
        : "No backing screen: no even, saturated green-to-blue area in the frame.",
      hue: null,
      kind: null,
      meanLinear: null,
      coverage: round(coverage, 4),
      unevenness: null,
      range: null,
      mask: null,
      tags: [],
    };
  }
  const kind = screenKind(stats.hue);
  const uneven = round(stats.unevenness, 2);
  return {
    present: true,
    confidence: round(Math.min(1, coverage / 0.3) * Math.min(1, stats.saturation / 0.4) * (stats.blocks >= 8 ? 1 : 0.6), 2),
    summary: `A ${kind === "other" ? "" : `${kind} `}backing screen (hue ${stats.hue.toFixed(1)}°) covers ${pct(coverage, 0)} of the frame; its brightness varies by ${uneven.toFixed(1)} % (5th to 95th percentile of ${stats.blocks} blocks, against the median).`,
    hue: round(stats.hue, 2),
    kind,
    meanLinear: stats.meanLinear.map((v) => round(v, 5)) as Rgb,
    coverage: round(coverage, 4),
    unevenness: uneven,
    range: [round(stats.range[0], 3), round(stats.range[1], 3)],
    mask: overlay(stats.grid),
    tags: [],
  };
}

function markerFinding(isScreen: boolean, spots: Spot[], stats: ScreenStats | null): MarkerFinding {
  if (!isScreen || !stats) {
    return { searched: false, summary: "Markers not searched: there is no backing screen to find them on.", count: 0, confidence: 0, items: [], shades: [], tags: [] };
  }
  const found = spots.filter((s) => s.kind === "marker");
  if (!found.length) {
    return { searched: true, summary: "No tracking markers on the screen: nothing on it differs from the screen by more than the grain.", count: 0, confidence: 0.85, items: [], shades: [], tags: [] };
  }
  const groups = groupShades(
    found.map((s) => s.direction),
    found.map((s) => Math.hypot(...s.direction)),
  );
  const screenRef = stats.meanLinear;
  const shadeOf = new Map<number, number>();
  const shades: MarkerShade[] = groups.map((g, index) => {
    for (const i of g.members) shadeOf.set(i, index);
    // The most opaque members stand for the shade: largest log contrast of the core against the screen.
    const strength = (s: Spot): number => Math.max(...[0, 1, 2].map((c) => Math.abs(Math.log(Math.max(s.core[c]!, 1e-4) / Math.max(s.surface[c]!, 1e-4)))));
    const best = g.members.map((i) => found[i]!).sort((a, b) => strength(b) - strength(a)).slice(0, 3);
    const colour: Rgb = [0, 0, 0], screen: Rgb = [0, 0, 0];
    for (const s of best) {
      for (let c = 0; c < 3; c++) {
        // Bring each marker to the screen's mean level: lighting multiplies marker and screen alike.
        const k = screenRef[c]! / Math.max(s.surface[c]!, 1e-6);
        colour[c]! += (s.core[c]! * k) / best.length;
        screen[c]! += screenRef[c]! / best.length;
      }
    }
    return {
      index,
      count: g.members.length,
      colourLinear: colour.map((v) => round(v, 5)) as Rgb,
      screenLinear: screen.map((v) => round(v, 5)) as Rgb,
      direction: g.direction.map((v) => round(v, 4)) as Rgb,
    };
  });
  const items = found.map((s, i) => ({ x: round(s.x, 2), y: round(s.y, 2), box: s.box, shade: shadeOf.get(i) ?? 0, confidence: s.confidence }));
  return {
    searched: true,
    summary: `${found.length} tracking marker${found.length === 1 ? "" : "s"} on the screen in ${shades.length} shade${shades.length === 1 ? "" : "s"}${shades.length > 1 ? " (more shades make the matrix method harder: one row must hide them all)" : ""}.`,
    count: found.length,
    confidence: round(mean(items.map((i) => i.confidence)), 2),
    items,
    shades,
    tags: [],
  };
}

function dustSummary(items: Spot[], isScreen: boolean, share: number): string {
  const dust = items.filter((s) => s.kind === "dust").length, hairs = items.length - dust;
  const where = isScreen ? "the clean screen" : "the flat areas";
  if (!items.length) return `No dust or hairs on ${where} (${pct(share, 0)} of the frame was flat enough to search).`;
  return `${dust} dust speck${dust === 1 ? "" : "s"} and ${hairs} hair${hairs === 1 ? "" : "s"} on ${where} (${pct(share, 0)} of the frame was flat enough to search).`;
}

function clippingSummary(clipped: number, crushed: number, ceiling: boolean): string {
  if (!clipped && !crushed) return ceiling ? "Nothing clipped or crushed: no channel reaches the top or bottom code." : "No values at or above 1.0 or at or below 0.";
  const parts: string[] = [];
  if (clipped) parts.push(`${pct(clipped, 3)} of pixels clipped`);
  if (crushed) parts.push(`${pct(crushed, 3)} crushed`);
  return `${parts.join(", ")} ${ceiling ? "(a channel at the top or bottom code)" : "(values at or above 1.0 or at or below 0; float stills keep them)"}.`;
}
