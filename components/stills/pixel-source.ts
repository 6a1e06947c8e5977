import type { PixelResponse, StillResponse } from "@/lib/stills/schemas";
import { stillUrl } from "@/lib/stills/schemas";
import { valuesFromRgba } from "@/lib/stills/probe";

export type PixelReading = { x: number; y: number; values: number[]; max: number };

/** 8-bit PNG, JPEG and WebP originals decode in the browser exactly; 16-bit and TIFF are read on the server. */
function readsInBrowser(still: Pick<StillResponse, "bitDepth" | "format">): boolean {
  return still.bitDepth === 8 && still.format !== "tiff";
}

const decoded = new Map<string, Promise<ImageData>>();

/**
 * The original's pixels as stored: no colour-space conversion and no premultiplication, so
 * the canvas returns the file's code values rather than display-adjusted ones.
 */
function loadOriginal(still: StillResponse): Promise<ImageData> {
  let pending = decoded.get(still.id);
  if (!pending) {
    pending = (async () => {
      const res = await fetch(stillUrl(still.id, "original"), { credentials: "same-origin" });
      if (!res.ok) throw new Error(`Could not load the original (${res.status}).`);
      const bitmap = await createImageBitmap(await res.blob(), { colorSpaceConversion: "none", premultiplyAlpha: "none" });
      const canvas = document.createElement("canvas");
      canvas.width = bitmap.width;
      canvas.height = bitmap.height;
      const ctx = canvas.getContext("2d", { willReadFrequently: true });
      if (!ctx) throw new Error("This browser cannot read pixels from a canvas.");
      ctx.drawImage(bitmap, 0, 0);
      bitmap.close();
      return ctx.getImageData(0, 0, canvas.width, canvas.height);
    })();
    pending.catch(() => decoded.delete(still.id));
    decoded.set(still.id, pending);
  }
  return pending;
}

/** Reads one pixel of a still's original, from the canvas or from GET /api/stills/{id}/pixel. */
export async function readPixel(still: StillResponse, x: number, y: number, signal: AbortSignal): Promise<PixelReading> {
  if (readsInBrowser(still)) {
    const image = await loadOriginal(still);
    return { x, y, values: valuesFromRgba(image.data, (y * image.width + x) * 4, still.channels), max: 255 };
  }
  const res = await fetch(`/api/stills/${encodeURIComponent(still.id)}/pixel?x=${x}&y=${y}`, { credentials: "same-origin", signal });
  if (!res.ok) throw new Error(`Could not read the pixel (${res.status}).`);
  const body = (await res.json()) as PixelResponse;
  return { x, y, values: body.values, max: body.max };
}
