import type { ColourSpace } from "@/lib/colour/spaces";

/**
 * The colour space a still gets when the uploader does not declare one. OpenEXR holds
 * scene-linear light: the space its chromaticities attribute names, and without that attribute
 * Rec.709 primaries (the OpenEXR documentation's default). Float TIFF is read as scRGB (linear,
 * sRGB primaries). Everything else — 8/16-bit PNG, JPEG, TIFF, WebP — is sRGB-encoded.
 */
export function defaultColourSpace(facts: { format: string; bitDepth: number; exr?: { defaultColourSpace: string } | null }): ColourSpace {
  if (facts.format === "exr") return (facts.exr?.defaultColourSpace as ColourSpace | undefined) ?? "lin-rec709";
  if (facts.format === "tiff" && facts.bitDepth === 32) return "lin-rec709";
  return "srgb";
}
