import "server-only";
import type { StillFormat } from "@/lib/stills/schemas";

/*
 * Removes identifying metadata from an original without decoding it (shared/PRODUCT.md,
 * "Confidentiality"; OWASP File Upload Cheat Sheet). Each format is rebuilt from an allow-list
 * of the parts that carry pixels or colour (ICC profile, gamma, chromaticities, bit depth,
 * sample layout), copied byte for byte; everything else — EXIF (with GPS and camera), XMP, IPTC,
 * comments, text chunks, TIFF tags naming people, places or software, embedded thumbnails and
 * bytes after the image's end — is left out. Pixel data is never re-encoded, so the decoded
 * values stay exactly as uploaded.
 */

export class StripError extends Error {
  constructor(message: string) {
    super(message);
    this.name = "StripError";
  }
}

export function stripMetadata(bytes: Buffer, format: StillFormat): Buffer {
  switch (format) {
    case "png":
      return stripPng(bytes);
    case "jpeg":
      return stripJpeg(bytes);
    case "tiff":
      return stripTiff(bytes);
    case "webp":
      return stripWebp(bytes);
  }
}

function need(condition: boolean, what: string): asserts condition {
  if (!condition) throw new StripError(what);
}

// ---- PNG (ISO/IEC 15948, PNG 3rd edition chunk list) ----

/** Critical chunks and the ancillary ones about colour and sample layout. */
const PNG_KEEP = new Set(["IHDR", "PLTE", "IDAT", "IEND", "tRNS", "cHRM", "gAMA", "iCCP", "sBIT", "sRGB", "cICP", "mDCV", "cLLI", "bKGD", "pHYs"]);

const PNG_IEND = Buffer.from("0000000049454e44ae426082", "hex");

function stripPng(bytes: Buffer): Buffer {
  need(bytes.length >= 8, "truncated PNG");
  const parts: Buffer[] = [bytes.subarray(0, 8)];
  let at = 8;
  for (;;) {
    if (at === bytes.length && parts.length > 1) {
      // Every chunk whole but no IEND: decoders accept it; the stored file gets its end marker.
      parts.push(PNG_IEND);
      break;
    }
    need(at + 12 <= bytes.length, "truncated PNG chunk");
    const length = bytes.readUInt32BE(at);
    const type = bytes.toString("latin1", at + 4, at + 8);
    const end = at + 12 + length;
    need(end <= bytes.length, `truncated PNG ${type} chunk`);
    if (PNG_KEEP.has(type)) parts.push(bytes.subarray(at, end));
    at = end;
    if (type === "IEND") break;
  }
  return Buffer.concat(parts);
}

// ---- JPEG (ITU-T T.81 markers; JFIF, ICC.1 Annex B, Adobe APP14) ----

function startsWith(bytes: Buffer, at: number, text: string): boolean {
  return bytes.toString("latin1", at, at + text.length) === text;
}

/** Whether a marker segment is kept: everything that decodes the image, and colour. */
function keepJpegSegment(marker: number, bytes: Buffer, dataAt: number): boolean {
  if (marker === 0xe0) return startsWith(bytes, dataAt, "JFIF\0"); // not JFXX (a thumbnail)
  if (marker === 0xe2) return startsWith(bytes, dataAt, "ICC_PROFILE\0");
  if (marker === 0xee) return startsWith(bytes, dataAt, "Adobe"); // colour transform flag
  if (marker >= 0xe0 && marker <= 0xef) return false; // Exif, XMP, IPTC/Photoshop, MPF, …
  if (marker === 0xfe) return false; // COM
  return true;
}

function stripJpeg(bytes: Buffer): Buffer {
  need(bytes[0] === 0xff && bytes[1] === 0xd8, "not a JPEG");
  const parts: Buffer[] = [bytes.subarray(0, 2)];
  let at = 2;
  for (;;) {
    while (at < bytes.length && bytes[at] === 0xff && bytes[at + 1] === 0xff) at++; // fill bytes
    need(at + 2 <= bytes.length && bytes[at] === 0xff, "JPEG marker expected");
    const marker = bytes[at + 1]!;
    if (marker === 0xd9) {
      parts.push(bytes.subarray(at, at + 2));
      break;
    }
    need(!(marker >= 0xd0 && marker <= 0xd8) && marker !== 0x01, "unexpected JPEG marker");
    need(at + 4 <= bytes.length, "truncated JPEG segment");
    const end = at + 2 + bytes.readUInt16BE(at + 2);
    need(end <= bytes.length, "truncated JPEG segment");
    if (keepJpegSegment(marker, bytes, at + 4)) parts.push(bytes.subarray(at, end));
    at = end;
    if (marker !== 0xda) continue;
    // Entropy-coded data runs to the next marker that is neither a stuffed 0xFF00 nor a restart.
    const scanStart = at;
    while (at + 1 < bytes.length) {
      if (bytes[at] === 0xff) {
        const next = bytes[at + 1]!;
        if (next !== 0x00 && !(next >= 0xd0 && next <= 0xd7) && next !== 0xff) break;
      }
      at++;
    }
    need(at + 1 < bytes.length, "JPEG ends inside its image data");
    parts.push(bytes.subarray(scanStart, at));
  }
  return Buffer.concat(parts);
}

// ---- TIFF (TIFF 6.0; BigTIFF) ----

/** Tags that describe pixels, their layout and colour (TIFF 6.0 baseline and extensions, ICC). */
const TIFF_KEEP = new Set([
  254, 255, 256, 257, 258, 259, 262, 263, 264, 265, 266, 273, 274, 277, 278, 279, 280, 281, 282, 283, 284, 286, 287, 290, 291, 292, 293, 296, 301,
  317, 318, 319, 320, 321, 322, 323, 324, 325, 332, 338, 339, 340, 341, 342, 347, 529, 530, 531, 532, 34675,
]);
const STRIP_OFFSETS = 273, STRIP_COUNTS = 279, TILE_OFFSETS = 324, TILE_COUNTS = 325;
const TYPE_SIZE: Record<number, number> = { 1: 1, 2: 1, 3: 2, 4: 4, 5: 8, 6: 1, 7: 1, 8: 2, 9: 4, 10: 8, 11: 4, 12: 8, 13: 4, 16: 8, 17: 8, 18: 8 };

type TiffEntry = { tag: number; type: number; count: number; value: Buffer };

function stripTiff(bytes: Buffer): Buffer {
  need(bytes.length >= 8, "truncated TIFF");
  const le = bytes.toString("latin1", 0, 2) === "II";
  need(le || bytes.toString("latin1", 0, 2) === "MM", "not a TIFF");
  const u16 = (o: number) => (le ? bytes.readUInt16LE(o) : bytes.readUInt16BE(o));
  const u32 = (o: number) => (le ? bytes.readUInt32LE(o) : bytes.readUInt32BE(o));
  const u64 = (o: number) => Number(le ? bytes.readBigUInt64LE(o) : bytes.readBigUInt64BE(o));
  const big = u16(2) === 43;
  need(big || u16(2) === 42, "not a TIFF");
  const ifdAt = big ? u64(8) : u32(4);
  const entrySize = big ? 20 : 12;
  const inlineSize = big ? 8 : 4;
  need(ifdAt + (big ? 8 : 2) <= bytes.length, "TIFF directory outside the file");
  const count = big ? u64(ifdAt) : u16(ifdAt);
  const first = ifdAt + (big ? 8 : 2);
  need(first + count * entrySize + (big ? 8 : 4) <= bytes.length, "truncated TIFF directory");
  // A further directory is another page or a thumbnail: left to the upload check, which refuses pages.
  const nextAt = first + count * entrySize;
  need((big ? u64(nextAt) : u32(nextAt)) === 0, "TIFF with more than one directory");

  const entries: TiffEntry[] = [];
  const read = new Map<number, TiffEntry>();
  for (let i = 0; i < count; i++) {
    const e = first + i * entrySize;
    const tag = u16(e), type = u16(e + 2);
    const n = big ? u64(e + 4) : u32(e + 4);
    const size = TYPE_SIZE[type];
    if (size === undefined) continue; // an unknown type cannot be one of the kept tags
    const length = size * n;
    const valueAt = length <= inlineSize ? e + (big ? 12 : 8) : big ? u64(e + 12) : u32(e + 8);
    need(valueAt + length <= bytes.length, `TIFF tag ${tag} outside the file`);
    const entry = { tag, type, count: n, value: Buffer.from(bytes.subarray(valueAt, valueAt + length)) };
    read.set(tag, entry);
    if (TIFF_KEEP.has(tag)) entries.push(entry);
  }
  const compression = read.get(259);
  need(!compression || readUnsigned(compression, 0, le) !== 6, "old-style JPEG in TIFF is not supported");

  const tiled = read.has(TILE_OFFSETS);
  const offsetsTag = tiled ? TILE_OFFSETS : STRIP_OFFSETS;
  const offsets = read.get(offsetsTag), counts = read.get(tiled ? TILE_COUNTS : STRIP_COUNTS);
  need(Boolean(offsets && counts && offsets.count === counts.count), "TIFF without image data");
  const chunks: Buffer[] = [];
  for (let i = 0; i < offsets!.count; i++) {
    const from = readUnsigned(offsets!, i, le), length = readUnsigned(counts!, i, le);
    need(from + length <= bytes.length, "TIFF image data outside the file");
    chunks.push(bytes.subarray(from, from + length));
  }

  // Layout: header, directory, out-of-line values, image data; every offset even (TIFF 6.0, "word boundary").
  const kept = entries.sort((a, b) => a.tag - b.tag);
  const headerSize = big ? 16 : 8;
  const dirSize = (big ? 8 : 2) + kept.length * entrySize + (big ? 8 : 4);
  const offsetType = big ? 16 : 4;
  const offsetSize = big ? 8 : 4;
  const offsetEntry = kept.find((e) => e.tag === offsetsTag)!;
  offsetEntry.type = offsetType;
  offsetEntry.value = Buffer.alloc(offsetEntry.count * offsetSize);
  const even = (n: number) => n + (n % 2);
  let cursor = headerSize + dirSize;
  const valueAt = new Map<TiffEntry, number>();
  for (const e of kept) {
    if (e.value.length <= inlineSize) continue;
    cursor = even(cursor);
    valueAt.set(e, cursor);
    cursor += e.value.length;
  }
  const chunkAt: number[] = [];
  for (const c of chunks) {
    cursor = even(cursor);
    chunkAt.push(cursor);
    cursor += c.length;
  }
  chunkAt.forEach((at, i) => writeUnsigned(offsetEntry.value, i * offsetSize, at, offsetSize, le));

  const out = Buffer.alloc(cursor);
  const w16 = (o: number, v: number) => (le ? out.writeUInt16LE(v, o) : out.writeUInt16BE(v, o));
  const wN = (o: number, v: number, size: number) => writeUnsigned(out, o, v, size, le);
  bytes.copy(out, 0, 0, 2);
  w16(2, big ? 43 : 42);
  if (big) {
    w16(4, 8);
    w16(6, 0);
  }
  wN(big ? 8 : 4, headerSize, offsetSize);
  let e = headerSize;
  wN(e, kept.length, big ? 8 : 2);
  e += big ? 8 : 2;
  for (const entry of kept) {
    w16(e, entry.tag);
    w16(e + 2, entry.type);
    wN(e + 4, entry.count, offsetSize);
    const at = valueAt.get(entry);
    if (at === undefined) entry.value.copy(out, e + (big ? 12 : 8));
    else {
      wN(e + (big ? 12 : 8), at, offsetSize);
      entry.value.copy(out, at);
    }
    e += entrySize;
  }
  // Next directory: none (further pages and thumbnails are left out).
  chunks.forEach((c, i) => c.copy(out, chunkAt[i]!));
  return out;
}

function readUnsigned(entry: TiffEntry, i: number, le: boolean): number {
  const size = TYPE_SIZE[entry.type]!;
  const o = i * size;
  if (size === 2) return le ? entry.value.readUInt16LE(o) : entry.value.readUInt16BE(o);
  if (size === 4) return le ? entry.value.readUInt32LE(o) : entry.value.readUInt32BE(o);
  if (size === 8) return Number(le ? entry.value.readBigUInt64LE(o) : entry.value.readBigUInt64BE(o));
  return entry.value[o]!;
}

function writeUnsigned(buf: Buffer, at: number, value: number, size: number, le: boolean): void {
  if (size === 2) {
    if (le) buf.writeUInt16LE(value, at);
    else buf.writeUInt16BE(value, at);
  } else if (size === 4) {
    if (le) buf.writeUInt32LE(value, at);
    else buf.writeUInt32BE(value, at);
  } else if (le) buf.writeBigUInt64LE(BigInt(value), at);
  else buf.writeBigUInt64BE(BigInt(value), at);
}

// ---- WebP (RIFF container, RFC 9649) ----

// ANIM/ANMF stay so the upload check still sees (and refuses) an animation.
const WEBP_KEEP = new Set(["VP8 ", "VP8L", "VP8X", "ALPH", "ICCP", "ANIM", "ANMF"]);
const VP8X_EXIF = 0x08, VP8X_XMP = 0x04;

function stripWebp(bytes: Buffer): Buffer {
  need(bytes.length >= 12 && startsWith(bytes, 0, "RIFF") && startsWith(bytes, 8, "WEBP"), "not a WebP");
  const end = Math.min(bytes.length, 8 + bytes.readUInt32LE(4));
  const parts: Buffer[] = [];
  let at = 12;
  while (at + 8 <= end) {
    const fourcc = bytes.toString("latin1", at, at + 4);
    const size = bytes.readUInt32LE(at + 4);
    const next = at + 8 + size + (size % 2);
    need(at + 8 + size <= end, `truncated WebP ${fourcc} chunk`);
    if (WEBP_KEEP.has(fourcc)) {
      const chunk = Buffer.from(bytes.subarray(at, Math.min(next, end)));
      if (fourcc === "VP8X") chunk[8] = chunk[8]! & ~(VP8X_EXIF | VP8X_XMP);
      parts.push(chunk);
    }
    at = next;
  }
  const body = Buffer.concat(parts);
  const header = Buffer.from("RIFF\0\0\0\0WEBP", "latin1");
  header.writeUInt32LE(4 + body.length, 4);
  return Buffer.concat([header, body]);
}
