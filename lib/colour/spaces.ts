/*
 * Colour spaces a still can be declared in, and the 3×3 matrices between the linear ones.
 * Client-safe and pure.
 *
 * Each linear space is fixed by its primaries and white point (CIE 1931 xy):
 *   - linear sRGB / Rec.709: ITU-R BT.709-6 item 1.3–1.4 (the primaries IEC 61966-2-1 uses), D65;
 *   - ACEScg: AP1 primaries, ACES white, Academy S-2014-004 §4.1;
 *   - ACES2065-1: AP0 primaries, ACES white, SMPTE ST 2065-1 §4.1.
 * RGB → XYZ is the normalised primary matrix of SMPTE RP 177:1993 §3.3. Between different white
 * points (D65 and the ACES white, ≈ D60) colours are adapted with the linearised Bradford
 * transform (ICC.1:2010 Annex E.3), as the ACES reference output transforms adapt D60 → D65:
 * the white of one space lands exactly on the white of the other.
 */

export const COLOUR_SPACES = ["srgb", "lin-rec709", "acescg", "aces2065-1", "data"] as const;
export type ColourSpace = (typeof COLOUR_SPACES)[number];
export const LINEAR_SPACES = ["lin-rec709", "acescg", "aces2065-1"] as const;
export type LinearSpace = (typeof LINEAR_SPACES)[number];

export const COLOUR_SPACE_LABELS: Record<ColourSpace, string> = {
  srgb: "sRGB-encoded",
  "lin-rec709": "Linear, sRGB/Rec.709 primaries",
  acescg: "ACEScg (linear, AP1)",
  "aces2065-1": "ACES2065-1 (linear, AP0)",
  data: "Stored values (not colour)",
};

/** Short names for tight places (the pixel probe, captions). */
export const COLOUR_SPACE_SHORT: Record<ColourSpace, string> = {
  srgb: "sRGB",
  "lin-rec709": "lin. Rec.709",
  acescg: "ACEScg",
  "aces2065-1": "ACES2065-1",
  data: "stored values",
};

export function isLinearSpace(space: string): space is LinearSpace {
  return (LINEAR_SPACES as readonly string[]).includes(space);
}

/** The linear space a still's values reach after decoding (sRGB-encoded stills decode to linear Rec.709). */
export function linearOf(space: ColourSpace): LinearSpace | null {
  return space === "srgb" ? "lin-rec709" : space === "data" ? null : space;
}

export type Xy = readonly [number, number];
export type Primaries = { red: Xy; green: Xy; blue: Xy; white: Xy };

export const D65: Xy = [0.3127, 0.329];
export const ACES_WHITE: Xy = [0.32168, 0.33767];

export const PRIMARIES: Record<LinearSpace, Primaries> = {
  "lin-rec709": { red: [0.64, 0.33], green: [0.3, 0.6], blue: [0.15, 0.06], white: D65 },
  acescg: { red: [0.713, 0.293], green: [0.165, 0.83], blue: [0.128, 0.044], white: ACES_WHITE },
  "aces2065-1": { red: [0.7347, 0.2653], green: [0.0, 1.0], blue: [0.0001, -0.077], white: ACES_WHITE },
};

export type Mat3 = [[number, number, number], [number, number, number], [number, number, number]];
export type Vec3 = [number, number, number];

export const IDENTITY: Mat3 = [
  [1, 0, 0],
  [0, 1, 0],
  [0, 0, 1],
];

export function mul(a: Mat3, b: Mat3): Mat3 {
  const out: Mat3 = [
    [0, 0, 0],
    [0, 0, 0],
    [0, 0, 0],
  ];
  for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) out[i]![j] = a[i]![0] * b[0][j]! + a[i]![1] * b[1][j]! + a[i]![2] * b[2][j]!;
  return out;
}

export function apply(m: Mat3, v: Vec3): Vec3 {
  return [0, 1, 2].map((i) => m[i]![0] * v[0] + m[i]![1] * v[1] + m[i]![2] * v[2]) as Vec3;
}

export function invert(m: Mat3): Mat3 {
  const [[a, b, c], [d, e, f], [g, h, i]] = m;
  const A = e * i - f * h, B = -(d * i - f * g), C = d * h - e * g;
  const det = a * A + b * B + c * C;
  if (det === 0) throw new Error("singular matrix");
  return [
    [A / det, -(b * i - c * h) / det, (b * f - c * e) / det],
    [B / det, (a * i - c * g) / det, -(a * f - c * d) / det],
    [C / det, -(a * h - b * g) / det, (a * e - b * d) / det],
  ];
}

/** XYZ of a white point with Y = 1. */
export function whiteXyz([x, y]: Xy): Vec3 {
  return [x / y, 1, (1 - x - y) / y];
}

/** SMPTE RP 177:1993 §3.3: normalised primary matrix, RGB → XYZ with white (1,1,1) → Y = 1. */
export function rgbToXyz(p: Primaries): Mat3 {
  const P: Mat3 = [
    [p.red[0], p.green[0], p.blue[0]],
    [p.red[1], p.green[1], p.blue[1]],
    [1 - p.red[0] - p.red[1], 1 - p.green[0] - p.green[1], 1 - p.blue[0] - p.blue[1]],
  ];
  const c = apply(invert(P), whiteXyz(p.white));
  return P.map((row) => [row[0] * c[0], row[1] * c[1], row[2] * c[2]]) as Mat3;
}

/** Cone response matrix of the linearised Bradford transform, ICC.1:2010 Annex E.3 (eq. E.5). */
export const BRADFORD: Mat3 = [
  [0.8951, 0.2664, -0.1614],
  [-0.7502, 1.7135, 0.0367],
  [0.0389, -0.0685, 1.0296],
];

/** XYZ under `from` white → XYZ under `to` white (von Kries scaling in Bradford cone space). */
export function bradford(from: Xy, to: Xy): Mat3 {
  if (from[0] === to[0] && from[1] === to[1]) return IDENTITY;
  const s = apply(BRADFORD, whiteXyz(from));
  const d = apply(BRADFORD, whiteXyz(to));
  const scale: Mat3 = [
    [d[0] / s[0], 0, 0],
    [0, d[1] / s[1], 0],
    [0, 0, d[2] / s[2]],
  ];
  return mul(invert(BRADFORD), mul(scale, BRADFORD));
}

/** Linear RGB in `from` → linear RGB in `to` (float64). */
export function conversionMatrix(from: LinearSpace, to: LinearSpace): Mat3 {
  if (from === to) return IDENTITY;
  const a = PRIMARIES[from], b = PRIMARIES[to];
  return mul(invert(rgbToXyz(b)), mul(bradford(a.white, b.white), rgbToXyz(a)));
}

/**
 * The declared space an OpenEXR file's `chromaticities` attribute names, if it is one of ours
 * (within 0.0005 per coordinate: the attribute is float32). Without the attribute the OpenEXR
 * documentation says to assume Rec.709 primaries and a D65 white.
 */
export function spaceOfChromaticities(c: { red: Xy; green: Xy; blue: Xy; white: Xy } | null): LinearSpace | null {
  if (!c) return "lin-rec709";
  const close = (a: Xy, b: Xy) => Math.abs(a[0] - b[0]) < 5e-4 && Math.abs(a[1] - b[1]) < 5e-4;
  for (const space of LINEAR_SPACES) {
    const p = PRIMARIES[space];
    if (close(c.red, p.red) && close(c.green, p.green) && close(c.blue, p.blue) && close(c.white, p.white)) return space;
  }
  return null;
}
