import { COLOUR_SPACE_LABELS } from "@/lib/colour/spaces";
import type { StillResponse } from "@/lib/stills/schemas";

/** Sample depth as people say it: 8-bit, 16-bit, half float, float. */
export function depthLabel(still: Pick<StillResponse, "bitDepth" | "format">): string {
  if (still.format === "exr") return still.bitDepth === 16 ? "half float" : "float";
  return still.bitDepth === 32 ? "float" : `${still.bitDepth}-bit`;
}

/** One line of what a still is: size, depth, format, colour space; for OpenEXR its layout and layer. */
export function StillFacts({ still }: { still: StillResponse }) {
  const exr = still.exr;
  const windowsDiffer =
    exr &&
    (exr.dataWindow.xMin !== exr.displayWindow.xMin ||
      exr.dataWindow.yMin !== exr.displayWindow.yMin ||
      exr.dataWindow.xMax !== exr.displayWindow.xMax ||
      exr.dataWindow.yMax !== exr.displayWindow.yMax);
  const box = (b: { xMin: number; yMin: number; xMax: number; yMax: number }) => `(${b.xMin}, ${b.yMin})–(${b.xMax}, ${b.yMax})`;
  const layer = exr?.layers.find((l) => l.id === exr.layer);
  return (
    <span className="ml-2 font-mono">
      {still.width}×{still.height}, {depthLabel(still)} {still.format === "exr" ? "OpenEXR" : still.format.toUpperCase()}, {COLOUR_SPACE_LABELS[still.colourSpace]}
      {still.pixelAspectRatio !== 1 ? `, pixel aspect ${Number(still.pixelAspectRatio.toFixed(4))}` : ""}
      {exr ? (
        <>
          {`, ${exr.compression}${exr.tiled ? " tiled" : ""}`}
          {layer && exr.layers.length > 1 ? `, showing ${layer.label} of ${exr.layers.length} layers and channels` : ""}
          {windowsDiffer ? `, data window ${box(exr.dataWindow)} in display window ${box(exr.displayWindow)}` : ""}
        </>
      ) : null}
    </span>
  );
}
