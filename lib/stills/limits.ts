/**
 * The one pixel limit for stills, decided here for upload and lab alike (OWASP File Upload Cheat
 * Sheet: a small file may declare a huge image). Uploads above it are refused; the lab opens
 * everything up to it. 8192 × 8192: the lab holds a full-resolution still as float RGB (12 bytes
 * a pixel, ≈ 0.8 GB at this size) beside its 16-bit codes, which a 2-core server still runs.
 */
export const STILL_PIXEL_LIMIT = 8192 * 8192;

/** "67.1 megapixels", for messages. */
export function megapixels(pixels: number): string {
  return `${(pixels / 1_000_000).toFixed(1)} megapixels`;
}
