/**
 * Luma weights of ITU-R BT.709-6 (06/2015), Part 2, item 3.2 "Derivation of luminance
 * signal": E'Y = 0.2126 E'R + 0.7152 E'G + 0.0722 E'B. The single source for every
 * luminance view in Plateroom. The recommendation applies them to the encoded (gamma)
 * signals, so views apply them to stored values, not to linear light.
 */
export const BT709_LUMA = Object.freeze({ r: 0.2126, g: 0.7152, b: 0.0722 });

export const CHANNEL_VIEWS = ["rgb", "r", "g", "b", "luma"] as const;
export type ChannelView = (typeof CHANNEL_VIEWS)[number];

export const CHANNEL_VIEW_LABELS: Record<ChannelView, string> = {
  rgb: "RGB",
  r: "Red",
  g: "Green",
  b: "Blue",
  luma: "Luminance (BT.709)",
};

/** Y' of one pixel from encoded R'G'B' (any consistent scale). */
export function luminance(r: number, g: number, b: number): number {
  return BT709_LUMA.r * r + BT709_LUMA.g * g + BT709_LUMA.b * b;
}

/**
 * The 4×5 row-major matrix for an SVG `feColorMatrix type="matrix"` showing one view as
 * grey: every output colour row is the same weights, alpha passes through. Use it with
 * `color-interpolation-filters="sRGB"` so it works on stored values (the SVG default,
 * linearRGB, would convert first).
 */
export function channelViewMatrix(view: ChannelView): number[] {
  const w: [number, number, number] =
    view === "r" ? [1, 0, 0] : view === "g" ? [0, 1, 0] : view === "b" ? [0, 0, 1] : view === "luma" ? [BT709_LUMA.r, BT709_LUMA.g, BT709_LUMA.b] : [1, 0, 0];
  if (view === "rgb") return [1, 0, 0, 0, 0, 0, 1, 0, 0, 0, 0, 0, 1, 0, 0, 0, 0, 0, 1, 0];
  const row = [w[0], w[1], w[2], 0, 0];
  return [...row, ...row, ...row, 0, 0, 0, 1, 0];
}

/** Applies a 4×5 colour matrix to one RGBA pixel (0..1), as feColorMatrix does; for tests and the probe. */
export function applyColourMatrix(m: readonly number[], rgba: readonly [number, number, number, number]): [number, number, number, number] {
  const out: [number, number, number, number] = [0, 0, 0, 0];
  for (let i = 0; i < 4; i++) {
    let v = m[i * 5 + 4] ?? 0;
    for (let j = 0; j < 4; j++) v += (m[i * 5 + j] ?? 0) * rgba[j]!;
    out[i] = Math.min(1, Math.max(0, v));
  }
  return out;
}
