"use client";

import { CHANNEL_VIEW_LABELS, CHANNEL_VIEWS, type ChannelView } from "@/lib/stills/luminance";
import { cn } from "@/lib/utils";

export type CompareMode = "divider" | "toggle" | "side";
export type CompareZoom = "fit" | "actual";

type Props = {
  mode: CompareMode;
  zoom: CompareZoom;
  view: ChannelView;
  showing: "before" | "after";
  onMode: (mode: CompareMode) => void;
  onZoom: (zoom: CompareZoom) => void;
  onView: (view: ChannelView) => void;
  onToggle: () => void;
};

const MODES: [CompareMode, string][] = [
  ["divider", "Divider"],
  ["toggle", "Toggle"],
  ["side", "Side by side"],
];
const ZOOMS: [CompareZoom, string][] = [
  ["fit", "Fit"],
  ["actual", "100 %"],
];

function Segmented<T extends string>({ label, options, value, onChange }: { label: string; options: [T, string][]; value: T; onChange: (v: T) => void }) {
  return (
    <div role="group" aria-label={label} className="inline-flex overflow-hidden rounded border border-line">
      {options.map(([v, text]) => (
        <button
          key={v}
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

/** Mode, zoom and channel-view controls of the compare view. */
export function CompareToolbar({ mode, zoom, view, showing, onMode, onZoom, onView, onToggle }: Props) {
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
    </div>
  );
}
