import "server-only";
import crypto from "node:crypto";
import fs from "node:fs/promises";
import sharp, { type Metadata } from "sharp";
import { AppError } from "@/lib/api/errors";
import { decodeStill } from "@/lib/lab/engine";
import { megapixels, STILL_PIXEL_LIMIT } from "@/lib/stills/limits";
import type { StillFormat } from "@/lib/stills/schemas";
import { StripError, stripMetadata } from "@/lib/stills/strip-metadata";

/** Decompression-bomb guard, the same limit the lab opens up to (lib/stills/limits.ts). */
export const PIXEL_LIMIT = STILL_PIXEL_LIMIT;

/** Width of the trial decode through the lab at upload: small, so it costs little beyond the full decode. */
const LAB_TRIAL_WIDTH = 64;

export type StillFacts = {
  format: StillFormat;
  width: number;
  height: number;
  /** Bits per channel as decoded: 8, 16, or 32 for float TIFF. */
  bitDepth: 8 | 16 | 32;
  /** 1 grey, 2 grey+alpha, 3 RGB, 4 RGBA. */
  channels: 1 | 2 | 3 | 4;
  /** libvips interpretation, e.g. srgb, rgb16, b-w, grey16, scrgb. */
  space: string;
};

const ALLOWED_SPACES: Record<string, "grey" | "rgb"> = {
  "b-w": "grey",
  grey16: "grey",
  srgb: "rgb",
  rgb: "rgb",
  rgb16: "rgb",
  scrgb: "rgb",
};

const DEPTH_BITS: Record<string, 8 | 16 | 32> = { uchar: 8, ushort: 16, float: 32 };

const ALLOWED_LIST = "PNG, JPEG, TIFF or WebP";

/**
 * The format the first bytes say, before any decoder sees them. Anything else (SVG, HTML,
 * PDF, GIF, text…) is refused here, so the XML and PDF loaders built into libvips never run
 * on an upload.
 */
export function sniffFormat(head: Uint8Array): StillFormat | null {
  const at = (i: number) => head[i] ?? -1;
  if ([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a].every((b, i) => at(i) === b)) return "png";
  if (at(0) === 0xff && at(1) === 0xd8 && at(2) === 0xff) return "jpeg";
  // Classic TIFF (42) and BigTIFF (43), both byte orders.
  if (at(0) === 0x49 && at(1) === 0x49 && (at(2) === 0x2a || at(2) === 0x2b) && at(3) === 0) return "tiff";
  if (at(0) === 0x4d && at(1) === 0x4d && at(2) === 0 && (at(3) === 0x2a || at(3) === 0x2b)) return "tiff";
  const ascii = (from: number, to: number) => String.fromCharCode(...Array.from(head.subarray(from, to)));
  if (head.length >= 12 && ascii(0, 4) === "RIFF" && ascii(8, 12) === "WEBP") return "webp";
  return null;
}

async function readHead(file: string | Buffer): Promise<Uint8Array> {
  if (Buffer.isBuffer(file)) return file.subarray(0, 16);
  const fh = await fs.open(file, "r");
  try {
    const buf = Buffer.alloc(16);
    const { bytesRead } = await fh.read(buf, 0, 16, 0);
    return buf.subarray(0, bytesRead);
  } finally {
    await fh.close();
  }
}

async function sizeOf(file: string | Buffer): Promise<number> {
  return Buffer.isBuffer(file) ? file.length : (await fs.stat(file)).size;
}

function tooManyPixels(width?: number, height?: number, cause?: unknown): AppError {
  const size = width && height ? `${width} × ${height} pixels (${megapixels(width * height)})` : `more than ${megapixels(PIXEL_LIMIT)}`;
  return new AppError("too_large", `The image is ${size}; Plateroom and its still lab accept at most ${megapixels(PIXEL_LIMIT)} (8192 × 8192).`, {
    cause,
    fields: { file: "Too many pixels." },
  });
}

function decodeFailure(error: unknown): AppError {
  const message = error instanceof Error ? error.message : String(error);
  if (/pixel limit/i.test(message)) return tooManyPixels(undefined, undefined, error);
  if (/unsupported image format/i.test(message)) {
    return new AppError("unsupported_type", `This is not a ${ALLOWED_LIST} image.`, { cause: error });
  }
  return new AppError("validation_failed", "The image is damaged or incomplete and could not be read to the end.", {
    cause: error,
    fields: { file: "Damaged or incomplete image." },
  });
}

/**
 * Identifies an upload by its content only (never its name or the browser's MIME type),
 * and decodes every pixel once so truncated or corrupt files are refused now rather than
 * at first view. Throws AppError 400 (empty, damaged), 413 (too many pixels) or 415 (type).
 */
export async function inspectStill(file: string | Buffer): Promise<StillFacts> {
  if ((await sizeOf(file)) === 0) {
    throw new AppError("validation_failed", "The file is empty.", { fields: { file: "The file is empty." } });
  }
  const sniffed = sniffFormat(await readHead(file));
  if (!sniffed) throw new AppError("unsupported_type", `This is not a ${ALLOWED_LIST} image. Plateroom checks the file's content, not its name.`);

  let meta: Metadata;
  try {
    // The header's size is checked below with a message that names it; this guard is for the decode.
    meta = await sharp(file, { limitInputPixels: false }).metadata();
  } catch (error) {
    throw decodeFailure(error);
  }
  if (meta.format !== sniffed) {
    throw new AppError("unsupported_type", `This is not a ${ALLOWED_LIST} image.`);
  }
  const { width, height } = meta;
  if (!width || !height) throw new AppError("validation_failed", "The image has no size.", { fields: { file: "The image has no size." } });
  if (width * height > PIXEL_LIMIT) throw tooManyPixels(width, height);
  if ((meta.pages ?? 1) > 1) {
    throw new AppError("unsupported_type", "Animated and multi-page images are not accepted; export a single frame.");
  }
  if (meta.space === "cmyk") throw new AppError("unsupported_type", "CMYK images are not accepted; export the still as RGB or grey.");
  const family = meta.space ? ALLOWED_SPACES[meta.space] : undefined;
  if (!family) throw new AppError("unsupported_type", `Images in the ${meta.space ?? "unknown"} colour space are not accepted; export as RGB or grey.`);
  const bitDepth = DEPTH_BITS[meta.depth];
  if (!bitDepth || (bitDepth === 32 && meta.format !== "tiff")) {
    throw new AppError("unsupported_type", `Samples of type ${meta.depth} are not accepted; use 8 or 16 bits per channel.`);
  }
  const channels = meta.channels;
  const channelsFit = family === "grey" ? channels === 1 || channels === 2 : channels === 3 || channels === 4;
  if (!channelsFit) throw new AppError("unsupported_type", `An image with ${channels} channels in ${meta.space} is not accepted; use grey, RGB or RGBA.`);

  try {
    // Full decode, streamed through libvips without holding the pixels. libjpeg reports
    // corrupt entropy data only as a warning, so JPEG is held to warnings; libpng and
    // libtiff warn about harmless things (unknown tags, odd profiles), so they are held to errors.
    await sharp(file, { limitInputPixels: PIXEL_LIMIT, failOn: sniffed === "jpeg" ? "warning" : "error", sequentialRead: true }).stats();
  } catch (error) {
    throw decodeFailure(error);
  }
  // A still is accepted only if the lab opens it: its own decode, at a small width.
  try {
    await decodeStill(Buffer.isBuffer(file) ? file : await fs.readFile(file), LAB_TRIAL_WIDTH);
  } catch (error) {
    throw new AppError("unsupported_type", "The still lab cannot open this image; export it as 8- or 16-bit RGB or grey.", { cause: error });
  }
  return { format: sniffed, width, height, bitDepth, channels: channels as StillFacts["channels"], space: meta.space ?? "srgb" };
}

export type PreparedOriginal = { facts: StillFacts; path: string; sha256: string; size: number };

/**
 * The original as it will be stored: identifying metadata removed (lib/stills/strip-metadata.ts),
 * then checked like any upload. Writes the cleaned bytes to `target` (a fresh incoming path,
 * created here); the caller owns it. A file whose structure cannot be taken apart is refused
 * with the message its decode gives, or 415 if it decodes.
 */
export async function prepareOriginal(file: string, target: string): Promise<PreparedOriginal> {
  const sniffed = sniffFormat(await readHead(file));
  if (!sniffed) {
    await inspectStill(file);
    throw new AppError("unsupported_type", `This is not a ${ALLOWED_LIST} image.`);
  }
  let cleaned: Buffer;
  try {
    cleaned = stripMetadata(await fs.readFile(file), sniffed);
  } catch (error) {
    if (!(error instanceof StripError)) throw error;
    await inspectStill(file);
    throw new AppError("unsupported_type", "Plateroom cannot take this file's metadata apart from its pixels; export it again as a plain file.", { cause: error });
  }
  const facts = await inspectStill(cleaned);
  await fs.writeFile(target, cleaned, { flag: "wx", mode: 0o600 });
  return { facts, path: target, sha256: crypto.createHash("sha256").update(cleaned).digest("hex"), size: cleaned.length };
}
