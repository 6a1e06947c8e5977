import "server-only";
import zlib from "node:zlib";
import { FloatType, RGBAFormat } from "three";
import { EXRLoader } from "three/examples/jsm/loaders/EXRLoader.js";
import { partChunks, type ChunkRef } from "@/lib/exr/chunks";
import {
  COMPRESSION_NAMES,
  ExrFormatError,
  parseExrHeader,
  windowSize,
  type Box2i,
  type ExrChannel,
  type ExrHeader,
  type ExrPart,
  type ExrPixelType,
} from "@/lib/exr/header";
import { defaultLayer, layerChannelCount, listLayers, type ExrLayer } from "@/lib/exr/layers";
import { attr, ByteBuilder, preamble } from "@/lib/exr/write";
import { megapixels } from "@/lib/stills/limits";

/*
 * OpenEXR decoding with the `three` package's pure-JavaScript reader (examples/jsm/loaders/
 * EXRLoader.js). That reader decodes the default layer of a whole file front to back and
 * trusts it; Plateroom reads the layout itself first (lib/exr/header.ts, chunks.ts), checks
 * every chunk, and then hands the reader small well-formed files of its own making, one band
 * of rows at a time:
 *   - only full-resolution chunks, in order, whatever the file's line order, tiling levels
 *     or number of parts;
 *   - the chosen layer's channels renamed R, G, B, A (or Y), every other channel renamed so
 *     the reader skips it (its bytes stay where they are);
 *   - the band's rows land in the display window, top row first (the reader stores rows
 *     bottom-up), with zeros where the data window does not reach.
 * Before the reader sees a chunk, its zlib streams are inflated natively with an output cap
 * (a decompression bomb stops at the cap) and run-length data is measured.
 */

export type ExrInfo = {
  compression: string;
  tiled: boolean;
  parts: number;
  dataWindow: Box2i;
  displayWindow: Box2i;
  pixelAspectRatio: number;
  layers: { id: string; label: string; kind: ExrLayer["kind"] }[];
  layer: string;
  /** The layer chosen when none is asked for. */
  defaultLayer: string;
  /** Sample type of the chosen channels ("mixed" when they differ). */
  pixelType: ExrPixelType | "mixed";
  chromaticities: ExrPart["chromaticities"];
};

export type DecodedExr = {
  /** The display window's size: the image's frame. */
  width: number;
  height: number;
  channels: 1 | 3 | 4;
  /** Interleaved samples, top row first, display window; values as stored (never clipped). */
  data: Float32Array;
  info: ExrInfo;
};

export type ExrReadOptions = {
  /** Layer id from listLayers; the default layer when absent. */
  layer?: string | null;
  /** Largest data or display window accepted, in pixels (lib/stills/inspect.ts PIXEL_LIMIT). */
  maxPixels: number;
  /** Rows are decoded in bands of about this many pixels (memory stays near the output size). */
  bandPixels?: number;
};

const DEFAULT_BAND_PIXELS = 1 << 20;

function unsupported(message: string): never {
  throw new ExrFormatError("unsupported", message);
}

/** Header, layer and layout checks; everything that can be said without touching pixel data. */
export function inspectExr(bytes: Uint8Array, options: Omit<ExrReadOptions, "bandPixels">): { header: ExrHeader; part: ExrPart; layer: ExrLayer; info: ExrInfo } {
  const header = parseExrHeader(bytes);
  const layers = listLayers(header);
  const layer = options.layer ? layers.find((l) => l.id === options.layer) : defaultLayer(layers);
  if (!layer) throw new ExrFormatError("damaged", options.layer ? `The file has no layer “${options.layer}”.` : "The file has no channels to show.");
  const part = header.parts[layer.part]!;
  checkPixelLimit(header, options.maxPixels);
  checkDecodable(part, layer);
  const types = new Set(layer.pixelTypes);
  return {
    header,
    part,
    layer,
    info: {
      compression: COMPRESSION_NAMES[part.compression],
      tiled: part.tiles !== null,
      parts: header.parts.length,
      dataWindow: part.dataWindow,
      displayWindow: part.displayWindow,
      pixelAspectRatio: part.pixelAspectRatio,
      layers: layers.map((l) => ({ id: l.id, label: l.label, kind: l.kind })),
      layer: layer.id,
      defaultLayer: defaultLayer(layers)?.id ?? layer.id,
      pixelType: types.size === 1 ? layer.pixelTypes[0]! : "mixed",
      chromaticities: part.chromaticities,
    },
  };
}

/** Refuses a file any of whose windows holds more pixels than `maxPixels` (before anything is allocated for it). */
export function checkPixelLimit(header: ExrHeader, maxPixels: number): void {
  for (const part of header.parts) {
    for (const window of [part.dataWindow, part.displayWindow]) {
      const { width, height } = windowSize(window);
      if (width * height > maxPixels) {
        throw new ExrFormatError("too_large", `The image is ${width} × ${height} pixels (${megapixels(width * height)}); Plateroom and its still lab accept at most ${megapixels(maxPixels)}.`);
      }
    }
  }
}

/** The reader's limits, said in words before it is asked (each would give wrong pixels or fail). */
function checkDecodable(part: ExrPart, layer: ExrLayer): void {
  const name = COMPRESSION_NAMES[part.compression];
  if (part.channels.some((c) => c.xSampling !== 1 || c.ySampling !== 1)) {
    unsupported("OpenEXR files with sub-sampled channels (such as luminance/chroma images) are not accepted; save the image as RGB.");
  }
  if (layer.pixelTypes.includes("uint")) unsupported(`Channel ${layer.channels[0]} holds whole numbers (UINT), not colour; pick another layer.`);
  const types = new Set(part.channels.map((c) => c.pixelType));
  if (part.compression === "piz" && types.size > 1) unsupported("PIZ-compressed files whose channels mix half and float samples cannot be read; re-save with ZIP.");
  if (part.compression === "pxr24" && types.has("uint")) unsupported("PXR24-compressed files with UINT channels cannot be read; re-save with ZIP.");
  if (part.compression === "dwaa" || part.compression === "dwab") {
    const roles = part.channels.map((c) => c.name.slice(c.name.lastIndexOf(".") + 1));
    const colourChannels = roles.filter((r) => r === "R" || r === "G" || r === "B");
    if (roles.some((r) => !["R", "G", "B", "A", "Y"].includes(r)) || colourChannels.length > 3 || types.size > 1 || types.has("uint")) {
      unsupported(`${name}-compressed files are read only with one RGB(A) or Y layer of one sample type; re-save with ZIP or PIZ.`);
    }
  }
}

/** Decodes the chosen layer of an OpenEXR file into the display window. Throws ExrFormatError. */
export function decodeExr(bytes: Uint8Array, options: ExrReadOptions): DecodedExr {
  const { header, part, layer, info } = inspectExr(bytes, options);
  const { chunks, tiled, tileWidth, tileHeight } = partChunks(bytes, header, layer.part);
  for (const c of chunks) guardChunk(bytes, part, c);
  const display = windowSize(part.displayWindow);
  const channels = layerChannelCount(layer);
  const out = new Float32Array(display.width * display.height * channels);
  const bandRows = Math.max(1, Math.floor((options.bandPixels ?? DEFAULT_BAND_PIXELS) / Math.max(1, windowSize(part.dataWindow).width * tileHeight)));
  // One pass per sample type: the reader reads every chosen channel with one sample type.
  const passes = new Set(layer.pixelTypes).size === 1 ? [layer.channels.map((_, i) => i)] : layer.channels.map((_, i) => [i]);
  const rows = new Map<number, ChunkRef[]>();
  for (const c of chunks) rows.set(c.tileY, [...(rows.get(c.tileY) ?? []), c]);
  const rowKeys = [...rows.keys()].sort((a, b) => a - b);
  for (let i = 0; i < rowKeys.length; i += bandRows) {
    const band = rowKeys.slice(i, i + bandRows).flatMap((k) => rows.get(k)!);
    for (const pass of passes) {
      const rgba = readBand(bytes, part, layer, pass, band, tiled, tileWidth, tileHeight);
      placeBand(rgba, band, part, layer, pass, out, channels, display.width, display.height);
    }
  }
  return { width: display.width, height: display.height, channels, data: out, info };
}

/**
 * Runs the reader on a file holding only this band's chunks. `pass` lists which of the layer's
 * channels to read (all of them, or one when their sample types differ).
 */
function readBand(bytes: Uint8Array, part: ExrPart, layer: ExrLayer, pass: number[], band: ChunkRef[], tiled: boolean, tileWidth: number, tileHeight: number): Float32Array {
  const single = pass.length === 1;
  const roles = single ? ["Y"] : layer.kind === "rgba" ? ["R", "G", "B", "A"] : ["R", "G", "B"];
  const rename = new Map<string, string>();
  pass.forEach((k, j) => rename.set(layer.channels[k]!, roles[j]!));
  const channels: ExrChannel[] = part.channels.map((c, i) => {
    const suffix = c.name.slice(c.name.lastIndexOf(".") + 1);
    // Skipped channels keep their last name part (DWA chooses its method by it) and their byte size
    // (UINT is declared FLOAT: the reader counts UINT as zero bytes; both are four bytes on disk).
    const name = rename.get(c.name) ?? `skip${i}.${suffix}`;
    return { ...c, name, pixelType: c.pixelType === "uint" && !rename.has(c.name) ? "float" : c.pixelType };
  });
  const first = band[0]!;
  const last = band[band.length - 1]!;
  const dataWidth = windowSize(part.dataWindow).width;
  const y0 = first.y, y1 = last.y + last.height - 1;
  const window = { xMin: 0, yMin: y0, xMax: dataWidth - 1, yMax: y1 };
  const head = new ByteBuilder()
    .bytes(preamble(tiled))
    .bytes(attr.channels(channels))
    .bytes(attr.compression(part.compression))
    .bytes(attr.box("dataWindow", window))
    .bytes(attr.box("displayWindow", window))
    .bytes(attr.lineOrderIncreasing())
    .bytes(attr.float("pixelAspectRatio", 1))
    .bytes(attr.v2f("screenWindowCenter", 0, 0))
    .bytes(attr.float("screenWindowWidth", 1));
  if (tiled) head.bytes(attr.tiles({ xSize: tileWidth, ySize: tileHeight }));
  head.u8(0);
  const ordered = [...band].sort((a, b) => a.tileY - b.tileY || a.tileX - b.tileX);
  const chunkHead = tiled ? 20 : 8;
  let at = head.length + ordered.length * 8;
  for (const c of ordered) {
    head.u64(at);
    at += chunkHead + c.dataSize;
  }
  for (const c of ordered) {
    if (tiled) head.i32(c.tileX).i32(c.tileY - first.tileY).i32(0).i32(0);
    else head.i32(c.y);
    head.i32(c.dataSize).bytes(chunkForReader(bytes, part, c));
  }
  const file = head.build();
  try {
    const result = new EXRLoader().setDataType(FloatType).setOutputFormat(RGBAFormat).parse(file.buffer as ArrayBuffer);
    if (result.width !== dataWidth || result.height !== y1 - y0 + 1) throw new Error("band size mismatch");
    return result.data;
  } catch (error) {
    if (error instanceof ExrFormatError) throw error;
    throw new ExrFormatError("damaged", `The ${COMPRESSION_NAMES[part.compression]} image data is damaged and could not be decoded (${error instanceof Error ? error.message.replace(/^THREE\.EXRLoader:\s*/, "") : "unknown error"}).`);
  }
}

/**
 * The chunk's bytes as the reader gets them. One repair: for DWA chunks whose AC data is
 * deflated, the reader slices and skips that data by the AC sample count (field 8 of the DWA
 * header) instead of its compressed size (field 3), so a copy carries the compressed size there;
 * the reader uses the field for nothing else on that path.
 */
function chunkForReader(bytes: Uint8Array, part: ExrPart, c: ChunkRef): Uint8Array {
  const data = bytes.subarray(c.dataStart, c.dataStart + c.dataSize);
  if ((part.compression !== "dwaa" && part.compression !== "dwab") || c.dataSize === c.rawSize || data.length < 88) return data;
  const view = new DataView(data.buffer, data.byteOffset, data.byteLength);
  if (view.getBigInt64(80, true) !== 1n) return data;
  const copy = new Uint8Array(data); // a copy (Buffer#slice would share memory)
  new DataView(copy.buffer, copy.byteOffset, copy.byteLength).setBigInt64(64, view.getBigInt64(24, true), true);
  return copy;
}

/** Copies a decoded band (RGBA, rows bottom-up, data window columns) into the display window, top row first. */
function placeBand(rgba: Float32Array, band: ChunkRef[], part: ExrPart, layer: ExrLayer, pass: number[], out: Float32Array, channels: number, width: number, height: number): void {
  const dw = part.dataWindow, disp = part.displayWindow;
  const dataWidth = dw.xMax - dw.xMin + 1;
  const first = band[0]!, last = band[band.length - 1]!;
  const bandTop = first.y, bandRows = last.y + last.height - first.y;
  const single = pass.length === 1;
  const x0 = Math.max(dw.xMin, disp.xMin), x1 = Math.min(dw.xMax, disp.xMax);
  if (x1 < x0) return;
  for (let r = 0; r < bandRows; r++) {
    const fileY = dw.yMin + bandTop + r;
    const outY = fileY - disp.yMin;
    if (outY < 0 || outY >= height) continue;
    const src = (bandRows - 1 - r) * dataWidth * 4;
    for (let x = x0; x <= x1; x++) {
      const s = src + (x - dw.xMin) * 4;
      const o = (outY * width + (x - disp.xMin)) * channels;
      if (single) out[o + pass[0]!] = rgba[s]!;
      else for (let k = 0; k < pass.length; k++) out[o + pass[k]!] = rgba[s + k]!;
    }
  }
}

/**
 * Refuses chunks whose compressed streams would expand past the block's own size (a
 * decompression bomb) or come up short, before the reader allocates for them.
 */
function guardChunk(bytes: Uint8Array, part: ExrPart, c: ChunkRef): void {
  if (c.dataSize === c.rawSize) return; // stored uncompressed
  const data = bytes.subarray(c.dataStart, c.dataStart + c.dataSize);
  const name = COMPRESSION_NAMES[part.compression];
  const inflateTo = (stream: Uint8Array, expected: number, exact: boolean): void => {
    let size: number;
    try {
      size = zlib.inflateSync(stream, { maxOutputLength: Math.max(1, expected) }).length;
    } catch (error) {
      const bomb = error instanceof RangeError || (error as { code?: string }).code === "ERR_BUFFER_TOO_LARGE";
      throw new ExrFormatError("damaged", bomb ? `A ${name} chunk inflates past its own size (a decompression bomb?).` : `A ${name} chunk is not valid compressed data.`);
    }
    if (exact && size !== expected) throw new ExrFormatError("damaged", `A ${name} chunk inflates to ${size} bytes instead of ${expected}.`);
  };
  switch (part.compression) {
    case "zip":
    case "zips":
      return inflateTo(data, c.rawSize, true);
    case "pxr24": {
      const perPixel = part.channels.reduce((t, ch) => t + (ch.pixelType === "half" ? 2 : ch.pixelType === "float" ? 3 : 4), 0);
      return inflateTo(data, perPixel * c.width * c.height, true);
    }
    case "rle":
      return checkRunLength(data, c.rawSize);
    case "dwaa":
    case "dwab":
      return guardDwa(data, part, c, inflateTo);
    default:
      return; // PIZ, B44: output sized by the block, inputs bounded by the chunk
  }
}

/** OpenEXR run-length data: a signed count byte, then one repeated byte (count ≥ 0) or −count literal bytes. */
function checkRunLength(data: Uint8Array, expected: number): void {
  let out = 0, p = 0;
  while (p < data.length) {
    const count = (data[p]! << 24) >> 24;
    if (count < 0) {
      out += -count;
      p += 1 - count;
    } else {
      out += count + 1;
      p += 2;
    }
    if (out > expected) throw new ExrFormatError("damaged", "An RLE chunk expands past its own size (a decompression bomb?).");
  }
  if (p !== data.length || out !== expected) throw new ExrFormatError("damaged", "An RLE chunk does not hold the pixels it should.");
}

/**
 * DWA chunk header (eleven int64 sizes, then the channel rules): the sizes must fit the chunk
 * and the block, and each deflate stream must inflate within the size it declares.
 */
function guardDwa(data: Uint8Array, part: ExrPart, c: ChunkRef, inflateTo: (s: Uint8Array, n: number, exact: boolean) => void): void {
  const name = COMPRESSION_NAMES[part.compression];
  const bad = (why: string): never => {
    throw new ExrFormatError("damaged", `A ${name} chunk is damaged (${why}).`);
  };
  if (data.length < 90) bad("too short");
  const view = new DataView(data.buffer, data.byteOffset, data.byteLength);
  const n = (i: number) => {
    const v = view.getBigInt64(i * 8, true);
    if (v < 0n || v > BigInt(Number.MAX_SAFE_INTEGER)) bad("impossible size");
    return Number(v);
  };
  const [version, unknownRaw, unknownPacked, acPacked, dcPacked, rlePacked, rleRaw, , acCount, dcCount, acMode] = Array.from<unknown, number>({ length: 11 }, (_, i) => n(i));
  if (version! < 2) unsupported(`${name} version ${version} is not supported by the decoder.`);
  if (unknownRaw! > 0 || unknownPacked! > 0) unsupported(`${name} chunks with channels outside R, G, B, A and Y cannot be read; re-save with ZIP or PIZ.`);
  const samples = c.width * c.height * part.channels.length;
  if (acCount! > samples || dcCount! > samples || rleRaw! > c.rawSize) bad("sizes larger than the block");
  const rulesSize = view.getUint16(88, true);
  let at = 88 + rulesSize;
  if (at + acPacked! + dcPacked! + rlePacked! > data.length) bad("sizes past the end of the chunk");
  if (acPacked! > 0 && acMode === 1) inflateTo(data.subarray(at, at + acPacked!), acCount! * 2, false);
  at += acPacked!;
  if (dcPacked! > 0) inflateTo(data.subarray(at, at + dcPacked!), dcCount! * 2, false);
  at += dcPacked!;
  if (rlePacked! > 0) inflateTo(data.subarray(at, at + rlePacked!), rleRaw!, false);
}
