import { CHANNEL_VIEWS, channelViewMatrix, type ChannelView } from "@/lib/stills/luminance";

/**
 * Hidden SVG filters for the channel views. `color-interpolation-filters="sRGB"` makes the
 * matrix act on the stored (encoded) values, as BT.709 defines luma; the SVG default would
 * convert to linear light first.
 */
export function ChannelFilters({ idPrefix }: { idPrefix: string }) {
  return (
    <svg aria-hidden="true" width="0" height="0" className="absolute" focusable="false">
      <defs>
        {CHANNEL_VIEWS.filter((v) => v !== "rgb").map((view) => (
          <filter key={view} id={channelFilterId(idPrefix, view)} colorInterpolationFilters="sRGB">
            <feColorMatrix type="matrix" values={channelViewMatrix(view).join(" ")} />
          </filter>
        ))}
      </defs>
    </svg>
  );
}

function channelFilterId(idPrefix: string, view: ChannelView): string {
  return `${idPrefix.replace(/[^a-zA-Z0-9_-]/g, "")}-channel-${view}`;
}

/** The CSS `filter` value for a view, or undefined for plain RGB. */
export function channelFilterCss(idPrefix: string, view: ChannelView): string | undefined {
  return view === "rgb" ? undefined : `url(#${channelFilterId(idPrefix, view)})`;
}
