import { linearToSrgb, srgbToLinear, type PlateFrame } from "@/lib/plate-check/image";

/*
 * Stored integer codes → the check's two views of a frame. Pure. sRGB-encoded stills decode
 * through exact tables (IEC 61966-2-1); the code view is the code ÷ its maximum.
 */

const tables = new Map<number, Float32Array>();

function linearTable(bits: 8 | 16): Float32Array {
  let t = tables.get(bits);
  if (!t) {
    const max = bits === 8 ? 255 : 65535;
    t = new Float32Array(max + 1);
    for (let k = 0; k <= max; k++) t[k] = srgbToLinear(k / max);
    tables.set(bits, t);
  }
  return t;
}

/** A frame from interleaved RGB codes of an sRGB-encoded still. */
export function frameFromCodes(codes: Uint8Array | Uint16Array, width: number, height: number, bits: 8 | 16): PlateFrame {
  const max = bits === 8 ? 255 : 65535;
  const lut = linearTable(bits);
  const n3 = width * height * 3;
  const linear = new Float32Array(n3), code = new Float32Array(n3);
  const inv = 1 / max;
  for (let i = 0; i < n3; i++) {
    const k = codes[i]!;
    linear[i] = lut[k]!;
    code[i] = k * inv;
  }
  return { width, height, linear, code, codeMax: max, hasCodeCeiling: true, colourSpace: "srgb" };
}

export type LinearFrameOptions = {
  /** How the stored values encode light: "linear" (they are the linear values) or "srgb" (a float still declared sRGB-encoded). */
  transfer: "linear" | "srgb";
  /** Stored integer depth (8/16) when the still holds integer codes; absent for float stills. */
  bits?: 8 | 16;
};

/**
 * A frame from linear floats in the still's own linear space (lib/stills/values.ts). The code view
 * is the stored values again: for a still in a linear space they are the linear values themselves
 * (÷ the maximum for integer codes, which those already are); for a float still declared
 * sRGB-encoded, the values re-encoded with IEC 61966-2-1 (extended by symmetry, never clipped).
 */
export function frameFromLinear(linear: Float32Array, width: number, height: number, options: LinearFrameOptions = { transfer: "linear" }): PlateFrame {
  const code = new Float32Array(linear.length);
  if (options.transfer === "srgb") for (let i = 0; i < linear.length; i++) code[i] = linearToSrgb(linear[i]!);
  else code.set(linear);
  const codeMax = options.bits === 8 ? 255 : options.bits === 16 ? 65535 : 1;
  return { width, height, linear, code, codeMax, hasCodeCeiling: options.bits !== undefined, colourSpace: options.transfer };
}

/**
 * The smallest noise figure a frame can hold: uniform quantisation of the stored step, step/√12.
 * Float stills have no fixed step; half floats (the usual OpenEXR sample) step by 2⁻¹¹ of the
 * value just below 1, which stands in for it (own allowance: a floor for thresholds only).
 */
export function quantisationFloor(frame: Pick<PlateFrame, "codeMax" | "hasCodeCeiling">): number {
  return frame.hasCodeCeiling ? 1 / (frame.codeMax * Math.sqrt(12)) : 2 ** -11 / Math.sqrt(12);
}
