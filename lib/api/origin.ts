import "server-only";
import { appOrigin } from "@/lib/env";

const SAFE_METHODS = new Set(["GET", "HEAD", "OPTIONS"]);

/**
 * The one rule for writes a browser makes with the person's cookie (route handlers through
 * lib/api/handler.ts, server actions through proxy.ts). Returns why the write is refused, or null.
 *
 * - Sent with `Authorization` (a script's token): allowed; a page elsewhere cannot make a
 *   browser add that header without a CORS preflight, which this app never grants.
 * - `Sec-Fetch-Site: cross-site` (W3C Fetch Metadata Request Headers): refused, with or without Origin.
 * - `Origin` present: it must be the app's own origin, PLATEROOM_BASE_URL's scheme, host and port
 *   compared whole (RFC 6454 §5); "null" and unparsable values are refused. The Host header is
 *   never the reference: a caller controls it.
 * - Neither header (an older client or a command-line tool): allowed; such a request is not one
 *   a page elsewhere can make (OWASP CSRF Prevention Cheat Sheet, "Verifying Origin With Standard Headers").
 */
export function crossOriginWriteReason(method: string, headers: Headers): string | null {
  if (SAFE_METHODS.has(method.toUpperCase())) return null;
  if (headers.has("authorization")) return null;
  const own = appOrigin();
  if (headers.get("sec-fetch-site")?.trim().toLowerCase() === "cross-site") return `Writes are accepted only from ${own}; this one came from another site.`;
  const origin = headers.get("origin");
  if (origin === null) return null;
  let theirs: string;
  try {
    theirs = new URL(origin).origin;
  } catch {
    theirs = "null";
  }
  return theirs === own ? null : `Writes are accepted only from ${own}; this one came from ${theirs === "null" ? "an opaque origin" : theirs}.`;
}
