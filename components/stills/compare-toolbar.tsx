"use client";

import { CHANNEL_VIEW_LABELS, CHANNEL_VIEWS, type ChannelView } from "@/lib/stills/luminance";
import { cn } from "@/lib/utils";

export type CompareMode = "divider" | "toggle" | "side";
/** "fit" the frame, or image pixels per screen pixel (1 = 100 %). */
export type CompareZoom = "fit" | 1 | 2 | 4 | 8;

type Props = {
  mode: CompareMode;
  zoom: CompareZoom;
  view: ChannelView;
  showing: "before" | "after";
  onMode: (mode: CompareMode) => void;
  onZoom: (zoom: CompareZoom) => void;
  onView: (view: ChannelView) => void;
  onToggle: () => void;
  fullscreen: { active: boolean; supported: boolean; toggle: () => void };
};

const MODES: [CompareMode, string][] = [
  ["divider", "Divider"],
  ["toggle", "Toggle"],
  ["side", "Side by side"],
];
const ZOOMS: [CompareZoom, string][] = [
  ["fit", "Fit"],
  [1, "100 %"],
  [2, "200 %"],
  [4, "400 %"],
  [8, "800 %"],
];

function Segmented<T extends string | number>({ label, options, value, onChange }: { label: string; options: [T, string][]; value: T; onChange: (v: T) => void }) {
  return (
    <div role="group" aria-label={label} className="inline-flex overflow-hidden rounded border border-line">
      {options.map(([v, text]) => (
        <button
          key={String(v)}
          type="button"
          aria-pressed={value === v}
          onClick={() => onChange(v)}
          className={cn("px-2.5 py-1 text-xs font-medium", value === v ? "bg-accent text-accent-ink" : "bg-surface-2 hover:bg-surface-3")}
        >
          {text}
        </button>
      ))}
    </div>
  );
}

/** Mode, zoom, channel-view and full-screen controls of the compare view. */
export function CompareToolbar({ mode, zoom, view, showing, onMode, onZoom, onView, onToggle, fullscreen }: Props) {
  return (
    <div className="flex flex-wrap items-center gap-2">
      <Segmented label="Compare mode" options={MODES} value={mode} onChange={onMode} />
      <Segmented label="Zoom" options={ZOOMS} value={zoom} onChange={onZoom} />
      <Segmented label="Channels" options={CHANNEL_VIEWS.map((v) => [v, CHANNEL_VIEW_LABELS[v]] as [ChannelView, string])} value={view} onChange={onView} />
      {mode === "toggle" ? (
        <button type="button" onClick={onToggle} className="rounded border border-line bg-surface-2 px-2.5 py-1 text-xs font-medium hover:bg-surface-3">
          Showing {showing} — show {showing === "before" ? "after" : "before"}
        </button>
      ) : null}
      {fullscreen.supported ? (
        <button
          type="button"
          aria-pressed={fullscreen.active}
          onClick={fullscreen.toggle}
          title={fullscreen.active ? "Leave full screen (Esc)" : "Fill the screen with the compare view (Esc leaves)"}
          className="ml-auto rounded border border-line bg-surface-2 px-2.5 py-1 text-xs font-medium hover:bg-surface-3"
        >
          {fullscreen.active ? "Leave full screen" : "Full screen"}
        </button>
      ) : null}
    </div>
  );
}
