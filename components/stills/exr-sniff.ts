import { COMPRESSION_NAMES, ExrFormatError, isExr, parseExrHeader, windowSize } from "@/lib/exr/header";
import { defaultLayer, listLayers } from "@/lib/exr/layers";
import { spaceOfChromaticities, type LinearSpace } from "@/lib/colour/spaces";

/** What the upload form shows about a dropped OpenEXR file before sending it. */
export type ExrPreflight =
  | { ok: true; layers: { id: string; label: string }[]; defaultLayer: string; space: LinearSpace | null; compression: string; pixelAspectRatio: number; size: string }
  | { ok: false; message: string };

/** Headers fit in the first megabytes (a preview image in the header can be large). */
const HEAD_BYTES = 8 * 1024 * 1024;

/**
 * Reads the header of a dropped file in the browser with the same reader the server uses, so
 * the form can offer the file's layers and its colour space. Null for files that are not OpenEXR.
 */
export async function sniffExr(file: File): Promise<ExrPreflight | null> {
  const head = new Uint8Array(await file.slice(0, HEAD_BYTES).arrayBuffer());
  if (!isExr(head)) return null;
  try {
    const header = parseExrHeader(head);
    const layers = listLayers(header);
    const chosen = defaultLayer(layers);
    const part = header.parts[chosen?.part ?? 0]!;
    const { width, height } = windowSize(part.displayWindow);
    return {
      ok: true,
      layers: layers.map((l) => ({ id: l.id, label: l.label })),
      defaultLayer: chosen?.id ?? "",
      space: spaceOfChromaticities(part.chromaticities),
      compression: COMPRESSION_NAMES[part.compression],
      pixelAspectRatio: part.pixelAspectRatio,
      size: `${width}×${height}`,
    };
  } catch (error) {
    return { ok: false, message: error instanceof ExrFormatError ? error.message : "The OpenEXR header could not be read." };
  }
}
