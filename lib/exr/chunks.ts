import {
  ExrFormatError,
  LINES_PER_CHUNK,
  PIXEL_BYTES,
  windowSize,
  type ExrHeader,
  type ExrPart,
  type TileDesc,
} from "@/lib/exr/header";

/*
 * The chunk tables of an OpenEXR file ("OpenEXR File Layout": after the header(s) one table
 * of uint64 file offsets per part, then the chunks; a scan-line chunk starts with int32 y and
 * int32 size, a tile with int32 tile x, tile y, level x, level y and size; in a multi-part
 * file every chunk starts with its int32 part number). Only full-resolution chunks are read
 * (level 0 of tiled files); every one is checked against the file before any decoding.
 */

export type ChunkRef = {
  /** Where the compressed data starts in the file, and how many bytes it has. */
  dataStart: number;
  dataSize: number;
  /** Uncompressed size of the block (all channels). */
  rawSize: number;
  /** Pixel rectangle of the block, relative to the data window's top-left corner. */
  x: number;
  y: number;
  width: number;
  height: number;
  /** Tile coordinates (tiled parts) or chunk index (scan lines). */
  tileX: number;
  tileY: number;
};

export type PartChunks = { tiled: boolean; chunks: ChunkRef[]; tileWidth: number; tileHeight: number };

function damaged(message: string): never {
  throw new ExrFormatError("damaged", message);
}

/** floor or ceil of log2 for positive integers, by integer steps (no float edge cases). */
function log2Int(x: number, up: boolean): number {
  let n = 0;
  while (2 ** (n + 1) <= x) n++;
  return up && 2 ** n < x ? n + 1 : n;
}

function levelSize(size: number, level: number, up: boolean): number {
  const d = 2 ** level;
  return Math.max(1, up ? Math.ceil(size / d) : Math.floor(size / d));
}

/** Chunks in the offset table of a part (all levels), computed from its header. */
export function expectedChunkCount(part: ExrPart): number {
  const { width, height } = windowSize(part.dataWindow);
  if (!part.tiles) return Math.ceil(height / LINES_PER_CHUNK[part.compression]);
  const t: TileDesc = part.tiles;
  const up = t.roundingMode === "up";
  const tilesAt = (lx: number, ly: number) => Math.ceil(levelSize(width, lx, up) / t.xSize) * Math.ceil(levelSize(height, ly, up) / t.ySize);
  if (t.levelMode === "one") return tilesAt(0, 0);
  if (t.levelMode === "mipmap") {
    let total = 0;
    const levels = log2Int(Math.max(width, height), up) + 1;
    for (let l = 0; l < levels; l++) total += tilesAt(l, l);
    return total;
  }
  let total = 0;
  const nx = log2Int(width, up) + 1, ny = log2Int(height, up) + 1;
  for (let ly = 0; ly < ny; ly++) for (let lx = 0; lx < nx; lx++) total += tilesAt(lx, ly);
  return total;
}

/** Bytes of one uncompressed block of `width` × `height` pixels over all channels (full sampling). */
export function rawBlockSize(part: ExrPart, width: number, height: number): number {
  let perPixel = 0;
  for (const c of part.channels) perPixel += PIXEL_BYTES[c.pixelType];
  return perPixel * width * height;
}

function readOffset(view: DataView, at: number): number {
  const v = view.getBigUint64(at, true);
  return v > BigInt(Number.MAX_SAFE_INTEGER) ? Number.MAX_SAFE_INTEGER : Number(v);
}

/**
 * Reads the offset tables and returns the full-resolution chunks of one part, each checked:
 * the offset lies after the tables and inside the file, the chunk says the part, position and
 * level it should, and its data fits in the file and is no larger than uncompressed.
 * Throws ExrFormatError("damaged") for a truncated or lying file.
 */
export function partChunks(bytes: Uint8Array, header: ExrHeader, partIndex: number): PartChunks {
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  let tableStart = header.headerEnd;
  const counts = header.parts.map((p) => {
    const expected = expectedChunkCount(p);
    if (p.chunkCount !== null && p.chunkCount !== expected) damaged(`Part ${p.index} declares ${p.chunkCount} chunks; its size needs ${expected}.`);
    return expected;
  });
  const total = counts.reduce((a, b) => a + b, 0);
  const tablesEnd = header.headerEnd + total * 8;
  if (tablesEnd > bytes.length) damaged("The file ends inside its chunk offset table (truncated, or a header that promises more than the file holds).");
  for (let p = 0; p < partIndex; p++) tableStart += counts[p]! * 8;

  const part = header.parts[partIndex]!;
  const { width, height } = windowSize(part.dataWindow);
  const tiled = part.tiles !== null;
  const tileWidth = part.tiles?.xSize ?? width;
  const tileHeight = part.tiles?.ySize ?? LINES_PER_CHUNK[part.compression];
  const tilesX = Math.ceil(width / tileWidth);
  const level0 = tiled ? tilesX * Math.ceil(height / tileHeight) : counts[partIndex]!;
  const prefix = header.multipart ? 4 : 0;
  const headSize = prefix + (tiled ? 20 : 8);
  const chunks: ChunkRef[] = [];
  for (let i = 0; i < level0; i++) {
    const offset = readOffset(view, tableStart + i * 8);
    if (offset === 0) damaged("The file is incomplete: a chunk was never written.");
    if (offset < tablesEnd || offset + headSize > bytes.length) damaged(`Chunk ${i} points outside the file.`);
    if (header.multipart && view.getInt32(offset, true) !== partIndex) damaged(`Chunk ${i} belongs to another part.`);
    const at = offset + prefix;
    const tileX = tiled ? i % tilesX : 0;
    const tileY = tiled ? Math.floor(i / tilesX) : i;
    let dataSize: number;
    if (tiled) {
      const [tx, ty, lx, ly] = [0, 4, 8, 12].map((o) => view.getInt32(at + o, true));
      if (tx !== tileX || ty !== tileY || lx !== 0 || ly !== 0) damaged(`Tile ${i} is not the tile its offset entry names.`);
      dataSize = view.getInt32(at + 16, true);
    } else {
      const y = view.getInt32(at, true);
      if (y !== part.dataWindow.yMin + i * tileHeight) damaged(`Chunk ${i} holds line ${y}, not the line its offset entry names.`);
      dataSize = view.getInt32(at + 4, true);
    }
    const x0 = tileX * tileWidth, y0 = tileY * tileHeight;
    const w = Math.min(tileWidth, width - x0), h = Math.min(tileHeight, height - y0);
    const rawSize = rawBlockSize(part, w, h);
    const dataStart = offset + headSize;
    if (dataSize <= 0 || dataStart + dataSize > bytes.length) damaged(`Chunk ${i} runs past the end of the file (truncated?).`);
    if (dataSize > rawSize) damaged(`Chunk ${i} is larger than its pixels uncompressed.`);
    if (part.compression === "none" && dataSize !== rawSize) damaged(`Chunk ${i} has the wrong size for uncompressed data.`);
    chunks.push({ dataStart, dataSize, rawSize, x: x0, y: y0, width: w, height: h, tileX, tileY });
  }
  return { tiled, chunks, tileWidth, tileHeight };
}
