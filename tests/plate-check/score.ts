import { hueDelta } from "@/lib/plate-check/image";
import type { Findings } from "@/lib/plate-check/schemas";
import type { PlateTruth } from "@/tests/plate-check/synthetic-plates";

/*
 * Findings against a generated plate's truth (test-only). Markers match one-to-one when a found
 * centre lies within the truth marker's box, nearest first; defects match on the exact pixel.
 */

export type Score = {
  markers: { truth: number; found: number; matched: number };
  shades: { truth: number; found: number; /** Matched markers whose found shade is the one most of their truth shade got. */ consistent: number };
  defects: { truth: number; found: number; matched: number; kindMatched: number };
  dust: { truth: number; found: number; matched: number };
  hairs: { truth: number; found: number; matched: number };
  hueError: number | null;
  coverageError: number | null;
  unevennessError: number | null;
  noiseRelError: [number, number, number];
  screenPresent: { truth: boolean; found: boolean };
};

const inside = (x: number, y: number, b: { x: number; y: number; w: number; h: number }, pad = 0): boolean =>
  x >= b.x - pad && x < b.x + b.w + pad && y >= b.y - pad && y < b.y + b.h + pad;

export function scoreFindings(f: Findings, truth: PlateTruth): Score {
  // Markers: nearest-first one-to-one matching.
  const pairs: { t: number; d: number; dist: number }[] = [];
  truth.markers.forEach((m, t) =>
    f.markers.items.forEach((d, di) => {
      if (inside(d.x, d.y, m.box)) pairs.push({ t, d: di, dist: Math.hypot(d.x - m.x, d.y - m.y) });
    }),
  );
  pairs.sort((a, b) => a.dist - b.dist);
  const usedT = new Set<number>(), usedD = new Set<number>();
  const matches: { t: number; d: number }[] = [];
  for (const p of pairs) {
    if (usedT.has(p.t) || usedD.has(p.d)) continue;
    usedT.add(p.t);
    usedD.add(p.d);
    matches.push(p);
  }
  // Shade consistency: for each truth shade, the found shade most of its markers got.
  const votes = new Map<number, Map<number, number>>();
  for (const { t, d } of matches) {
    const ts = truth.markers[t]!.shade, ds = f.markers.items[d]!.shade;
    const v = votes.get(ts) ?? new Map<number, number>();
    v.set(ds, (v.get(ds) ?? 0) + 1);
    votes.set(ts, v);
  }
  let consistent = 0;
  for (const v of votes.values()) consistent += Math.max(...v.values());

  const defectAt = new Map(truth.defects.map((d) => [`${d.x},${d.y}`, d]));
  let dMatched = 0, kindMatched = 0;
  for (const d of f.defects.items) {
    const t = defectAt.get(`${d.x},${d.y}`);
    if (!t) continue;
    dMatched++;
    if (t.kind === d.kind) kindMatched++;
  }

  const matchBoxes = (found: { box: { x: number; y: number; w: number; h: number } }[], truthBoxes: { x: number; y: number; w: number; h: number }[]) => {
    let matched = 0;
    const used = new Set<number>();
    for (const tb of truthBoxes) {
      const i = found.findIndex((fb, k) => !used.has(k) && inside(fb.box.x + fb.box.w / 2, fb.box.y + fb.box.h / 2, tb, 3));
      if (i >= 0) {
        used.add(i);
        matched++;
      }
    }
    return matched;
  };
  const dustFound = f.dust.items.filter((i) => i.kind === "dust");
  const hairFound = f.dust.items.filter((i) => i.kind === "hair");

  return {
    markers: { truth: truth.markers.length, found: f.markers.items.length, matched: matches.length },
    shades: { truth: truth.markers.length ? new Set(truth.markers.map((m) => m.shade)).size : 0, found: f.markers.shades.length, consistent },
    defects: { truth: truth.defects.length, found: f.defects.items.length, matched: dMatched, kindMatched },
    dust: { truth: truth.dust.length, found: dustFound.length, matched: matchBoxes(dustFound, truth.dust.map((d) => d.box)) },
    hairs: { truth: truth.hairs.length, found: hairFound.length, matched: matchBoxes(hairFound, truth.hairs.map((h) => h.box)) },
    hueError: truth.screen && f.screen.hue !== null ? Math.abs(hueDelta(f.screen.hue, truth.screen.hue)) : null,
    coverageError: truth.screen ? Math.abs(f.screen.coverage - truth.screen.coverage) : null,
    unevennessError: truth.screen && f.screen.unevenness !== null ? f.screen.unevenness - truth.screen.unevenness : null,
    noiseRelError: f.noise.sigma.map((s) => s / truth.noiseSigma - 1) as [number, number, number],
    screenPresent: { truth: truth.screen !== null, found: f.screen.present },
  };
}
