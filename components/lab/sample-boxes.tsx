"use client";

import { useState } from "react";
import { StillStage, type StagePoint } from "@/components/lab/still-stage";
import type { Box } from "@/components/lab/lab-api";

export type SampleKind = "marker" | "screen";
export type PickedBox = Box & { kind: SampleKind };

const STROKE: Record<SampleKind, string> = { marker: "#ff4fd8", screen: "#ffffff" };

function boxFrom(a: StagePoint, b: StagePoint, W: number, H: number): Box {
  const x = Math.floor(Math.min(a.x, b.x)), y = Math.floor(Math.min(a.y, b.y));
  const w = Math.max(1, Math.ceil(Math.abs(b.x - a.x))), h = Math.max(1, Math.ceil(Math.abs(b.y - a.y)));
  return { x: Math.min(x, W - 1), y: Math.min(y, H - 1), w: Math.min(w, W - x), h: Math.min(h, H - y) };
}

/**
 * Drag on the still to add a sample box of the current kind; a click adds a small square.
 * Boxes are in the still's full-resolution pixels.
 */
export function SampleBoxes({ src, width, height, alt, kind, boxes, onAdd }: {
  src: string;
  width: number;
  height: number;
  alt: string;
  kind: SampleKind;
  boxes: PickedBox[];
  onAdd(box: PickedBox): void;
}) {
  const [start, setStart] = useState<StagePoint | null>(null);
  const [end, setEnd] = useState<StagePoint | null>(null);
  const click = Math.max(3, Math.round(width / 200));
  const stroke = Math.max(1, width / 500);
  const finish = (p: StagePoint) => {
    if (!start) return;
    const dragged = Math.abs(p.x - start.x) > 2 || Math.abs(p.y - start.y) > 2;
    const box = dragged
      ? boxFrom(start, p, width, height)
      : boxFrom({ x: p.x - click, y: p.y - click }, { x: p.x + click, y: p.y + click }, width, height);
    onAdd({ ...box, kind });
    setStart(null);
    setEnd(null);
  };
  const live = start && end ? boxFrom(start, end, width, height) : null;
  return (
    <StillStage
      width={width}
      height={height}
      interactive
      label={`${alt}. Drag to add a ${kind} sample box; ${boxes.length} boxes picked.`}
      onDown={(p) => {
        setStart(p);
        setEnd(p);
      }}
      onMove={(p) => start && setEnd(p)}
      onUp={finish}
    >
      <image href={src} width={width} height={height} preserveAspectRatio="none" />
      {boxes.map((b, i) => (
        <g key={i}>
          <rect x={b.x} y={b.y} width={b.w} height={b.h} fill="none" stroke={STROKE[b.kind]} strokeWidth={stroke} strokeDasharray={b.kind === "screen" ? `${stroke * 3}` : undefined} />
          <text x={b.x} y={b.y - stroke * 2} fill={STROKE[b.kind]} fontSize={stroke * 10}>
            {b.kind === "marker" ? "M" : "S"}
            {i + 1}
          </text>
        </g>
      ))}
      {live ? <rect x={live.x} y={live.y} width={live.w} height={live.h} fill="none" stroke={STROKE[kind]} strokeWidth={stroke} opacity={0.7} /> : null}
    </StillStage>
  );
}
