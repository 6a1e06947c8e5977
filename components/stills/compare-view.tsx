"use client";

import { useId, useRef, useState } from "react";
import { ChannelFilters, channelFilterCss } from "@/components/stills/channel-filters";
import { CompareStage } from "@/components/stills/compare-stage";
import { CompareToolbar, type CompareMode, type CompareZoom } from "@/components/stills/compare-toolbar";
import { DisplayControls } from "@/components/stills/display-controls";
import { PixelProbe } from "@/components/stills/pixel-probe";
import { StillFacts } from "@/components/stills/still-facts";
import { useFullscreen } from "@/components/stills/use-fullscreen";
import { useDebouncedValue } from "@/components/search/use-debounced-value";
import { DEFAULT_DISPLAY, type DisplayOptions } from "@/lib/colour/display";
import type { ChannelView } from "@/lib/stills/luminance";
import type { ProbePoint } from "@/lib/stills/probe";
import type { StillResponse } from "@/lib/stills/schemas";
import { cn } from "@/lib/utils";

type CompareViewProps = {
  before: StillResponse;
  after: StillResponse;
  /** The pair's caption. */
  caption?: string;
  initialMode?: CompareMode;
  className?: string;
};

/**
 * Before/after on a neutral grey surround: a draggable divider (arrow keys when focused),
 * a toggle, or side by side; fit, or 100 % to 800 % with nearest-neighbour pixels and panning;
 * R, G, B and BT.709 luminance views; exposure and the out-of-range view; full screen; and a
 * pixel probe reading both stills' stored values under the pointer.
 */
export function CompareView({ before, after, caption, initialMode = "divider", className }: CompareViewProps) {
  const idPrefix = useId();
  const [mode, setMode] = useState<CompareMode>(initialMode);
  const [zoom, setZoom] = useState<CompareZoom>("fit");
  const [view, setView] = useState<ChannelView>("rgb");
  const [position, setPosition] = useState(50);
  const [showing, setShowing] = useState<"before" | "after">("before");
  const [probe, setProbe] = useState<ProbePoint | null>(null);
  const [display, setDisplay] = useState<DisplayOptions>(DEFAULT_DISPLAY);
  const figure = useRef<HTMLElement | null>(null);
  const fullscreen = useFullscreen(figure);
  const left = useRef<HTMLDivElement | null>(null);
  const right = useRef<HTMLDivElement | null>(null);
  const filter = channelFilterCss(idPrefix, view);

  // Each exposure or view change is a server render: ask for the one people settle on.
  const shownDisplay = useDebouncedValue(display, 350);

  const shared = { zoom, filter, probe, onProbe: setProbe, display: shownDisplay, tall: fullscreen.active };
  return (
    <figure
      ref={figure}
      className={cn("space-y-3", fullscreen.active && "overflow-auto bg-surface p-4", className)}
      onKeyDown={(e) => {
        // Browsers leave full screen on Escape themselves; this covers those that hand the key to the page.
        if (e.key === "Escape" && fullscreen.active) fullscreen.toggle();
      }}
    >
      <ChannelFilters idPrefix={idPrefix} />
      <CompareToolbar
        mode={mode}
        zoom={zoom}
        view={view}
        showing={showing}
        onMode={setMode}
        onZoom={setZoom}
        onView={setView}
        onToggle={() => setShowing((s) => (s === "before" ? "after" : "before"))}
        fullscreen={fullscreen}
      />
      <DisplayControls value={display} onChange={setDisplay} />
      {mode === "divider" ? (
        <CompareStage
          {...shared}
          layers={[
            { still: before, label: "Before" },
            { still: after, label: "After" },
          ]}
          divider={{ position, onChange: setPosition }}
        />
      ) : mode === "toggle" ? (
        <CompareStage {...shared} layers={[showing === "before" ? { still: before, label: "Before" } : { still: after, label: "After" }]} />
      ) : (
        <div className="grid gap-2 md:grid-cols-2">
          <CompareStage {...shared} layers={[{ still: before, label: "Before" }]} scrollRef={left} onScroll={() => copyScroll(left.current, right.current)} />
          <CompareStage {...shared} layers={[{ still: after, label: "After" }]} scrollRef={right} onScroll={() => copyScroll(right.current, left.current)} />
        </div>
      )}
      <PixelProbe before={before} after={after} point={probe} onPointChange={setProbe} />
      <figcaption className="space-y-1 text-sm">
        {caption ? <p>{caption}</p> : null}
        <dl className="grid gap-x-4 gap-y-1 text-xs text-muted sm:grid-cols-[auto_1fr]">
          {(
            [
              ["Before", before],
              ["After", after],
            ] as const
          ).map(([label, still]) => {
            return (
              <div key={label} className="contents">
                <dt className="font-medium text-ink">{label}</dt>
                <dd>
                  {still.caption || still.alt}
                  {still.credit ? <span> — credit: {still.credit}</span> : null}
                  <StillFacts still={still} />
                </dd>
              </div>
            );
          })}
        </dl>
      </figcaption>
    </figure>
  );
}

/** Side by side at 100 %: both viewports pan together. */
function copyScroll(from: HTMLDivElement | null, to: HTMLDivElement | null): void {
  if (!from || !to || (to.scrollLeft === from.scrollLeft && to.scrollTop === from.scrollTop)) return;
  to.scrollLeft = from.scrollLeft;
  to.scrollTop = from.scrollTop;
}
