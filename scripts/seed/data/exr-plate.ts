import "server-only";
import { encodeExr } from "@/lib/exr/encode";
import { PRIMARIES } from "@/lib/colour/spaces";
import { mulberry32 } from "@/lib/random";

/*
 * The demo's OpenEXR pair: an invented dusk sky plate in scene-linear ACEScg, half float,
 * with a bright practical lamp (values far above 1), a safety wire sagging across the frame
 * (the "before"), and the same frame without the wire (the "after"). Grain is the same noise
 * field in both, so the pair differs only along the wire; in the darkest corner the grain
 * dips below 0, as denoised-and-regrained linear plates do. Nothing is taken from anywhere.
 */

export type ExrPlatePair = { width: number; height: number; before: Uint8Array; after: Uint8Array };

const SKY_TOP = [0.018, 0.03, 0.085];
const SKY_HORIZON = [0.42, 0.3, 0.2];
const LAMP = { x: 0.74, y: 0.62, radius: 0.012, peak: [14, 11.5, 7.5] };
const WIRE = [0.012, 0.011, 0.01];

export async function generateExrPlatePair(width = 1280, height = 720, seed = 11): Promise<ExrPlatePair> {
  const { before, after } = exrPlateFloats(width, height, seed);
  const p = PRIMARIES.acescg;
  const chromaticities = { red: [...p.red] as [number, number], green: [...p.green] as [number, number], blue: [...p.blue] as [number, number], white: [...p.white] as [number, number] };
  const output = { pixelType: "half", compression: "zip" } as const;
  return {
    width,
    height,
    before: await encodeExr(before, width, height, output, chromaticities),
    after: await encodeExr(after, width, height, output, chromaticities),
  };
}

/** The pair's linear samples (interleaved RGB, top row first), before encoding. */
export function exrPlateFloats(width: number, height: number, seed = 11): { before: Float32Array; after: Float32Array } {
  const random = mulberry32(seed);
  const gauss = () => Math.sqrt(-2 * Math.log(1 - random())) * Math.cos(2 * Math.PI * random());
  const n = width * height;
  const clean = new Float32Array(n * 3);
  const wireCover = new Float32Array(n);
  // A catenary-like sag from the upper left to the right edge, about 2 px wide.
  const wireY = (x: number) => height * (0.18 + 0.55 * (x / width) - 0.35 * (x / width) ** 2);
  for (let y = 0; y < height; y++) {
    const t = y / (height - 1);
    for (let x = 0; x < width; x++) {
      const i = (y * width + x) * 3;
      const dx = (x / width - LAMP.x) * (width / height), dy = y / height - LAMP.y;
      const d = Math.hypot(dx, dy);
      const core = d < LAMP.radius ? 1 : 0;
      const glow = 0.35 / (1 + (d / 0.03) ** 2);
      const vignette = 1 - 0.45 * ((x / width - 0.5) ** 2 + (t - 0.5) ** 2);
      for (let c = 0; c < 3; c++) {
        const sky = (SKY_TOP[c]! + (SKY_HORIZON[c]! - SKY_TOP[c]!) * t ** 1.6) * vignette;
        clean[i + c] = sky + core * LAMP.peak[c]! + glow * LAMP.peak[c]! * 0.08;
      }
      wireCover[y * width + x] = Math.max(0, Math.min(1, 1.1 - Math.abs(y - wireY(x))));
    }
  }
  const before = new Float32Array(n * 3);
  const after = new Float32Array(n * 3);
  for (let p = 0; p < n; p++) {
    const cover = wireCover[p]!;
    for (let c = 0; c < 3; c++) {
      const i = p * 3 + c;
      // Grain grows with the square root of the signal, with a floor that reaches below 0 in the dark.
      const grain = gauss() * (0.004 + 0.02 * Math.sqrt(Math.max(0, clean[i]!)));
      after[i] = clean[i]! + grain;
      before[i] = clean[i]! * (1 - cover) + WIRE[c]! * cover + grain;
    }
  }
  return { before, after };
}
