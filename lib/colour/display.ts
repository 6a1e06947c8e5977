import { conversionMatrix, linearOf, type ColourSpace } from "@/lib/colour/spaces";

/*
 * The display transform for previews, thumbnails and the full-size view: scale by an
 * exposure in stops, convert the still's linear space to linear Rec.709 (lib/colour/spaces.ts),
 * clip to 0..1 and encode with the sRGB transfer function (IEC 61966-2-1) into 8-bit codes.
 * Only this transform clips; the stored values never are. The "range" view paints values
 * above 1 and below 0 (after exposure, in the still's own space) in flat colours over a muted
 * grey image, so out-of-range areas show at a glance. Client-safe and pure.
 */

export const DISPLAY_VIEWS = ["image", "range"] as const;
export type DisplayView = (typeof DISPLAY_VIEWS)[number];
export const EXPOSURE_LIMIT = 16;

export type DisplayOptions = { exposure: number; view: DisplayView };
export const DEFAULT_DISPLAY: DisplayOptions = { exposure: 0, view: "image" };

/** Colours of the range view (our own choice): above 1, below 0, both in one pixel. */
export const RANGE_COLOURS = {
  above: [255, 112, 24],
  below: [40, 120, 255],
  both: [214, 48, 214],
} as const;

let encodeTable: Uint8Array | null = null;

/** 8-bit sRGB code of a clipped linear value, by a 65 536-step table (within 0.05 of a code of the formula). */
function srgbCodes(): Uint8Array {
  if (!encodeTable) {
    encodeTable = new Uint8Array(65536);
    for (let i = 0; i < 65536; i++) {
      const l = i / 65535;
      const v = l <= 0.0031308 ? l * 12.92 : 1.055 * l ** (1 / 2.4) - 0.055;
      encodeTable[i] = Math.round(v * 255);
    }
  }
  return encodeTable;
}

/**
 * 8-bit RGB display codes of `pixels` samples of `channels` (1, 3 or 4; alpha is not shown)
 * holding values in `space`: linear light for the colour spaces (an sRGB-encoded still's
 * values already decoded), stored values scaled to 0..1 for "data".
 */
export function displayCodes(src: Float32Array, channels: number, pixels: number, space: ColourSpace, options: DisplayOptions): Uint8Array {
  const out = new Uint8Array(pixels * 3);
  const gain = 2 ** Math.max(-EXPOSURE_LIMIT, Math.min(EXPOSURE_LIMIT, options.exposure));
  const linear = linearOf(space);
  const m = linear ? conversionMatrix(linear, "lin-rec709") : null;
  const identity = !m || (m[0][0] === 1 && m[1][1] === 1 && m[2][2] === 1 && m[0][1] === 0 && m[0][2] === 0 && m[1][0] === 0 && m[1][2] === 0 && m[2][0] === 0 && m[2][1] === 0);
  const table = srgbCodes();
  const encoded = linear !== null;
  const code = (v: number): number => {
    const c = v <= 0 ? 0 : v >= 1 ? 1 : v;
    return encoded ? table[Math.round(c * 65535)]! : Math.round(c * 255);
  };
  const range = options.view === "range";
  for (let p = 0, i = 0, o = 0; p < pixels; p++, i += channels, o += 3) {
    let r = src[i]! * gain, g = r, b = r;
    if (channels >= 3) {
      g = src[i + 1]! * gain;
      b = src[i + 2]! * gain;
    }
    const over = r > 1 || g > 1 || b > 1;
    const under = r < 0 || g < 0 || b < 0;
    if (!identity) {
      const r2 = m[0][0] * r + m[0][1] * g + m[0][2] * b;
      const g2 = m[1][0] * r + m[1][1] * g + m[1][2] * b;
      b = m[2][0] * r + m[2][1] * g + m[2][2] * b;
      r = r2;
      g = g2;
    }
    if (range && (over || under)) {
      const c = over && under ? RANGE_COLOURS.both : over ? RANGE_COLOURS.above : RANGE_COLOURS.below;
      out[o] = c[0];
      out[o + 1] = c[1];
      out[o + 2] = c[2];
      continue;
    }
    const cr = code(r), cg = code(g), cb = code(b);
    if (range) {
      // In-range pixels as a muted grey (BT.709 luma weights on the display codes), so the flat colours stand out.
      const grey = Math.round(40 + 0.6 * (0.2126 * cr + 0.7152 * cg + 0.0722 * cb));
      out[o] = out[o + 1] = out[o + 2] = grey;
    } else {
      out[o] = cr;
      out[o + 1] = cg;
      out[o + 2] = cb;
    }
  }
  return out;
}

/** Query-string form of display options, for image URLs (default options add nothing). */
export function displayQuery(options: DisplayOptions): string {
  const params = new URLSearchParams();
  if (options.exposure !== 0) params.set("exposure", String(Math.round(options.exposure * 100) / 100));
  if (options.view !== "image") params.set("view", options.view);
  const s = params.toString();
  return s ? `?${s}` : "";
}
