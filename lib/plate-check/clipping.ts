import type { Defect } from "@/lib/plate-check/defects";

/*
 * Clipped and crushed pixels per channel. Pure. Integer stills have a hard ceiling and floor:
 * a stored code at the maximum (or at 0) may stand for any brighter (darker) value. Float stills
 * have no ceiling; for them "clipped" counts values at or above 1.0 and "crushed" values at or
 * below 0, which says where display would clip, not that data was lost. Defect pixels are left
 * out (a hot pixel at full scale is a defect, not clipping).
 */

export type ClipCounts = {
  clipped: [number, number, number];
  crushed: [number, number, number];
  /** Pixels with any channel clipped / crushed. */
  clippedAny: number;
  crushedAny: number;
  total: number;
  /** Coarse map (cells of `cell` px): share of pixels with any clipped (first plane) or crushed (second) channel, 0..255. */
  grid: { width: number; height: number; cell: number; clipped: Uint8Array; crushed: Uint8Array };
};

export function countClipping(code: Float32Array, width: number, height: number, defects: readonly Defect[], maxGrid = 256): ClipCounts {
  const skip = new Set(defects.map((d) => d.y * width + d.x));
  const cell = Math.max(1, Math.ceil(Math.max(width, height) / maxGrid));
  const gw = Math.ceil(width / cell), gh = Math.ceil(height / cell);
  const clipCells = new Uint32Array(gw * gh), crushCells = new Uint32Array(gw * gh), cellCount = new Uint32Array(gw * gh);
  const clipped: [number, number, number] = [0, 0, 0], crushed: [number, number, number] = [0, 0, 0];
  let clippedAny = 0, crushedAny = 0;
  for (let y = 0, p = 0; y < height; y++) {
    const gy = (y / cell) | 0;
    for (let x = 0; x < width; x++, p++) {
      const g = gy * gw + ((x / cell) | 0);
      cellCount[g]!++;
      const i = p * 3;
      const r = code[i]!, gr = code[i + 1]!, b = code[i + 2]!;
      if (r < 1 && gr < 1 && b < 1 && r > 0 && gr > 0 && b > 0) continue;
      if (skip.size && skip.has(p)) continue;
      let hi = false, lo = false;
      if (r >= 1) { clipped[0]++; hi = true; } else if (r <= 0) { crushed[0]++; lo = true; }
      if (gr >= 1) { clipped[1]++; hi = true; } else if (gr <= 0) { crushed[1]++; lo = true; }
      if (b >= 1) { clipped[2]++; hi = true; } else if (b <= 0) { crushed[2]++; lo = true; }
      if (hi) { clippedAny++; clipCells[g]!++; }
      if (lo) { crushedAny++; crushCells[g]!++; }
    }
  }
  const toBytes = (cells: Uint32Array): Uint8Array => {
    const out = new Uint8Array(cells.length);
    for (let i = 0; i < cells.length; i++) out[i] = cells[i] ? Math.max(1, Math.round((255 * cells[i]!) / cellCount[i]!)) : 0;
    return out;
  };
  return {
    clipped,
    crushed,
    clippedAny,
    crushedAny,
    total: width * height,
    grid: { width: gw, height: gh, cell, clipped: toBytes(clipCells), crushed: toBytes(crushCells) },
  };
}
