"use client";

import { useEffect, useRef, useState } from "react";
import { displayHex, gridBytes } from "@/lib/plate-check/format";
import type { Findings, OverlayGrid } from "@/lib/plate-check/schemas";
import { stillUrl } from "@/lib/stills/schemas";

type Layer = "screen" | "markers" | "defects" | "dust" | "clipped" | "crushed";

/** Our own overlay colours, chosen to read on green, blue and grey plates alike. */
const COLOURS: Record<Layer, string> = {
  screen: "rgba(255,255,255,0.28)",
  markers: "#ffd23f",
  defects: "#ff3b6b",
  dust: "#4dd8ff",
  clipped: "rgba(255,60,200,0.6)",
  crushed: "rgba(60,120,255,0.6)",
};
const LABELS: Record<Layer, string> = {
  screen: "Clean screen",
  markers: "Markers",
  defects: "Dead, hot and stuck pixels",
  dust: "Dust and hairs",
  clipped: "Clipped",
  crushed: "Crushed",
};

function drawGrid(ctx: CanvasRenderingContext2D, grid: OverlayGrid, sx: number, sy: number, colour: string, threshold: number): void {
  const bytes = gridBytes(grid.data);
  ctx.fillStyle = colour;
  for (let y = 0; y < grid.height; y++) {
    for (let x = 0; x < grid.width; x++) {
      if (bytes[y * grid.width + x]! < threshold) continue;
      ctx.fillRect(x * grid.cell * sx, y * grid.cell * sy, grid.cell * sx + 0.5, grid.cell * sy + 0.5);
    }
  }
}

/** The still with the findings drawn over it; each kind of finding can be switched on and off. */
export function StillOverlay({ stillId, alt, findings }: { stillId: string; alt: string; findings: Findings }) {
  const img = useRef<HTMLImageElement>(null);
  const canvas = useRef<HTMLCanvasElement>(null);
  const [on, setOn] = useState<Record<Layer, boolean>>({ screen: false, markers: true, defects: true, dust: true, clipped: false, crushed: false });
  const [size, setSize] = useState<{ w: number; h: number } | null>(null);
  const available: Record<Layer, boolean> = {
    screen: findings.screen.mask !== null,
    markers: findings.markers.items.length > 0,
    defects: findings.defects.items.length > 0,
    dust: findings.dust.items.length > 0,
    clipped: findings.clipping.clippedMask !== null,
    crushed: findings.clipping.crushedMask !== null,
  };

  useEffect(() => {
    const el = img.current;
    if (!el) return;
    const measure = () => setSize(el.clientWidth ? { w: el.clientWidth, h: el.clientHeight } : null);
    const ro = new ResizeObserver(measure);
    ro.observe(el);
    measure();
    return () => ro.disconnect();
  }, []);

  useEffect(() => {
    const c = canvas.current;
    if (!c || !size) return;
    const dpr = window.devicePixelRatio || 1;
    c.width = Math.round(size.w * dpr);
    c.height = Math.round(size.h * dpr);
    const ctx = c.getContext("2d");
    if (!ctx) return;
    ctx.setTransform(dpr, 0, 0, dpr, 0, 0);
    ctx.clearRect(0, 0, size.w, size.h);
    const sx = size.w / findings.width, sy = size.h / findings.height;
    if (on.screen && findings.screen.mask) drawGrid(ctx, findings.screen.mask, sx, sy, COLOURS.screen, 128);
    if (on.clipped && findings.clipping.clippedMask) drawGrid(ctx, findings.clipping.clippedMask, sx, sy, COLOURS.clipped, 1);
    if (on.crushed && findings.clipping.crushedMask) drawGrid(ctx, findings.clipping.crushedMask, sx, sy, COLOURS.crushed, 1);
    ctx.lineWidth = 1.5;
    if (on.markers) {
      ctx.font = "11px sans-serif";
      for (const m of findings.markers.items) {
        const shade = findings.markers.shades[m.shade];
        ctx.strokeStyle = COLOURS.markers;
        ctx.strokeRect(m.box.x * sx - 2, m.box.y * sy - 2, m.box.w * sx + 4, m.box.h * sy + 4);
        if (shade) {
          ctx.fillStyle = displayHex(shade.colourLinear);
          ctx.fillRect(m.box.x * sx - 2, m.box.y * sy - 9, 7, 7);
        }
      }
    }
    if (on.dust) {
      ctx.setLineDash([3, 2]);
      ctx.strokeStyle = COLOURS.dust;
      for (const d of findings.dust.items) ctx.strokeRect(d.box.x * sx - 3, d.box.y * sy - 3, d.box.w * sx + 6, d.box.h * sy + 6);
      ctx.setLineDash([]);
    }
    if (on.defects) {
      ctx.strokeStyle = COLOURS.defects;
      for (const d of findings.defects.items) {
        ctx.beginPath();
        ctx.arc((d.x + 0.5) * sx, (d.y + 0.5) * sy, 6, 0, Math.PI * 2);
        ctx.stroke();
      }
    }
  }, [on, size, findings]);

  return (
    <figure className="space-y-2">
      <div className="relative overflow-hidden rounded border border-line bg-stage">
        {/* eslint-disable-next-line @next/next/no-img-element -- private, permission-checked still; next/image would cache it */}
        <img ref={img} src={stillUrl(stillId, "preview")} alt={alt} className="block h-auto w-full" onLoad={() => img.current && setSize({ w: img.current.clientWidth, h: img.current.clientHeight })} />
        <canvas ref={canvas} aria-hidden className="pointer-events-none absolute inset-0 h-full w-full" />
      </div>
      <fieldset className="flex flex-wrap gap-x-4 gap-y-1 text-sm">
        <legend className="sr-only">Show on the still</legend>
        {(Object.keys(LABELS) as Layer[]).map((layer) => (
          <label key={layer} className={available[layer] ? "inline-flex items-center gap-1.5" : "inline-flex items-center gap-1.5 text-muted"}>
            <input type="checkbox" checked={on[layer] && available[layer]} disabled={!available[layer]} onChange={(e) => setOn({ ...on, [layer]: e.target.checked })} />
            <span aria-hidden className="inline-block h-2.5 w-2.5 rounded-sm border border-line" style={{ background: COLOURS[layer] }} />
            {LABELS[layer]}
            {available[layer] ? null : <span className="sr-only"> (none found)</span>}
          </label>
        ))}
      </fieldset>
    </figure>
  );
}
