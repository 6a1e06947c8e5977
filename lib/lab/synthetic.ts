import "server-only";
import sharp from "sharp";
import type { Rect, RecipeStepInput } from "@/lib/lab/recipe";
import { codeLut, srgbEncode } from "@/lib/lab/srgb";
import { solveRow } from "@/lib/lab/solver";
import { mulberry32 } from "@/lib/random";

/*
 * Deterministic demo plate: an unevenly lit backing screen with tracking markers of two hues
 * (crosses and dots), a foreground shape and film-like grain. Everything is composed in linear
 * light (so lighting is multiplicative, as on set), sRGB-encoded, grained in code values and
 * stored as 16-bit PNG. Invented data for the seed and the tests; nothing is taken from anywhere.
 */

export type Box = { x: number; y: number; w: number; h: number };
type Rgb3 = [number, number, number];
type SyntheticMarker = { kind: "cross" | "dot"; x: number; y: number; size: number; hue: 0 | 1 };

type SyntheticOptions = {
  width: number;
  height: number;
  seed?: number;
  screen?: "green" | "blue";
  /** Grain standard deviation in encoded code values (0..1). */
  grain?: number;
  compressionLevel?: number;
};

export type SyntheticPlate = {
  width: number;
  height: number;
  screen: "green" | "blue";
  /** 16-bit sRGB-encoded PNGs. */
  plate: Buffer;
  denoised: Buffer;
  cleanTruth: Buffer;
  markers: SyntheticMarker[];
  foreground: { cx: number; cy: number; rx: number; ry: number };
  /** Boxes a person would drag on the still: inside sample markers, and on the screen around them. */
  markerBoxes: Box[];
  screenBoxes: Box[];
  /** A marker-free band of screen, for level-match fits. */
  screenRect: Rect;
  /** Box means of the denoised plate in linear light, as the lab would sample them. */
  markerSamples: Rgb3[];
  screenSamples: Rgb3[];
};

export const SCREEN_COLOURS: Record<"green" | "blue", Rgb3> = {
  green: [0.06, 0.42, 0.1],
  blue: [0.05, 0.12, 0.45],
};
// Marker hues chosen to stand apart from both screens: a warm pink and a yellow.
export const MARKER_COLOURS: [Rgb3, Rgb3] = [
  [0.55, 0.16, 0.3],
  [0.5, 0.45, 0.05],
];
const FOREGROUND_COLOUR: Rgb3 = [0.03, 0.05, 0.07];

/** Standard normal samples from a uniform source (Box–Muller, both values of each pair used). */
export function gaussianSource(rand: () => number): () => number {
  let spare: number | null = null;
  return () => {
    if (spare !== null) {
      const s = spare;
      spare = null;
      return s;
    }
    const u = Math.max(rand(), 1e-12), v = rand();
    const r = Math.sqrt(-2 * Math.log(u));
    spare = r * Math.sin(2 * Math.PI * v);
    return r * Math.cos(2 * Math.PI * v);
  };
}

const clamp01 = (v: number): number => (v < 0 ? 0 : v > 1 ? 1 : v);

export async function generateSyntheticPlate(opts: SyntheticOptions): Promise<SyntheticPlate> {
  const { width: W, height: H } = opts;
  const screenKind = opts.screen ?? "green";
  const rand = mulberry32(opts.seed ?? 7);
  const gauss = gaussianSource(mulberry32((opts.seed ?? 7) * 7919 + 1));
  const grainSigma = opts.grain ?? 0.012;
  const s0 = SCREEN_COLOURS[screenKind];
  const n = W * H;
  const u = W / 2048; // layout scale

  // Uneven lighting: a broad hot spot plus slow ripples; flat near the hot spot's centre.
  const lcx = 0.45 * W, lcy = 0.35 * H;
  const ph1 = rand() * 6.28, ph2 = rand() * 6.28;
  const light = (x: number, y: number): number => {
    const dx = (x - lcx) / W, dy = (y - lcy) / W;
    const ripple = 0.03 * Math.sin((x / W) * 5 + ph1) * Math.sin((y / H) * 4 + ph2) * Math.min(1, (dx * dx + dy * dy) * 40);
    return 1.02 - 0.9 * (dx * dx + dy * dy) + ripple;
  };

  const fg = { cx: 0.68 * W, cy: 0.88 * H, rx: 0.16 * W, ry: 0.42 * H };
  const truth = new Float32Array(n * 3);
  for (let y = 0; y < H; y++) {
    for (let x = 0; x < W; x++) {
      const L = light(x, y);
      // Anti-aliased ellipse edge, ~1 px wide.
      const ex = (x - fg.cx) / fg.rx, ey = (y - fg.cy) / fg.ry;
      const d = (Math.sqrt(ex * ex + ey * ey) - 1) * Math.min(fg.rx, fg.ry);
      const a = clamp01(0.5 - d);
      const o = (y * W + x) * 3;
      for (let c = 0; c < 3; c++) truth[o + c] = L * (s0[c]! * (1 - a) + FOREGROUND_COLOUR[c]! * a);
    }
  }
  const plateLin = new Float32Array(truth);

  // Markers on a jittered grid; a sample pair (one dot of each hue) sits near the light's centre.
  const markers: SyntheticMarker[] = [];
  const pitch = 150 * u;
  const bandTop = 0.03 * H, bandBottom = 0.11 * H; // kept free for level fits
  let k = 0;
  for (let gy = pitch * 0.6; gy < H - 20 * u; gy += pitch) {
    for (let gx = pitch * 0.5; gx < W - 20 * u; gx += pitch) {
      const x = gx + (rand() - 0.5) * pitch * 0.3, y = gy + (rand() - 0.5) * pitch * 0.3;
      const ex = (x - fg.cx) / (fg.rx + 40 * u), ey = (y - fg.cy) / (fg.ry + 40 * u);
      if (ex * ex + ey * ey < 1) continue;
      if (y > bandTop - 30 * u && y < bandBottom + 30 * u) continue;
      if (Math.abs(x - lcx) < 90 * u && Math.abs(y - lcy) < 90 * u) continue;
      const kind = rand() < 0.5 ? "cross" : "dot";
      markers.push({ kind, x, y, size: kind === "cross" ? 16 * u : 7 * u, hue: (k++ % 2) as 0 | 1 });
    }
  }
  const pairGap = 24 * u;
  const sampleDots: SyntheticMarker[] = [
    { kind: "dot", x: lcx - pairGap, y: lcy, size: 9 * u, hue: 0 },
    { kind: "dot", x: lcx + pairGap, y: lcy, size: 9 * u, hue: 1 },
  ];
  markers.push(...sampleDots);

  const thick = Math.max(1.5, 2.5 * u);
  for (const m of markers) {
    const col = MARKER_COLOURS[m.hue];
    const reach = Math.ceil(m.size + 2);
    const x0 = Math.max(0, Math.floor(m.x - reach)), x1 = Math.min(W - 1, Math.ceil(m.x + reach));
    const y0 = Math.max(0, Math.floor(m.y - reach)), y1 = Math.min(H - 1, Math.ceil(m.y + reach));
    for (let y = y0; y <= y1; y++) {
      for (let x = x0; x <= x1; x++) {
        const dx = x - m.x, dy = y - m.y;
        let cov: number;
        if (m.kind === "dot") {
          cov = clamp01(m.size - Math.hypot(dx, dy) + 0.5);
        } else {
          const bar = (along: number, across: number): number =>
            clamp01(m.size - Math.abs(along) + 0.5) * clamp01(thick - Math.abs(across) + 0.5);
          cov = Math.max(bar(dx, dy), bar(dy, dx));
        }
        if (cov <= 0) continue;
        const L = light(x, y), o = (y * W + x) * 3;
        for (let c = 0; c < 3; c++) plateLin[o + c] = plateLin[o + c]! * (1 - cov) + L * col[c]! * cov;
      }
    }
  }

  // Encode, then grain in code values (same grain on the plate and the clean truth).
  const plate16 = new Uint16Array(n * 3), den16 = new Uint16Array(n * 3), truth16 = new Uint16Array(n * 3);
  for (let i = 0; i < n * 3; i++) {
    const e = srgbEncode(clamp01(plateLin[i]!)), t = srgbEncode(clamp01(truth[i]!));
    const g = gauss() * grainSigma;
    den16[i] = Math.round(e * 65535);
    plate16[i] = Math.round(clamp01(e + g) * 65535);
    truth16[i] = Math.round(clamp01(t + g) * 65535);
  }
  const png = (a: Uint16Array): Promise<Buffer> =>
    sharp(a, { raw: { width: W, height: H, channels: 3 } })
      .toColourspace("rgb16")
      .png({ compressionLevel: opts.compressionLevel ?? 6 })
      .toBuffer();
  const [plate, denoised, cleanTruth] = await Promise.all([png(plate16), png(den16), png(truth16)]);

  const half = Math.max(1, Math.floor(sampleDots[0]!.size * 0.5));
  const markerBoxes: Box[] = sampleDots.map((m) => ({ x: Math.round(m.x - half), y: Math.round(m.y - half), w: 2 * half, h: 2 * half }));
  // Screen boxes placed symmetrically around the pair so their mean lighting matches the markers'.
  const sb = Math.max(2, Math.round(6 * u)), off = 24 * u;
  const screenBoxes: Box[] = [
    [lcx, lcy - off], [lcx, lcy + off], [lcx - 2 * pairGap - off / 2, lcy], [lcx + 2 * pairGap + off / 2, lcy],
  ].map(([x, y]) => ({ x: Math.round(x! - sb / 2), y: Math.round(y! - sb / 2), w: sb, h: sb }));
  const lut = codeLut(16, true);
  const mean = (b: Box): Rgb3 => {
    const s: Rgb3 = [0, 0, 0];
    for (let y = b.y; y < b.y + b.h; y++) for (let x = b.x; x < b.x + b.w; x++) {
      for (let c = 0; c < 3; c++) s[c] = s[c]! + lut[den16[(y * W + x) * 3 + c]!]!;
    }
    return s.map((v) => v / (b.w * b.h)) as Rgb3;
  };
  return {
    width: W,
    height: H,
    screen: screenKind,
    plate,
    denoised,
    cleanTruth,
    markers,
    foreground: fg,
    markerBoxes,
    screenBoxes,
    screenRect: { x: Math.round(0.05 * W), y: Math.round(bandTop), w: Math.round(0.9 * W), h: Math.max(1, Math.round(bandBottom - bandTop)) },
    markerSamples: markerBoxes.map(mean),
    screenSamples: screenBoxes.map(mean),
  };
}

/**
 * The demo marker-cleanup recipe for a plate: hide the markers in the screen's own channel with a
 * solved matrix row, copy that channel into the other two and level-match each to the plate, pull a
 * marker matte with a solved matte row, grow and soften it, mix the clean result in only through
 * the matte, and put the plate's grain back. Runs in linear light on the denoised plate.
 */
export function demoCleanupRecipe(opts: {
  denoisedStillId: string;
  width: number;
  screen: "green" | "blue";
  markerSamples: Rgb3[];
  screenSamples: Rgb3[];
  screenRect: Rect;
}): RecipeStepInput[] {
  const channel = opts.screen === "green" ? "g" : "b";
  const others = (["r", "g", "b"] as const).filter((c) => c !== channel);
  const hide = solveRow({ markers: opts.markerSamples, screen: opts.screenSamples, goal: { kind: "hide", channel } });
  const matte = solveRow({ markers: opts.markerSamples, screen: opts.screenSamples, goal: { kind: "matte", channel } });
  const u = opts.width / 2048;
  const round6 = (v: number): number => Math.round(v * 1e6) / 1e6;
  return [
    { op: "matrix", m: hide.matrix.map((r) => r.map(round6)) as [[number, number, number], [number, number, number], [number, number, number]] },
    ...others.flatMap((c): RecipeStepInput[] => [
      { op: "copy", from: channel, to: c },
      { op: "level", channel: c, ref: c, fit: "gain", rect: opts.screenRect },
    ]),
    { op: "matte", channel: matte.row.map(round6) as [number, number, number], source: "plate", black: 0.08, white: 0.35 },
    { op: "grow", px: Math.max(2, Math.round(3 * u)) },
    { op: "soften", sigma: round6(Math.max(0.6, 1.2 * u)), target: "matte" },
    { op: "mix" },
    { op: "grain", denoised: opts.denoisedStillId },
  ];
}
