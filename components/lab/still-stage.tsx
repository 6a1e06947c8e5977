"use client";

import { type PointerEvent as ReactPointerEvent, type ReactNode } from "react";
import { cn } from "@/lib/utils";

export type StagePoint = { x: number; y: number };

/**
 * A still on the neutral grey stage, drawn in an SVG whose user units are the still's
 * full-resolution pixels, so overlays (boxes, lines) and filters share one coordinate system.
 */
export function StillStage({ width, height, label, defs, children, onDown, onMove, onUp, className, interactive }: {
  width: number;
  height: number;
  label: string;
  defs?: ReactNode;
  children: ReactNode;
  onDown?(p: StagePoint): void;
  onMove?(p: StagePoint): void;
  onUp?(p: StagePoint): void;
  className?: string;
  interactive?: boolean;
}) {
  const toPoint = (e: ReactPointerEvent<SVGSVGElement>): StagePoint | null => {
    const ctm = e.currentTarget.getScreenCTM();
    if (!ctm) return null;
    const p = new DOMPoint(e.clientX, e.clientY).matrixTransform(ctm.inverse());
    return { x: Math.min(width, Math.max(0, p.x)), y: Math.min(height, Math.max(0, p.y)) };
  };
  const handle = (fn?: (p: StagePoint) => void) => (e: ReactPointerEvent<SVGSVGElement>) => {
    const p = fn && toPoint(e);
    if (p) fn(p);
  };
  return (
    <div className={cn("rounded border border-line bg-stage p-3", className)}>
      <svg
        viewBox={`0 0 ${width} ${height}`}
        role="img"
        aria-label={label}
        className={cn("block max-h-[70vh] w-full select-none", interactive && "cursor-crosshair touch-none")}
        onPointerDown={(e) => {
          if (!onDown) return;
          e.currentTarget.setPointerCapture(e.pointerId);
          handle(onDown)(e);
        }}
        onPointerMove={handle(onMove)}
        onPointerUp={handle(onUp)}
      >
        {defs ? <defs>{defs}</defs> : null}
        {children}
      </svg>
    </div>
  );
}
