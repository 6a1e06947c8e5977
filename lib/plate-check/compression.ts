import type { CompressionFinding } from "@/lib/plate-check/schemas";

/*
 * How the still's file stores its pixels, read from the file's own structure. Pure and client-safe.
 * - JPEG: always lossy (ITU-T T.81 baseline and progressive DCT coding; its lossless mode is not
 *   something sharp or browsers write);
 * - WebP: the RIFF container names its image chunk: "VP8 " is lossy (RFC 9649 §2.5, the VP8 key
 *   frame of RFC 6386), "VP8L" lossless (RFC 9649 §3); an extended file ("VP8X") carries one of the two;
 * - OpenEXR: B44, B44A, DWAA and DWAB are lossy; PXR24 rounds 32-bit float samples to 24 bits
 *   (lossless for half and integer samples). (OpenEXR file layout, "Compression" — from memory.)
 * - PNG and TIFF as stored here are lossless (TIFF with JPEG compression is not told apart: own limit).
 */

export type CompressionSource = { format: string; bytes?: Uint8Array | null; exr?: { compression: string; pixelType: string } | null };

const LOSSY_EXR = new Set(["b44", "b44a", "dwaa", "dwab"]);

/** "lossy", "lossless", or null when the WebP chunks cannot be read. */
export function webpCoding(bytes: Uint8Array): "lossy" | "lossless" | null {
  const tag = (o: number): string => String.fromCharCode(bytes[o]!, bytes[o + 1]!, bytes[o + 2]!, bytes[o + 3]!);
  if (bytes.length < 20 || tag(0) !== "RIFF" || tag(8) !== "WEBP") return null;
  // Chunks follow the 12-byte header: FourCC, little-endian size, payload padded to even length.
  for (let o = 12; o + 8 <= bytes.length; ) {
    const fourcc = tag(o);
    const size = bytes[o + 4]! | (bytes[o + 5]! << 8) | (bytes[o + 6]! << 16) | (bytes[o + 7]! * 2 ** 24);
    if (fourcc === "VP8 ") return "lossy";
    if (fourcc === "VP8L") return "lossless";
    o += 8 + size + (size & 1);
  }
  return null;
}

/**
 * The compression finding. Confidence is about what the file says (its coding is read, not
 * guessed); how much the coding changed the values is not measured, and the figures it affects
 * say so themselves.
 */
export function compressionFinding(src: CompressionSource): CompressionFinding {
  const affected = "noise σ, dead and hot pixels and dust are measured on the decoded values, which lossy coding smooths, blocks and smears, so those figures are rough";
  const lossy = (method: string, confidence: number): CompressionFinding => ({
    lossy: true,
    method,
    summary: `Stored with lossy compression (${method}): ${affected}. Ask for the original frame if it exists.`,
    confidence,
    tags: [],
  });
  const lossless = (method: string, summary?: string): CompressionFinding => ({ lossy: false, method, summary: summary ?? `Stored without loss (${method}): the values are what was saved.`, confidence: 1, tags: [] });
  switch (src.format) {
    case "jpeg":
      return lossy("JPEG", 1);
    case "webp": {
      const coding = src.bytes ? webpCoding(src.bytes) : null;
      if (coding === "lossy") return lossy("WebP, lossy VP8 coding", 1);
      if (coding === "lossless") return lossless("WebP, lossless VP8L coding");
      // Unreadable chunks: most WebP files are lossy, so it is treated as lossy but said to be a guess.
      return lossy("WebP, coding not readable from the file; taken as lossy", 0.5);
    }
    case "exr": {
      const c = src.exr?.compression?.toLowerCase() ?? "";
      if (LOSSY_EXR.has(c)) return lossy(`OpenEXR ${c.toUpperCase()}`, 1);
      if (c === "pxr24" && src.exr?.pixelType === "float") return lossy("OpenEXR PXR24 on 32-bit float samples (rounded to 24 bits)", 1);
      return lossless(`OpenEXR${c ? ` ${c.toUpperCase()}` : ""}`);
    }
    case "png":
      return lossless("PNG");
    case "tiff":
      return lossless("TIFF", "Stored as TIFF, read as lossless (a TIFF with JPEG coding inside is not told apart).");
    default:
      return lossless(src.format.toUpperCase());
  }
}
