import { srgbToLinear, type PlateFrame } from "@/lib/plate-check/image";

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

/** A frame from scene-linear floats (e.g. an OpenEXR still): the code view is the linear values. */
export function frameFromLinear(linear: Float32Array, width: number, height: number): PlateFrame {
  return { width, height, linear, code: new Float32Array(linear), codeMax: 1, hasCodeCeiling: false, colourSpace: "linear" };
}
