/**
 * Turn match ranges into text segments the UI can render (wrap `isMatch` segments in <mark>).
 * Client-safe and pure; returns no HTML, so nothing needs escaping here.
 */
export type HighlightSegment = { text: string; isMatch: boolean };

/**
 * Split `text` by half-open `[start, end)` ranges. Ranges may be unsorted, overlapping or out of
 * bounds (they are clamped and merged); the segments always join back to `text` exactly.
 */
export function highlight(text: string, ranges: ReadonlyArray<readonly [number, number]>): HighlightSegment[] {
  const clean = ranges
    .map(([s, e]) => [Math.max(0, Math.min(s, text.length)), Math.max(0, Math.min(e, text.length))] as const)
    .filter(([s, e]) => e > s)
    .sort((x, y) => x[0] - y[0]);
  const merged: [number, number][] = [];
  for (const [s, e] of clean) {
    const last = merged[merged.length - 1];
    if (last && s <= last[1]) last[1] = Math.max(last[1], e);
    else merged.push([s, e]);
  }
  const out: HighlightSegment[] = [];
  let pos = 0;
  for (const [s, e] of merged) {
    if (s > pos) out.push({ text: text.slice(pos, s), isMatch: false });
    out.push({ text: text.slice(s, e), isMatch: true });
    pos = e;
  }
  if (pos < text.length || out.length === 0) out.push({ text: text.slice(pos), isMatch: false });
  return out;
}
