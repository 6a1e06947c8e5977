/**
 * How many bytes of request body each kind of API route reads, in one place (README "API").
 * The route wrapper refuses a larger Content-Length before the handler runs and stops counting
 * a streamed body the moment it passes the limit; either way the answer is 413 `too_large`.
 * Still uploads are multipart and keep their own limit (PLATEROOM_MAX_UPLOAD_BYTES, lib/stills/upload.ts).
 */
export const BODY_LIMITS = {
  /** Every JSON body not named below: ids, names, settings, lab recipes and samples. */
  json: 1024 * 1024,
  /**
   * A technique revision, question or answer: a document of up to 200 000 characters and 20 000
   * nodes (lib/techniques/document.ts DOCUMENT_LIMITS) with its recipe, as JSON.
   */
  document: 4 * 1024 * 1024,
  /** A shot list import: up to 5 000 000 characters of CSV (lib/shots/schemas.ts), in UTF-8 or as JSON rows. */
  shotList: 20 * 1024 * 1024,
  /** Sign-in and one-click unsubscribe forms. */
  form: 64 * 1024,
} as const;

export function describeBytes(bytes: number): string {
  if (bytes >= 1024 * 1024) return `${+(bytes / (1024 * 1024)).toFixed(1)} MB`;
  if (bytes >= 1024) return `${+(bytes / 1024).toFixed(1)} kB`;
  return `${bytes} bytes`;
}
