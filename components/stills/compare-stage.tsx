"use client";

import { useRef, useState, useSyncExternalStore, type KeyboardEvent, type PointerEvent, type RefObject } from "react";
import type { CompareZoom } from "@/components/stills/compare-toolbar";
import { DEFAULT_DISPLAY, displayQuery, type DisplayOptions } from "@/lib/colour/display";
import type { ProbePoint } from "@/lib/stills/probe";
import { stillUrl, type StillResponse } from "@/lib/stills/schemas";
import { cn } from "@/lib/utils";

type StageLayer = { still: StillResponse; label: "Before" | "After" };

type Props = {
  /** Bottom first; with a divider the second layer shows right of it. */
  layers: StageLayer[];
  zoom: CompareZoom;
  filter?: string;
  divider?: { position: number; onChange: (position: number) => void };
  probe: ProbePoint | null;
  onProbe: (point: ProbePoint) => void;
  scrollRef?: RefObject<HTMLDivElement | null>;
  onScroll?: () => void;
  display?: DisplayOptions;
  /** Full screen: the viewport takes the screen's height. */
  tall?: boolean;
};

/**
 * Fit shows the preview; zoomed views load every pixel: the original where the browser shows it
 * as stored (sRGB PNG, JPEG, WebP — 16-bit PNG included), else the full-size display image the
 * server makes (TIFF, OpenEXR, linear stills). Exposure and the range view are server renders.
 */
export function sourceFor(still: StillResponse, zoom: CompareZoom, display: DisplayOptions = DEFAULT_DISPLAY): string {
  const query = displayQuery(display);
  if (zoom === "fit") return stillUrl(still.id, "preview") + query;
  const shownAsStored = still.colourSpace === "srgb" && (still.format === "png" || still.format === "jpeg" || still.format === "webp");
  return shownAsStored && !query ? stillUrl(still.id, "original") : stillUrl(still.id, "display") + query;
}

function subscribeToPixelRatio(onChange: () => void): () => void {
  if (typeof window.matchMedia !== "function") return () => undefined;
  const query = window.matchMedia(`(resolution: ${window.devicePixelRatio}dppx)`);
  query.addEventListener("change", onChange);
  return () => query.removeEventListener("change", onChange);
}

const clamp = (v: number) => Math.min(100, Math.max(0, v));

/** One viewport on the neutral grey surround: fit, or 100 % and up with drag-panning; optional divider. */
export function CompareStage({ layers, zoom, filter, divider, probe, onProbe, scrollRef, onScroll, display, tall }: Props) {
  const base = layers[0]!.still;
  const ownViewport = useRef<HTMLDivElement | null>(null);
  const content = useRef<HTMLDivElement>(null);
  const drag = useRef<{ kind: "pan" | "divider"; x: number; y: number; left: number; top: number } | null>(null);
  // 100 % means one image pixel per device pixel, so CSS sizes divide by the pixel ratio.
  const dpr = useSyncExternalStore(subscribeToPixelRatio, () => window.devicePixelRatio || 1, () => 1);

  const relative = (e: PointerEvent): ProbePoint | null => {
    const rect = content.current?.getBoundingClientRect();
    if (!rect || !rect.width || !rect.height) return null;
    return { u: (e.clientX - rect.left) / rect.width, v: (e.clientY - rect.top) / rect.height };
  };

  function onPointerDown(e: PointerEvent<HTMLDivElement>, kind: "pan" | "divider") {
    if (e.button !== 0) return;
    const el = ownViewport.current;
    if (kind === "pan" && zoom === "fit") {
      if (!divider) return;
      kind = "divider";
    }
    e.currentTarget.setPointerCapture(e.pointerId);
    drag.current = { kind, x: e.clientX, y: e.clientY, left: el?.scrollLeft ?? 0, top: el?.scrollTop ?? 0 };
    if (kind === "divider") moveDivider(e);
    e.stopPropagation();
  }

  function moveDivider(e: PointerEvent) {
    const p = relative(e);
    if (p && divider) divider.onChange(clamp(Math.round(p.u * 1000) / 10));
  }

  function onPointerMove(e: PointerEvent<HTMLDivElement>) {
    const d = drag.current;
    if (d?.kind === "pan" && ownViewport.current) {
      ownViewport.current.scrollLeft = d.left - (e.clientX - d.x);
      ownViewport.current.scrollTop = d.top - (e.clientY - d.y);
    } else if (d?.kind === "divider") moveDivider(e);
    const p = relative(e);
    if (p && p.u >= 0 && p.u < 1 && p.v >= 0 && p.v < 1) onProbe(p);
  }

  function onSliderKey(e: KeyboardEvent<HTMLDivElement>) {
    if (!divider) return;
    const step = e.shiftKey || e.key === "PageUp" || e.key === "PageDown" ? 10 : 1;
    const next: Record<string, number> = {
      ArrowLeft: divider.position - step,
      ArrowDown: divider.position - step,
      PageDown: divider.position - step,
      ArrowRight: divider.position + step,
      ArrowUp: divider.position + step,
      PageUp: divider.position + step,
      Home: 0,
      End: 100,
    };
    if (e.key in next) {
      e.preventDefault();
      divider.onChange(clamp(next[e.key]!));
    }
  }

  // Until every layer has loaded its current source, say so (exposure and range renders take a moment).
  const [loaded, setLoaded] = useState<Record<string, string>>({});
  const loading = layers.some((l) => loaded[l.label] !== undefined && loaded[l.label] !== sourceFor(l.still, zoom, display));
  const actual = zoom !== "fit";
  const stageHeight = tall ? "calc(100vh - 9rem)" : "70vh";
  // At zoom z each image pixel covers z device pixels; CSS pixels are device pixels / dpr.
  const sizeStyle = actual
    ? { width: (base.width * zoom) / dpr, height: (base.height * zoom) / dpr }
    : { aspectRatio: `${base.width} / ${base.height}`, width: `min(100%, calc(${stageHeight} * ${base.width / base.height}))` };

  return (
    <div
      ref={(el) => {
        ownViewport.current = el;
        if (scrollRef) scrollRef.current = el;
      }}
      onScroll={onScroll}
      tabIndex={actual ? 0 : -1}
      aria-label={actual ? `Still at ${zoom * 100} %, scroll or drag to pan` : undefined}
      className={cn("relative flex bg-stage p-3", actual ? "cursor-grab overflow-auto active:cursor-grabbing" : "justify-center")}
      style={actual ? { height: stageHeight } : undefined}
    >
      <div
        ref={content}
        className="relative m-auto shrink-0 touch-none select-none"
        style={sizeStyle}
        onPointerDown={(e) => onPointerDown(e, "pan")}
        onPointerMove={onPointerMove}
        onPointerUp={() => (drag.current = null)}
        onPointerCancel={() => (drag.current = null)}
      >
        {layers.map((layer, i) => (
          // eslint-disable-next-line @next/next/no-img-element -- private, per-user images from our API; no optimiser.
          <img
            key={layer.still.id + layer.label}
            src={sourceFor(layer.still, zoom, display)}
            onLoad={(e) => {
              // Read now: React clears currentTarget once the handler returns, before the updater runs.
              const src = e.currentTarget.getAttribute("src") ?? "";
              setLoaded((l) => ({ ...l, [layer.label]: src }));
            }}
            alt={`${layer.label}: ${layer.still.alt}`}
            draggable={false}
            className="absolute inset-0 h-full w-full"
            style={{
              filter,
              imageRendering: actual ? "pixelated" : undefined,
              clipPath: divider && i === 1 ? `inset(0 0 0 ${divider.position}%)` : undefined,
            }}
          />
        ))}
        <span className="pointer-events-none absolute left-2 top-2 rounded bg-surface/80 px-1.5 py-0.5 text-xs">{layers[0]!.label}</span>
        {loading ? (
          <span role="status" className="pointer-events-none absolute bottom-2 left-2 rounded bg-surface/80 px-1.5 py-0.5 text-xs">
            Rendering…
          </span>
        ) : null}
        {layers[1] ? <span className="pointer-events-none absolute right-2 top-2 rounded bg-surface/80 px-1.5 py-0.5 text-xs">{layers[1].label}</span> : null}
        {probe ? (
          <span
            aria-hidden="true"
            className="pointer-events-none absolute outline outline-1 outline-accent"
            style={{
              left: `${(Math.floor(probe.u * base.width) / base.width) * 100}%`,
              top: `${(Math.floor(probe.v * base.height) / base.height) * 100}%`,
              width: `max(${100 / base.width}%, 3px)`,
              height: `max(${100 / base.height}%, 3px)`,
            }}
          />
        ) : null}
        {divider ? (
          <div
            role="slider"
            tabIndex={0}
            aria-label="Divider between before and after"
            aria-valuemin={0}
            aria-valuemax={100}
            aria-valuenow={divider.position}
            aria-valuetext={`${divider.position} % before, ${Math.round((100 - divider.position) * 10) / 10} % after`}
            aria-orientation="horizontal"
            onKeyDown={onSliderKey}
            onPointerDown={(e) => onPointerDown(e, "divider")}
            className="absolute inset-y-0 z-10 -ml-3 flex w-6 cursor-ew-resize justify-center focus-visible:outline-2 focus-visible:outline-accent"
            style={{ left: `${divider.position}%` }}
          >
            <span className="h-full w-0.5 bg-accent shadow" />
            <span className="absolute top-1/2 -mt-3 h-6 w-6 rounded-full border-2 border-accent bg-surface" />
          </div>
        ) : null}
      </div>
    </div>
  );
}
