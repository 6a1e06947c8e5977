import { linearToSrgb, type Box } from "@/lib/plate-check/image";
import { laplacianAbsSums } from "@/lib/plate-check/noise";
import type { ChannelName, Findings } from "@/lib/plate-check/schemas";

/*
 * What a tried recipe did to the frame, measured on the proxy render against the plate at the
 * same size (both linear light, RGB interleaved). Pure.
 *
 * - Marker contrast: per detected marker, |mean of its core − mean of the ring of screen around
 *   it| in the target channel; the core is where the plate departs from that ring by more than
 *   half the marker's largest departure (the same pixels before and after). Mean over markers.
 * - Noise gain: Immerkær σ (lib/plate-check/noise.ts) of the target channel after ÷ before, over
 *   the marker matte (where a marker cleanup works); over the whole frame when there are none.
 * - Changed outside the matte: share of pixels outside the markers' boxes (grown by two proxy
 *   pixels) whose display value moved by more than one 8-bit sRGB code in any channel.
 */

/**
 * sRGB encode (IEC 61966-2-1) tabulated at 2¹⁶ steps of linear light: the nearest entry is within
 * 2·10⁻⁴ of the encoded value everywhere (the curve is steepest at 0, slope 12.92), far below the
 * one-code-in-255 a "visible change" asks for.
 */
const ENCODE_STEPS = 65535;
let encodeLut: Float32Array | null = null;
function encodeTable(): Float32Array {
  if (!encodeLut) {
    encodeLut = new Float32Array(ENCODE_STEPS + 1);
    for (let k = 0; k <= ENCODE_STEPS; k++) encodeLut[k] = linearToSrgb(k / ENCODE_STEPS);
  }
  return encodeLut;
}

export type FloatFrame = { width: number; height: number; data: Float32Array };

export type Measures = {
  markerContrast: { before: number; after: number } | null;
  noiseGain: number | null;
  changedOutsideMatte: number;
};

const CH: Record<ChannelName, number> = { r: 0, g: 1, b: 2 };

function scaled(b: Box, k: number, grow: number, w: number, h: number): Box {
  const x0 = Math.max(0, Math.floor(b.x * k) - grow), y0 = Math.max(0, Math.floor(b.y * k) - grow);
  const x1 = Math.min(w, Math.ceil((b.x + b.w) * k) + grow), y1 = Math.min(h, Math.ceil((b.y + b.h) * k) + grow);
  return { x: x0, y: y0, w: Math.max(0, x1 - x0), h: Math.max(0, y1 - y0) };
}

export function measureTry(before: FloatFrame, after: FloatFrame, findings: Findings, channel: ChannelName): Measures {
  const { width: W, height: H } = before;
  if (after.width !== W || after.height !== H) throw new Error("before and after differ in size");
  const k = W / findings.width;
  const c = CH[channel];
  const matte = new Uint8Array(W * H);
  const boxes = findings.markers.items.map((m) => scaled(m.box, k, 2, W, H));
  for (const b of boxes) for (let y = b.y; y < b.y + b.h; y++) matte.fill(1, y * W + b.x, y * W + b.x + b.w);

  let contrast: Measures["markerContrast"] = null;
  if (boxes.length) {
    let sumBefore = 0, sumAfter = 0, used = 0;
    for (const b of boxes) {
      const ring = scaled({ x: b.x, y: b.y, w: b.w, h: b.h }, 1, Math.max(2, Math.round(0.3 * Math.max(b.w, b.h))), W, H);
      let rb = 0, ra = 0, rn = 0;
      for (let y = ring.y; y < ring.y + ring.h; y++) {
        for (let x = ring.x; x < ring.x + ring.w; x++) {
          if (matte[y * W + x]) continue;
          const i = (y * W + x) * 3 + c;
          rb += before.data[i]!; ra += after.data[i]!; rn++;
        }
      }
      if (!rn) continue;
      rb /= rn; ra /= rn;
      let peak = 0;
      for (let y = b.y; y < b.y + b.h; y++) for (let x = b.x; x < b.x + b.w; x++) peak = Math.max(peak, Math.abs(before.data[(y * W + x) * 3 + c]! - rb));
      let cb = 0, ca = 0, cn = 0;
      for (let y = b.y; y < b.y + b.h; y++) {
        for (let x = b.x; x < b.x + b.w; x++) {
          const i = (y * W + x) * 3 + c;
          if (Math.abs(before.data[i]! - rb) < 0.5 * peak) continue;
          cb += before.data[i]!; ca += after.data[i]!; cn++;
        }
      }
      if (!cn) continue;
      sumBefore += Math.abs(cb / cn - rb);
      sumAfter += Math.abs(ca / cn - ra);
      used++;
    }
    if (used) contrast = { before: sumBefore / used, after: sumAfter / used };
  }

  const region = boxes.length ? matte : undefined;
  const nb = laplacianAbsSums(before.data, W, H, 3, [c], region), na = laplacianAbsSums(after.data, W, H, 3, [c], region);
  const noiseGain = nb.count && nb.sums[0]! > 0 ? na.sums[0]! / nb.sums[0]! : null;

  let outside = 0, changed = 0;
  const step = 1 / 255;
  const enc = encodeTable();
  const at = (v: number): number => enc[v <= 0 ? 0 : v >= 1 ? ENCODE_STEPS : Math.round(v * ENCODE_STEPS)]!;
  for (let p = 0; p < W * H; p++) {
    if (matte[p]) continue;
    outside++;
    const i = p * 3;
    for (let j = 0; j < 3; j++) {
      const a = before.data[i + j]!, b = after.data[i + j]!;
      if (a === b) continue;
      if (Math.abs(at(b) - at(a)) > step) {
        changed++;
        break;
      }
    }
  }
  return { markerContrast: contrast, noiseGain, changedOutsideMatte: outside ? changed / outside : 0 };
}
