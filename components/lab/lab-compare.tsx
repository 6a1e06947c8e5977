"use client";

import { useId, useState } from "react";
import { StillStage } from "@/components/lab/still-stage";

/**
 * Plate vs result with a divider (result on the right of it). The divider is a range input, so
 * it works from the keyboard; both images are drawn at the still's full-resolution size.
 */
export function LabCompare({ plateSrc, resultSrc, width, height, alt }: { plateSrc: string; resultSrc: string; width: number; height: number; alt: string }) {
  const id = useId().replace(/:/g, "");
  const [split, setSplit] = useState(50);
  const x = (split / 100) * width;
  return (
    <figure className="space-y-2">
      <StillStage
        width={width}
        height={height}
        label={`${alt}: plate on the left, lab result on the right of the divider at ${split}%`}
        defs={
          <clipPath id={`clip-${id}`}>
            <rect x={x} y={0} width={width - x} height={height} />
          </clipPath>
        }
      >
        <image href={plateSrc} width={width} height={height} preserveAspectRatio="none" />
        <image href={resultSrc} width={width} height={height} preserveAspectRatio="none" clipPath={`url(#clip-${id})`} />
        <line x1={x} x2={x} y1={0} y2={height} stroke="white" strokeWidth={Math.max(1, width / 600)} vectorEffect="non-scaling-stroke" />
      </StillStage>
      <div className="flex items-center gap-3 text-xs text-muted">
        <span>Plate</span>
        <label htmlFor={`split-${id}`} className="sr-only">
          Divider position
        </label>
        <input id={`split-${id}`} type="range" min={0} max={100} step={1} value={split} onChange={(e) => setSplit(Number(e.target.value))} className="flex-1 accent-[var(--color-accent)]" />
        <span>Result</span>
      </div>
    </figure>
  );
}
