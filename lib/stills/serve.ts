import "server-only";
import fs from "node:fs";
import fsp from "node:fs/promises";
import { Readable } from "node:stream";
import type { Still } from "@/db/schema";
import { AppError } from "@/lib/api/errors";
import type { StillVariant } from "@/lib/stills/schemas";
import { ensureDerived, exists, variantPath } from "@/lib/stills/storage";

const ORIGINAL_TYPES: Record<string, { type: string; ext: string }> = {
  png: { type: "image/png", ext: "png" },
  jpeg: { type: "image/jpeg", ext: "jpg" },
  tiff: { type: "image/tiff", ext: "tif" },
  webp: { type: "image/webp", ext: "webp" },
};

/** Strong validator: the bytes of a variant are fixed by the content hash. */
function stillEtag(sha256: string, variant: StillVariant): string {
  return `"${sha256}-${variant}"`;
}

/** If-None-Match uses the weak comparison (RFC 9110 §13.1.2), so a W/ prefix still matches. */
function etagMatches(header: string | null, etag: string): boolean {
  if (!header) return false;
  if (header.trim() === "*") return true;
  return header.split(",").some((t) => t.trim().replace(/^W\//, "") === etag);
}

/**
 * Streams one stored file of a still with headers for confidential images: private,
 * no-store; nosniff; a content type from the content check, never from the upload; a
 * generated file name (the uploader's name never reaches a header).
 */
export async function serveStillFile(req: Request, still: Still, variant: StillVariant, options: { root?: string } = {}): Promise<Response> {
  const kind = variant === "original" ? ORIGINAL_TYPES[still.format] : { type: "image/webp", ext: "webp" };
  if (!kind) throw new AppError("internal", undefined, { cause: new Error(`Unknown stored format ${still.format}`) });
  const file = variantPath(still.sha256, variant, options.root);
  if (variant !== "original" && !(await exists(file))) {
    // Derived files are remade from the original if a crash or a sweep lost them.
    if (!(await exists(variantPath(still.sha256, "original", options.root)))) throw missing(still);
    await ensureDerived(still.sha256, options.root);
  }
  const etag = stillEtag(still.sha256, variant);
  const headers = new Headers({
    "Cache-Control": "private, no-store",
    "X-Content-Type-Options": "nosniff",
    ETag: etag,
  });
  if (etagMatches(req.headers.get("if-none-match"), etag)) return new Response(null, { status: 304, headers });
  const stat = await fsp.stat(file).catch(() => null);
  if (!stat) throw missing(still);
  headers.set("Content-Type", kind.type);
  headers.set("Content-Length", String(stat.size));
  headers.set("Content-Disposition", `inline; filename="still-${still.id}.${kind.ext}"`);
  const body = Readable.toWeb(fs.createReadStream(file)) as unknown as ReadableStream<Uint8Array>;
  return new Response(body, { status: 200, headers });
}

function missing(still: Still): AppError {
  return new AppError("not_found", "The file of this still is missing.", { cause: new Error(`Missing file for still ${still.id} (${still.sha256})`) });
}
