import "server-only";
import fs from "node:fs/promises";
import sharp, { type Metadata } from "sharp";
import { AppError } from "@/lib/api/errors";
import { isExr } from "@/lib/exr/header";
import { decodeExrUpload, toExrInfo } from "@/lib/stills/exr";
import type { StillExrInfo, StillFormat } from "@/lib/stills/schemas";

/** Decompression-bomb guard: a small file may declare a huge image (OWASP File Upload Cheat Sheet). */
export const PIXEL_LIMIT = 100_000_000;

export type StillFacts = {
  format: StillFormat;
  width: number;
  height: number;
  /** Bits per channel as decoded: 8, 16, or 32 for float TIFF. */
  bitDepth: 8 | 16 | 32;
  /** 1 grey, 2 grey+alpha, 3 RGB, 4 RGBA. */
  channels: 1 | 2 | 3 | 4;
  /** libvips interpretation, e.g. srgb, rgb16, b-w, grey16, scrgb; "exr" for OpenEXR. */
  space: string;
  pixelAspectRatio: number;
  /** OpenEXR: layout, layers and the colour space its chromaticities name. */
  exr?: StillExrInfo;
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

const ALLOWED_LIST = "PNG, JPEG, TIFF, WebP or OpenEXR";

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
  if (isExr(head)) return "exr";
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

function decodeFailure(error: unknown): AppError {
  const message = error instanceof Error ? error.message : String(error);
  if (/pixel limit/i.test(message)) {
    return new AppError("too_large", `The image has more than ${PIXEL_LIMIT / 1_000_000} megapixels, the most Plateroom accepts.`, { cause: error });
  }
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
export async function inspectStill(file: string | Buffer, options: { layer?: string; sha256?: string; root?: string } = {}): Promise<StillFacts> {
  if ((await sizeOf(file)) === 0) {
    throw new AppError("validation_failed", "The file is empty.", { fields: { file: "The file is empty." } });
  }
  const sniffed = sniffFormat(await readHead(file));
  if (!sniffed) throw new AppError("unsupported_type", `This is not a ${ALLOWED_LIST} image. Plateroom checks the file's content, not its name.`);
  if (sniffed === "exr") return inspectExrStill(file, options);
  if (options.layer) throw new AppError("validation_failed", "Only OpenEXR files have layers to choose from.", { fields: { layer: "Leave empty for this file." } });

  let meta: Metadata;
  try {
    meta = await sharp(file, { limitInputPixels: PIXEL_LIMIT }).metadata();
  } catch (error) {
    throw decodeFailure(error);
  }
  if (meta.format !== sniffed) {
    throw new AppError("unsupported_type", `This is not a ${ALLOWED_LIST} image.`);
  }
  const { width, height } = meta;
  if (!width || !height) throw new AppError("validation_failed", "The image has no size.", { fields: { file: "The image has no size." } });
  if (width * height > PIXEL_LIMIT) throw decodeFailure(new Error("pixel limit"));
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
  return { format: sniffed, width, height, bitDepth, channels: channels as StillFacts["channels"], space: meta.space ?? "srgb", pixelAspectRatio: 1 };
}

/** OpenEXR: the header, layout and every chunk checked, then every sample of the chosen layer decoded. */
async function inspectExrStill(file: string | Buffer, options: { layer?: string; sha256?: string; root?: string }): Promise<StillFacts> {
  const bytes = Buffer.isBuffer(file) ? file : await fs.readFile(file);
  const decoded = decodeExrUpload(bytes, { layer: options.layer, sha256: options.sha256, root: options.root, maxPixels: PIXEL_LIMIT });
  const { info } = decoded;
  return {
    format: "exr",
    width: decoded.width,
    height: decoded.height,
    bitDepth: info.pixelType === "half" ? 16 : 32,
    channels: decoded.channels,
    space: "exr",
    pixelAspectRatio: info.pixelAspectRatio,
    exr: toExrInfo(decoded),
  };
}
