import sharp from "sharp";
import { srgbEncode } from "@/lib/lab/srgb";
import { gaussianSource } from "@/lib/lab/synthetic";
import { mulberry32 } from "@/lib/random";

/*
 * Generated plates with recorded truth, for the plate check's accuracy tests and benchmark.
 * Test-only (issue 18). Everything is composed in linear light — lighting multiplies, markers,
 * foreground and dust are mixed by coverage — then sRGB-encoded (IEC 61966-2-1), grained in code
 * values with Gaussian noise of a known sigma, quantised, and finally sensor defects are planted
 * in the codes. Invented data; nothing is taken from anywhere.
 */

export type Rgb = [number, number, number];

export type MarkerShape = "cross" | "dot" | "square";

export type PlateSpec = {
  width: number;
  height: number;
  seed: number;
  /** false: a scene with no backing screen (low-saturation gradients and texture). */
  hasScreen?: boolean;
  /** HSV hue of the screen's linear colour, degrees. */
  screenHue?: number;
  /** HSV saturation of the screen's linear colour. */
  screenSat?: number;
  /** Largest channel of the screen's linear colour under full light. */
  screenValue?: number;
  /** Strength of the uneven lighting: 0 flat, 0.4 strong fall-off. */
  unevenness?: number;
  /** Number of distinct marker shades, 0–4. */
  shades?: number;
  /** The first shade is tape of the screen's own hue: the screen's colour at this share of its level (e.g. 0.35). */
  screenHuedShade?: number | null;
  /** Marker grid pitch and size in pixels (size: dot radius / cross half-arm). */
  markerPitch?: number;
  markerSize?: number;
  shapes?: MarkerShape[];
  /** Motion blur applied to markers, foreground and dust: length in px and direction. */
  motionBlur?: { length: number; angleDeg: number } | null;
  /** Edge ramp width of markers and foreground in px (1 = anti-aliased, larger = soft). */
  edgeSoftness?: number;
  /** Foreground shapes (large ellipses and bars) in marker-like colours and dark colours. */
  foregroundShapes?: number;
  /** Grain: Gaussian sigma in code values on a 0..1 scale. */
  grain?: number;
  deadHotStuck?: number;
  dust?: number;
  hairs?: number;
  bits?: 8 | 16;
  /**
   * "codes" (default): sRGB-encoded integer codes, grain in code values. "linear": the frame stays
   * in linear light as floats (an OpenEXR plate): grain of sigma `grain` in linear values, nothing
   * clipped or quantised, defects planted as linear values (hot 4.0, dead 0).
   */
  encoding?: "codes" | "linear";
};

export type TruthMarker = { x: number; y: number; shade: number; box: Box; shape: MarkerShape };
export type TruthDefect = { x: number; y: number; kind: "hot" | "dead" | "stuck"; channels: ("r" | "g" | "b")[] };
export type Box = { x: number; y: number; w: number; h: number };

export type PlateTruth = {
  screen: null | { hue: number; colour: Rgb; meanLinear: Rgb; coverage: number; unevenness: number };
  markers: TruthMarker[];
  shades: Rgb[];
  defects: TruthDefect[];
  dust: { x: number; y: number; box: Box }[];
  hairs: { box: Box }[];
  /** Grain sigma in code values (0..1 scale) and in codes of the stored bit depth. */
  noiseSigma: number;
  noiseSigmaCodes: number;
};

export type GeneratedPlate = {
  spec: Required<Omit<PlateSpec, "motionBlur">> & { motionBlur: PlateSpec["motionBlur"] };
  width: number;
  height: number;
  bits: 8 | 16;
  /** Stored codes, RGB interleaved. */
  codes: Uint8Array | Uint16Array;
  truth: PlateTruth;
  /** The stored codes as a PNG of the stated bit depth. */
  png(): Promise<Buffer>;
  /** encoding "linear": the plate's linear RGB floats, interleaved (null for coded plates). */
  linear: Float32Array | null;
};

/** Marker shades, linear RGB. Chosen to be told apart from screens and from each other. */
export const MARKER_PALETTE: Rgb[] = [
  [0.55, 0.16, 0.3], // pink
  [0.5, 0.45, 0.05], // yellow
  [0.7, 0.7, 0.68], // white tape
  [0.02, 0.02, 0.025], // black tape
  [0.6, 0.2, 0.02], // orange
  [0.28, 0.04, 0.4], // purple
  [0.42, 0.03, 0.03], // red
  [0.2, 0.2, 0.2], // grey
];

const clamp01 = (v: number): number => (v < 0 ? 0 : v > 1 ? 1 : v);

export function hsvToRgb(h: number, s: number, v: number): Rgb {
  const hh = (((h % 360) + 360) % 360) / 60;
  const c = v * s, x = c * (1 - Math.abs((hh % 2) - 1)), m = v - c;
  const [r, g, b] = hh < 1 ? [c, x, 0] : hh < 2 ? [x, c, 0] : hh < 3 ? [0, c, x] : hh < 4 ? [0, x, c] : hh < 5 ? [x, 0, c] : [c, 0, x];
  return [r + m, g + m, b + m];
}

/** HSV (hexcone) hue in degrees, as in A. R. Smith, "Color Gamut Transform Pairs", SIGGRAPH 1978. */
export function hueOf([r, g, b]: readonly number[]): number {
  const max = Math.max(r!, g!, b!), min = Math.min(r!, g!, b!), d = max - min;
  if (d <= 0) return 0;
  let h = max === r ? ((g! - b!) / d) % 6 : max === g ? (b! - r!) / d + 2 : (r! - g!) / d + 4;
  h *= 60;
  return h < 0 ? h + 360 : h;
}

function angleBetween(a: readonly number[], b: readonly number[]): number {
  const d = a[0]! * b[0]! + a[1]! * b[1]! + a[2]! * b[2]!;
  return (Math.acos(Math.max(-1, Math.min(1, d / (Math.hypot(...a) * Math.hypot(...b))))) * 180) / Math.PI;
}

const sub = (a: readonly number[], b: readonly number[]): Rgb => [a[0]! - b[0]!, a[1]! - b[1]!, a[2]! - b[2]!];

/** Shades that stand apart from the screen and from each other (≥ 20° between their differences from the screen). */
function pickShades(rand: () => number, screen: Rgb, count: number): Rgb[] {
  const order = MARKER_PALETTE.map((c, i) => ({ c, k: rand(), i })).sort((a, b) => a.k - b.k);
  const out: Rgb[] = [];
  for (const { c } of order) {
    if (out.length >= count) break;
    const d = sub(c, screen);
    // Enough contrast against the screen in at least one channel.
    if (Math.max(...d.map(Math.abs)) < 0.12) continue;
    if (angleBetween(d, screen) < 15 && Math.hypot(...d) < 0.3 * Math.hypot(...screen)) continue;
    if (out.some((o) => angleBetween(sub(o, screen), d) < 20)) continue;
    out.push(c);
  }
  return out;
}

type Shape = { kind: "ellipse"; cx: number; cy: number; rx: number; ry: number; cos: number; sin: number } | { kind: "bar"; x0: number; y0: number; x1: number; y1: number; r: number };

/** Signed distance in px (negative inside). Ellipse distance is approximate (scaled by the smaller radius). */
function shapeDistance(s: Shape, x: number, y: number): number {
  if (s.kind === "ellipse") {
    const c = s.cos, sn = s.sin;
    const dx = x - s.cx, dy = y - s.cy;
    const u = (dx * c + dy * sn) / s.rx, v = (-dx * sn + dy * c) / s.ry;
    return (Math.sqrt(u * u + v * v) - 1) * Math.min(s.rx, s.ry);
  }
  const vx = s.x1 - s.x0, vy = s.y1 - s.y0;
  const t = Math.max(0, Math.min(1, ((x - s.x0) * vx + (y - s.y0) * vy) / (vx * vx + vy * vy)));
  return Math.hypot(x - (s.x0 + t * vx), y - (s.y0 + t * vy)) - s.r;
}

/** Coverage of a point at signed distance d for an edge ramp `soft` px wide. */
const ramp = (d: number, soft: number): number => clamp01(0.5 - d / soft);

function markerDistance(kind: MarkerShape, dx: number, dy: number, size: number, thick: number): number {
  if (kind === "dot") return Math.hypot(dx, dy) - size;
  if (kind === "square") return Math.max(Math.abs(dx), Math.abs(dy)) - size;
  const arm = (along: number, across: number): number => Math.max(Math.abs(along) - size, Math.abs(across) - thick);
  return Math.min(arm(dx, dy), arm(dy, dx));
}

export function generatePlate(input: PlateSpec): GeneratedPlate {
  const spec = {
    hasScreen: true,
    screenHue: 120,
    screenSat: 0.8,
    screenValue: 0.45,
    unevenness: 0.25,
    shades: 2,
    screenHuedShade: null as number | null,
    markerPitch: Math.round(input.width / 9),
    markerSize: Math.max(4, Math.round(input.width / 160)),
    shapes: ["cross", "dot"] as MarkerShape[],
    motionBlur: null,
    edgeSoftness: 1,
    foregroundShapes: 1,
    grain: 0.01,
    deadHotStuck: 12,
    dust: 6,
    hairs: 2,
    bits: 16 as 8 | 16,
    encoding: "codes" as "codes" | "linear",
    ...input,
  };
  const { width: W, height: H } = spec;
  const rand = mulberry32(spec.seed * 2654435761);
  const gauss = gaussianSource(mulberry32(spec.seed * 40503 + 17));
  const n = W * H;
  const lin = new Float32Array(n * 3);
  const fgAlpha = new Float32Array(n);
  const blur = spec.motionBlur && spec.motionBlur.length > 0 ? spec.motionBlur : null;
  const blurTaps = blur ? Math.max(2, Math.ceil(blur.length) + 1) : 1;
  const blurVec = blur ? [Math.cos((blur.angleDeg * Math.PI) / 180) * blur.length, Math.sin((blur.angleDeg * Math.PI) / 180) * blur.length] : [0, 0];
  /** Coverage averaged along the motion-blur path (a box filter along the direction of travel). */
  const blurred = (f: (x: number, y: number) => number, x: number, y: number): number => {
    if (blurTaps === 1) return f(x, y);
    let s = 0;
    for (let k = 0; k < blurTaps; k++) {
      const t = k / (blurTaps - 1) - 0.5;
      s += f(x + blurVec[0]! * t, y + blurVec[1]! * t);
    }
    return s / blurTaps;
  };
  const reach = blur ? Math.ceil(blur.length / 2) + 2 : 2;

  // --- background: lit screen, or a scene with no screen ---
  const screen = hsvToRgb(spec.screenHue, spec.screenSat, spec.screenValue);
  const lcx = (0.3 + 0.4 * rand()) * W, lcy = (0.25 + 0.5 * rand()) * H;
  const gx = (rand() - 0.5) * 0.3, gy = (rand() - 0.5) * 0.3;
  const ph1 = rand() * 6.28, ph2 = rand() * 6.28;
  const light = (x: number, y: number): number => {
    const dx = (x - lcx) / W, dy = (y - lcy) / W;
    const fall = 1 - spec.unevenness * 2.2 * (dx * dx + dy * dy);
    const slope = spec.unevenness * (gx * (x / W - 0.5) + gy * (y / H - 0.5));
    const ripple = spec.unevenness * 0.08 * Math.sin((x / W) * 6 + ph1) * Math.sin((y / H) * 5 + ph2);
    return Math.max(0.15, fall + slope + ripple);
  };
  const sceneA: Rgb = [0.18 + 0.1 * rand(), 0.16 + 0.1 * rand(), 0.13 + 0.1 * rand()];
  const sceneB: Rgb = [0.05 + 0.05 * rand(), 0.06 + 0.05 * rand(), 0.07 + 0.05 * rand()];
  const waves = Array.from({ length: 6 }, () => ({ fx: (rand() * 20 + 2) / W, fy: (rand() * 20 + 2) / H, ph: rand() * 6.28, a: 0.15 * rand() }));
  const lightField = new Float32Array(n);
  for (let y = 0, i = 0; y < H; y++) {
    for (let x = 0; x < W; x++, i++) {
      const o = i * 3;
      if (spec.hasScreen) {
        const L = light(x, y);
        lightField[i] = L;
        lin[o] = screen[0] * L;
        lin[o + 1] = screen[1] * L;
        lin[o + 2] = screen[2] * L;
      } else {
        let t = y / H;
        for (const w of waves) t += w.a * Math.sin(x * w.fx * 6.28 + y * w.fy * 6.28 + w.ph);
        t = clamp01(t);
        for (let c = 0; c < 3; c++) lin[o + c] = sceneA[c]! * (1 - t) + sceneB[c]! * t;
      }
    }
  }

  // --- foreground shapes (composited after the markers, so markers behind them are hidden) ---
  const shades = spec.hasScreen ? pickShades(rand, screen, spec.shades) : [];
  if (spec.hasScreen && spec.screenHuedShade !== null && shades.length) shades[0] = screen.map((v) => v * spec.screenHuedShade!) as Rgb;
  const fgColours: Rgb[] = [...MARKER_PALETTE, [0.03, 0.05, 0.07], [0.12, 0.08, 0.06]];
  const shapes: { shape: Shape; colour: Rgb }[] = [];
  for (let k = 0; k < spec.foregroundShapes; k++) {
    const colour = fgColours[Math.floor(rand() * fgColours.length)]!;
    if (rand() < 0.6) {
      const rx = (0.08 + 0.1 * rand()) * W, ry = (0.12 + 0.25 * rand()) * H;
      const cx = rand() * W, cy = (0.45 + 0.6 * rand()) * H, rot = (rand() - 0.5) * 1.2;
      shapes.push({ shape: { kind: "ellipse", cx, cy, rx, ry, cos: Math.cos(rot), sin: Math.sin(rot) }, colour });
    } else {
      const x0 = rand() * W, y0 = H + 10, x1 = x0 + (rand() - 0.5) * W * 0.5, y1 = (0.2 + 0.4 * rand()) * H;
      shapes.push({ shape: { kind: "bar", x0, y0, x1, y1, r: (0.025 + 0.03 * rand()) * W }, colour });
    }
  }
  const fgAt = (x: number, y: number): number => {
    let a = 0;
    for (const { shape } of shapes) a = Math.max(a, ramp(shapeDistance(shape, x, y), spec.edgeSoftness));
    return a;
  };

  // --- markers on a jittered grid, clear of the foreground and the frame edge ---
  const markers: TruthMarker[] = [];
  if (spec.hasScreen && shades.length) {
    const pitch = spec.markerPitch;
    const thick = Math.max(1, spec.markerSize * 0.22);
    let k = Math.floor(rand() * shades.length);
    for (let gy0 = pitch * 0.5; gy0 < H; gy0 += pitch) {
      for (let gx0 = pitch * 0.5; gx0 < W; gx0 += pitch) {
        const x = gx0 + (rand() - 0.5) * pitch * 0.4, y = gy0 + (rand() - 0.5) * pitch * 0.4;
        const size = spec.markerSize * (0.8 + 0.4 * rand());
        const shape = spec.shapes[Math.floor(rand() * spec.shapes.length)]!;
        const shade = k++ % shades.length;
        const r = size + reach + spec.edgeSoftness + 2;
        const box: Box = { x: Math.floor(x - r), y: Math.floor(y - r), w: Math.ceil(2 * r) + 1, h: Math.ceil(2 * r) + 1 };
        if (box.x < 4 || box.y < 4 || box.x + box.w > W - 4 || box.y + box.h > H - 4) continue;
        // Clear of the foreground by a few pixels beyond the marker's own extent.
        let hidden = false;
        for (let yy = box.y - 6; yy < box.y + box.h + 6 && !hidden; yy += 2) {
          for (let xx = box.x - 6; xx < box.x + box.w + 6; xx += 2) if (fgAt(xx, yy) > 0.001) { hidden = true; break; }
        }
        if (hidden) continue;
        markers.push({ x, y, shade, box, shape });
        const col = shades[shade]!;
        const cov = (px: number, py: number): number => ramp(markerDistance(shape, px - x, py - y, size, thick), spec.edgeSoftness);
        for (let yy = box.y; yy < box.y + box.h; yy++) {
          for (let xx = box.x; xx < box.x + box.w; xx++) {
            const a = blurred(cov, xx, yy);
            if (a <= 0) continue;
            const o = (yy * W + xx) * 3, L = lightField[yy * W + xx]!;
            for (let c = 0; c < 3; c++) lin[o + c] = lin[o + c]! * (1 - a) + col[c]! * L * a;
          }
        }
      }
    }
  }

  // --- dust specks and hairs (darkening, as scan dust on a positive), away from markers ---
  const occupied = (b: Box, pad: number): boolean =>
    markers.some((m) => b.x < m.box.x + m.box.w + pad && m.box.x < b.x + b.w + pad && b.y < m.box.y + m.box.h + pad && m.box.y < b.y + b.h + pad);
  const dust: PlateTruth["dust"] = [];
  const dustBoxes: Box[] = [];
  const freeOfFg = (b: Box): boolean => {
    for (let yy = b.y - 4; yy <= b.y + b.h + 4; yy += 2) for (let xx = b.x - 4; xx <= b.x + b.w + 4; xx += 2) if (fgAt(xx, yy) > 0.001) return false;
    return true;
  };
  for (let k = 0, tries = 0; k < spec.dust && tries < 200; tries++) {
    const r = 1.3 + 2 * rand(), x = 10 + rand() * (W - 20), y = 10 + rand() * (H - 20);
    const e = Math.ceil(r + 2);
    const box: Box = { x: Math.floor(x - e), y: Math.floor(y - e), w: 2 * e + 1, h: 2 * e + 1 };
    if (occupied(box, 12) || dustBoxes.some((d) => Math.abs(d.x - box.x) < 30 && Math.abs(d.y - box.y) < 30) || (spec.hasScreen && !freeOfFg(box))) continue;
    const opacity = 0.45 + 0.45 * rand();
    for (let yy = box.y; yy < box.y + box.h; yy++) for (let xx = box.x; xx < box.x + box.w; xx++) {
      // Dust sits on the film or sensor, not in the scene: no motion blur.
      const a = ramp(Math.hypot(xx - x, yy - y) - r, 1) * opacity;
      if (a <= 0) continue;
      const o = (yy * W + xx) * 3;
      for (let c = 0; c < 3; c++) lin[o + c] = lin[o + c]! * (1 - a);
    }
    dust.push({ x, y, box });
    dustBoxes.push(box);
    k++;
  }
  const hairs: PlateTruth["hairs"] = [];
  for (let k = 0, tries = 0; k < spec.hairs && tries < 200; tries++) {
    const len = Math.max(24, W * (0.02 + 0.03 * rand()));
    const x0 = 20 + rand() * (W - 40 - len), y0 = 20 + rand() * (H - 40 - len);
    const ang = rand() * Math.PI * 2, bend = (rand() - 0.5) * len * 0.6;
    const x2 = x0 + Math.cos(ang) * len, y2 = y0 + Math.sin(ang) * len;
    const x1 = (x0 + x2) / 2 - Math.sin(ang) * bend, y1 = (y0 + y2) / 2 + Math.cos(ang) * bend;
    const pts: [number, number][] = [];
    for (let t = 0; t <= 1.0001; t += 1 / 64) pts.push([(1 - t) ** 2 * x0 + 2 * (1 - t) * t * x1 + t * t * x2, (1 - t) ** 2 * y0 + 2 * (1 - t) * t * y1 + t * t * y2]);
    const xs = pts.map((p) => p[0]), ys = pts.map((p) => p[1]);
    const box: Box = { x: Math.floor(Math.min(...xs)) - 3, y: Math.floor(Math.min(...ys)) - 3, w: 0, h: 0 };
    box.w = Math.ceil(Math.max(...xs)) + 4 - box.x;
    box.h = Math.ceil(Math.max(...ys)) + 4 - box.y;
    if (box.x < 2 || box.y < 2 || box.x + box.w > W - 2 || box.y + box.h > H - 2) continue;
    if (occupied(box, 12) || dustBoxes.some((d) => d.x < box.x + box.w + 8 && box.x < d.x + d.w + 8 && d.y < box.y + box.h + 8 && box.y < d.y + d.h + 8)) continue;
    if (spec.hasScreen && !freeOfFg(box)) continue;
    const opacity = 0.5 + 0.35 * rand(), halfWidth = 0.55;
    for (let yy = box.y; yy < box.y + box.h; yy++) for (let xx = box.x; xx < box.x + box.w; xx++) {
      let d = Infinity;
      for (let j = 1; j < pts.length; j++) {
        const [ax, ay] = pts[j - 1]!, [bx, by] = pts[j]!;
        const vx = bx - ax, vy = by - ay;
        const t = Math.max(0, Math.min(1, ((xx - ax) * vx + (yy - ay) * vy) / (vx * vx + vy * vy)));
        d = Math.min(d, Math.hypot(xx - ax - t * vx, yy - ay - t * vy));
      }
      const a = ramp(d - halfWidth, 1) * opacity;
      if (a <= 0) continue;
      const o = (yy * W + xx) * 3;
      for (let c = 0; c < 3; c++) lin[o + c] = lin[o + c]! * (1 - a);
    }
    hairs.push({ box });
    dustBoxes.push(box);
    k++;
  }

  // --- foreground over everything ---
  if (shapes.length) {
    // Only pixels within the blur's and the edge ramp's reach of an edge need the blurred coverage.
    const edgeReach = (blur ? blur.length / 2 : 0) + spec.edgeSoftness + 1;
    for (let y = 0, i = 0; y < H; y++) {
      for (let x = 0; x < W; x++, i++) {
        let colour: Rgb = shapes[0]!.colour;
        let best = Infinity;
        for (const s of shapes) {
          const d = shapeDistance(s.shape, x, y);
          if (d < best) { best = d; colour = s.colour; }
        }
        const a = best > edgeReach ? 0 : best < -edgeReach ? 1 : blurred(fgAt, x, y);
        fgAlpha[i] = a;
        if (a <= 0) continue;
        const o = i * 3;
        const L = spec.hasScreen ? lightField[i]! : 1;
        for (let c = 0; c < 3; c++) lin[o + c] = lin[o + c]! * (1 - a) + colour[c]! * L * a;
      }
    }
  }

  // --- encode, grain, quantise ---
  const max = spec.bits === 16 ? 65535 : 255;
  const codes = spec.bits === 16 ? new Uint16Array(n * 3) : new Uint8Array(n * 3);
  const linearOut = spec.encoding === "linear" ? new Float32Array(n * 3) : null;
  if (linearOut) for (let i = 0; i < n * 3; i++) linearOut[i] = lin[i]! + gauss() * spec.grain;
  else for (let i = 0; i < n * 3; i++) codes[i] = Math.round(clamp01(srgbEncode(clamp01(lin[i]!)) + gauss() * spec.grain) * max);
  // Planting a defect: full scale and zero in codes; in linear floats a hot photosite well above 1.
  const HOT_LINEAR = 4;
  const plant = (o: number, high: boolean): void => {
    if (linearOut) linearOut[o] = high ? HOT_LINEAR : 0;
    else codes[o] = high ? max : 0;
  };
  const storedCode = (o: number): number => (linearOut ? clamp01(srgbEncode(clamp01(linearOut[o]!))) : codes[o]! / max);

  // --- sensor defects, planted in the stored codes, isolated and off the markers and dust ---
  const defects: TruthDefect[] = [];
  const taken = new Set<number>();
  for (let k = 0, tries = 0; k < spec.deadHotStuck && tries < 2000; tries++) {
    const x = 3 + Math.floor(rand() * (W - 6)), y = 3 + Math.floor(rand() * (H - 6));
    const box = { x: x - 1, y: y - 1, w: 3, h: 3 };
    if (occupied(box, 4) || dustBoxes.some((d) => x >= d.x - 3 && x < d.x + d.w + 3 && y >= d.y - 3 && y < d.y + d.h + 3)) continue;
    // Not on or beside a soft edge: there a stuck pixel cannot be told from the edge in one frame.
    let onEdge = false;
    for (let yy = y - 2; yy <= y + 2; yy++) for (let xx = x - 2; xx <= x + 2; xx++) if (fgAlpha[yy * W + xx]! > 0 && fgAlpha[yy * W + xx]! < 1) onEdge = true;
    if (onEdge) continue;
    let near = false;
    for (const t of taken) if (Math.abs((t % W) - x) < 4 && Math.abs(Math.floor(t / W) - y) < 4) near = true;
    if (near) continue;
    const o = (y * W + x) * 3;
    const roll = rand();
    let kind: TruthDefect["kind"], channels: TruthDefect["channels"];
    // In linear floats a dead pixel on a dark area is no step at all (0.02 → 0 is lost in the grain):
    // as for stuck channels below, one is planted only where it steps at least a quarter of the display scale.
    if (linearOut && roll >= 0.35 && roll < 0.6 && Math.min(storedCode(o), storedCode(o + 1), storedCode(o + 2)) < 0.25) continue;
    if (roll < 0.35) {
      kind = "hot";
      channels = ["r", "g", "b"];
      for (let c = 0; c < 3; c++) plant(o + c, true);
    } else if (roll < 0.6) {
      kind = "dead";
      channels = ["r", "g", "b"];
      for (let c = 0; c < 3; c++) plant(o + c, false);
    } else {
      kind = "stuck";
      // One channel stuck on or off: the one where that makes the larger step from its value.
      const c = Math.floor(rand() * 3);
      const v = storedCode(o + c);
      if (Math.max(v, 1 - v) < 0.25) continue;
      plant(o + c, v < 0.5);
      channels = [(["r", "g", "b"] as const)[c]!];
    }
    defects.push({ x, y, kind, channels });
    taken.add(y * W + x);
    k++;
  }

  // --- truth for the screen: hue of its colour, mean lit colour, coverage, unevenness ---
  let screenTruth: PlateTruth["screen"] = null;
  if (spec.hasScreen) {
    const sum: Rgb = [0, 0, 0];
    const Ls: number[] = [];
    let count = 0;
    for (let i = 0; i < n; i++) {
      if (fgAlpha[i]! >= 0.5) continue;
      count++;
      const L = lightField[i]!;
      sum[0] += screen[0] * L; sum[1] += screen[1] * L; sum[2] += screen[2] * L;
      if (i % 7 === 0) Ls.push(L);
    }
    Ls.sort((a, b) => a - b);
    const q = (p: number): number => Ls[Math.min(Ls.length - 1, Math.floor(p * (Ls.length - 1)))]!;
    screenTruth = {
      hue: hueOf(screen),
      colour: screen,
      meanLinear: sum.map((v) => v / Math.max(1, count)) as Rgb,
      coverage: count / n,
      unevenness: ((q(0.95) - q(0.05)) / q(0.5)) * 100,
    };
  }

  const truth: PlateTruth = {
    screen: screenTruth,
    markers,
    shades,
    defects,
    dust,
    hairs,
    noiseSigma: spec.grain,
    noiseSigmaCodes: spec.grain * max,
  };
  return {
    spec,
    width: W,
    height: H,
    bits: spec.bits,
    codes,
    truth,
    linear: linearOut,
    png: () =>
      spec.bits === 16
        ? sharp(codes as Uint16Array, { raw: { width: W, height: H, channels: 3 } }).toColourspace("rgb16").png({ compressionLevel: 1 }).toBuffer()
        : sharp(Buffer.from(codes.buffer, codes.byteOffset, codes.byteLength), { raw: { width: W, height: H, channels: 3 } }).png({ compressionLevel: 1 }).toBuffer(),
  };
}
