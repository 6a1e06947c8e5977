/*
 * OpenEXR header reader, written from the open file layout ("OpenEXR File Layout", the
 * OpenEXR project's documentation): magic and version field, then per part a list of
 * attributes (name\0 type\0 int32 size, value) closed by an empty name; a multi-part file
 * closes its list of headers with one more empty name. Client-safe (no Buffer, no Node): the
 * upload form reads the layers of a dropped file with it before sending.
 *
 * Every length and offset is checked against the bytes at hand, so a lying header fails
 * here with an ExrFormatError instead of reaching a decoder.
 */

export const EXR_MAGIC = 20000630;

/** Why a file is refused: damaged (400), unsupported (415), too large (413). */
export type ExrProblem = "damaged" | "unsupported" | "too_large";

export class ExrFormatError extends Error {
  constructor(
    readonly problem: ExrProblem,
    message: string,
  ) {
    super(message);
    this.name = "ExrFormatError";
  }
}

export type ExrPixelType = "uint" | "half" | "float";
export const PIXEL_TYPES: readonly ExrPixelType[] = ["uint", "half", "float"];
/** Bytes per sample in the file (uint and float 4, half 2). */
export const PIXEL_BYTES: Record<ExrPixelType, number> = { uint: 4, half: 2, float: 4 };

export type ExrChannel = { name: string; pixelType: ExrPixelType; pLinear: boolean; xSampling: number; ySampling: number };
export type Box2i = { xMin: number; yMin: number; xMax: number; yMax: number };

/** Compression codes 0–9 of the layout; later codes are named by number. */
export const COMPRESSIONS = ["none", "rle", "zips", "zip", "piz", "pxr24", "b44", "b44a", "dwaa", "dwab"] as const;
export type ExrCompression = (typeof COMPRESSIONS)[number];
export const COMPRESSION_NAMES: Record<ExrCompression, string> = {
  none: "NONE",
  rle: "RLE",
  zips: "ZIPS",
  zip: "ZIP",
  piz: "PIZ",
  pxr24: "PXR24",
  b44: "B44",
  b44a: "B44A",
  dwaa: "DWAA",
  dwab: "DWAB",
};
/** Scan lines per chunk of a scanline file, per compression (the layout's table). */
export const LINES_PER_CHUNK: Record<ExrCompression, number> = {
  none: 1,
  rle: 1,
  zips: 1,
  zip: 16,
  piz: 32,
  pxr24: 16,
  b44: 32,
  b44a: 32,
  dwaa: 32,
  dwab: 256,
};

export type TileDesc = { xSize: number; ySize: number; levelMode: "one" | "mipmap" | "ripmap"; roundingMode: "down" | "up" };
export type Chromaticities = { red: [number, number]; green: [number, number]; blue: [number, number]; white: [number, number] };

/** Where one attribute sits in the file (for the clean header and for copying). */
export type ExrAttribute = { name: string; type: string; start: number; valueStart: number; size: number };

export type ExrPart = {
  index: number;
  attributes: ExrAttribute[];
  channels: ExrChannel[];
  compression: ExrCompression;
  dataWindow: Box2i;
  displayWindow: Box2i;
  lineOrder: "increasing" | "decreasing" | "random";
  pixelAspectRatio: number;
  tiles: TileDesc | null;
  /** Multi-part: the part's name and type; single part: type from the version flags. */
  name: string | null;
  type: "scanlineimage" | "tiledimage";
  view: string | null;
  chromaticities: Chromaticities | null;
  /** Multi-part files say how many chunks each part has. */
  chunkCount: number | null;
};

export type ExrHeader = {
  multipart: boolean;
  longNames: boolean;
  parts: ExrPart[];
  /** First byte after the header(s): the offset tables start here. */
  headerEnd: number;
};

/** Limits that keep a hostile header cheap to refuse. */
export const EXR_LIMITS = {
  channelsPerPart: 1024,
  parts: 64,
  attributesPerPart: 4096,
  /** Coordinates beyond ±2^30 are refused (the layout asks for windows that fit in int32 arithmetic). */
  coordinate: 2 ** 30,
};

const REQUIRED = ["channels", "compression", "dataWindow", "displayWindow", "lineOrder", "pixelAspectRatio", "screenWindowCenter", "screenWindowWidth"];
const FIXED_SIZES: Record<string, number> = {
  box2i: 16,
  compression: 1,
  lineOrder: 1,
  float: 4,
  int: 4,
  v2f: 8,
  v2i: 8,
  tiledesc: 9,
  chromaticities: 32,
};

function damaged(message: string): never {
  throw new ExrFormatError("damaged", message);
}

/** True when the bytes start with the OpenEXR magic number (76 2f 31 01). */
export function isExr(bytes: Uint8Array): boolean {
  return bytes.length >= 4 && bytes[0] === 0x76 && bytes[1] === 0x2f && bytes[2] === 0x31 && bytes[3] === 0x01;
}

class Reader {
  readonly view: DataView;
  pos: number;
  constructor(
    readonly bytes: Uint8Array,
    start: number,
  ) {
    this.view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
    this.pos = start;
  }
  need(n: number, what: string): void {
    if (n < 0 || this.pos + n > this.bytes.length) damaged(`The file ends inside the ${what}.`);
  }
  /** A null-terminated string of at most `max` bytes (Latin-1 is enough for names). */
  cstring(max: number, what: string): string {
    const end = this.bytes.indexOf(0, this.pos);
    if (end < 0) damaged(`The file ends inside the ${what}.`);
    if (end - this.pos > max) damaged(`The ${what} is longer than ${max} bytes.`);
    let s = "";
    for (let i = this.pos; i < end; i++) s += String.fromCharCode(this.bytes[i]!);
    this.pos = end + 1;
    return s;
  }
}

function readBox(view: DataView, at: number): Box2i {
  return { xMin: view.getInt32(at, true), yMin: view.getInt32(at + 4, true), xMax: view.getInt32(at + 8, true), yMax: view.getInt32(at + 12, true) };
}

function readChannels(r: Reader, attr: ExrAttribute): ExrChannel[] {
  const end = attr.valueStart + attr.size;
  const sub = new Reader(r.bytes.subarray(0, end), attr.valueStart);
  const channels: ExrChannel[] = [];
  const seen = new Set<string>();
  for (;;) {
    sub.need(1, "channel list");
    if (r.bytes[sub.pos] === 0) {
      sub.pos++;
      break;
    }
    if (channels.length >= EXR_LIMITS.channelsPerPart) throw new ExrFormatError("unsupported", `The file has more than ${EXR_LIMITS.channelsPerPart} channels in one part.`);
    const name = sub.cstring(255, "channel list");
    sub.need(16, "channel list");
    const typeCode = sub.view.getInt32(sub.pos, true);
    const pLinear = sub.view.getUint8(sub.pos + 4) !== 0;
    const xSampling = sub.view.getInt32(sub.pos + 8, true);
    const ySampling = sub.view.getInt32(sub.pos + 12, true);
    sub.pos += 16;
    const pixelType = PIXEL_TYPES[typeCode];
    if (!pixelType) damaged(`Channel ${name} has an unknown sample type (${typeCode}).`);
    if (xSampling < 1 || ySampling < 1 || xSampling > 1024 || ySampling > 1024) damaged(`Channel ${name} has an impossible sampling rate.`);
    if (seen.has(name)) damaged(`Channel ${name} is listed twice.`);
    seen.add(name);
    channels.push({ name, pixelType, pLinear, xSampling, ySampling });
  }
  if (sub.pos !== end) damaged("The channel list does not fill its attribute.");
  if (!channels.length) damaged("The file lists no channels.");
  return channels;
}

function readTiles(view: DataView, at: number): TileDesc {
  const xSize = view.getUint32(at, true);
  const ySize = view.getUint32(at + 4, true);
  const mode = view.getUint8(at + 8);
  const level = mode & 0x0f;
  const rounding = mode >> 4;
  if (xSize < 1 || ySize < 1 || xSize > 65536 || ySize > 65536) damaged("The tile size is impossible.");
  if (level > 2 || rounding > 1) damaged("The tile description has unknown level or rounding modes.");
  return { xSize, ySize, levelMode: (["one", "mipmap", "ripmap"] as const)[level]!, roundingMode: rounding ? "up" : "down" };
}

function readString(bytes: Uint8Array, attr: ExrAttribute): string {
  let s = "";
  for (let i = attr.valueStart; i < attr.valueStart + attr.size; i++) s += String.fromCharCode(bytes[i]!);
  return s;
}

function checkWindow(box: Box2i, what: string): void {
  const c = EXR_LIMITS.coordinate;
  if ([box.xMin, box.yMin, box.xMax, box.yMax].some((v) => Math.abs(v) > c)) damaged(`The ${what} lies outside the coordinates the format allows.`);
  if (box.xMax < box.xMin || box.yMax < box.yMin) damaged(`The ${what} is empty or inverted.`);
}

/** Width × height of a window in float64 (no int32 overflow for hostile values). */
export function windowSize(box: Box2i): { width: number; height: number } {
  return { width: box.xMax - box.xMin + 1, height: box.yMax - box.yMin + 1 };
}

function readPart(r: Reader, index: number, flags: { tiled: boolean; longNames: boolean; multipart: boolean }): ExrPart {
  const attributes: ExrAttribute[] = [];
  const maxName = flags.longNames ? 255 : 31;
  for (;;) {
    r.need(1, "header");
    if (r.bytes[r.pos] === 0) {
      r.pos++;
      break;
    }
    if (attributes.length >= EXR_LIMITS.attributesPerPart) damaged("The header has too many attributes.");
    const start = r.pos;
    const name = r.cstring(maxName, "header (attribute name)");
    const type = r.cstring(maxName, "header (attribute type)");
    r.need(4, "header");
    const size = r.view.getInt32(r.pos, true);
    r.pos += 4;
    if (size < 0) damaged(`Attribute ${name} declares a negative size.`);
    r.need(size, `attribute ${name}`);
    const fixed = FIXED_SIZES[type];
    if (fixed !== undefined && size !== fixed) damaged(`Attribute ${name} of type ${type} has ${size} bytes instead of ${fixed}.`);
    if (attributes.some((a) => a.name === name)) damaged(`Attribute ${name} appears twice.`);
    attributes.push({ name, type, start, valueStart: r.pos, size });
    r.pos += size;
  }
  const get = (name: string, type: string): ExrAttribute | undefined => {
    const a = attributes.find((x) => x.name === name);
    if (a && a.type !== type) damaged(`Attribute ${name} has type ${a.type} instead of ${type}.`);
    return a;
  };
  for (const name of REQUIRED) if (!attributes.some((a) => a.name === name)) damaged(`The header has no ${name} attribute.`);

  const typeAttr = get("type", "string");
  const typeName = typeAttr ? readString(r.bytes, typeAttr) : flags.tiled ? "tiledimage" : "scanlineimage";
  if (typeName.startsWith("deep")) throw new ExrFormatError("unsupported", "Deep OpenEXR files (several samples per pixel) are not accepted; flatten the image first.");
  if (typeName !== "scanlineimage" && typeName !== "tiledimage") throw new ExrFormatError("unsupported", `OpenEXR parts of type "${typeName}" are not accepted.`);
  if (flags.multipart) {
    if (!get("name", "string")) damaged("A part of a multi-part file has no name attribute.");
    if (!typeAttr) damaged("A part of a multi-part file has no type attribute.");
    if (!get("chunkCount", "int")) damaged("A part of a multi-part file has no chunkCount attribute.");
  }
  const channels = readChannels(r, get("channels", "chlist")!);
  const compressionCode = r.view.getUint8(get("compression", "compression")!.valueStart);
  const compression = COMPRESSIONS[compressionCode];
  if (!compression) throw new ExrFormatError("unsupported", `The file uses compression number ${compressionCode}, which Plateroom cannot read. Re-save it with ZIP or PIZ.`);
  const dataWindow = readBox(r.view, get("dataWindow", "box2i")!.valueStart);
  const displayWindow = readBox(r.view, get("displayWindow", "box2i")!.valueStart);
  checkWindow(dataWindow, "data window");
  checkWindow(displayWindow, "display window");
  const lineOrderCode = r.view.getUint8(get("lineOrder", "lineOrder")!.valueStart);
  const lineOrder = (["increasing", "decreasing", "random"] as const)[lineOrderCode];
  if (!lineOrder) damaged(`Unknown line order ${lineOrderCode}.`);
  const pixelAspectRatio = r.view.getFloat32(get("pixelAspectRatio", "float")!.valueStart, true);
  if (!Number.isFinite(pixelAspectRatio) || pixelAspectRatio <= 0) damaged("The pixel aspect ratio is not a positive number.");
  const tilesAttr = get("tiles", "tiledesc");
  const tiled = typeName === "tiledimage";
  if (tiled && !tilesAttr) damaged("A tiled image has no tiles attribute.");
  if (!flags.multipart && tiled !== flags.tiled) damaged("The version flags and the image type disagree about tiles.");
  const chromAttr = get("chromaticities", "chromaticities");
  let chromaticities: Chromaticities | null = null;
  if (chromAttr) {
    const f = (i: number) => r.view.getFloat32(chromAttr.valueStart + 4 * i, true);
    chromaticities = { red: [f(0), f(1)], green: [f(2), f(3)], blue: [f(4), f(5)], white: [f(6), f(7)] };
  }
  const nameAttr = get("name", "string");
  const viewAttr = get("view", "string");
  const countAttr = get("chunkCount", "int");
  const chunkCount = countAttr ? r.view.getInt32(countAttr.valueStart, true) : null;
  if (chunkCount !== null && chunkCount < 0) damaged("The chunk count is negative.");
  return {
    index,
    attributes,
    channels,
    compression,
    dataWindow,
    displayWindow,
    lineOrder,
    pixelAspectRatio,
    tiles: tiled ? readTiles(r.view, tilesAttr!.valueStart) : null,
    name: nameAttr ? readString(r.bytes, nameAttr) : null,
    type: typeName,
    view: viewAttr ? readString(r.bytes, viewAttr) : null,
    chromaticities,
    chunkCount,
  };
}

/**
 * Reads the header(s) of an OpenEXR file. `bytes` may be only the start of the file (the
 * upload form reads the first megabytes): the header must lie within them.
 */
export function parseExrHeader(bytes: Uint8Array): ExrHeader {
  if (!isExr(bytes)) throw new ExrFormatError("unsupported", "This is not an OpenEXR file.");
  if (bytes.length < 8) damaged("The file ends inside the version field.");
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const versionField = view.getUint32(4, true);
  const version = versionField & 0xff;
  if (version !== 2) throw new ExrFormatError("unsupported", `OpenEXR version ${version} is not accepted (only version 2 exists).`);
  const tiled = (versionField & 0x200) !== 0;
  const longNames = (versionField & 0x400) !== 0;
  const nonImage = (versionField & 0x800) !== 0;
  const multipart = (versionField & 0x1000) !== 0;
  if (versionField & ~0x1eff) throw new ExrFormatError("unsupported", "The file sets version flags that Plateroom does not know.");
  if (nonImage) throw new ExrFormatError("unsupported", "Deep OpenEXR files (several samples per pixel) are not accepted; flatten the image first.");
  if (tiled && multipart) damaged("The single-part tiled flag is set on a multi-part file.");
  const r = new Reader(bytes, 8);
  const parts: ExrPart[] = [];
  const flags = { tiled, longNames, multipart };
  if (!multipart) parts.push(readPart(r, 0, flags));
  else {
    for (;;) {
      r.need(1, "header");
      if (bytes[r.pos] === 0) {
        r.pos++;
        break;
      }
      if (parts.length >= EXR_LIMITS.parts) throw new ExrFormatError("unsupported", `The file has more than ${EXR_LIMITS.parts} parts.`);
      parts.push(readPart(r, parts.length, flags));
    }
    if (!parts.length) damaged("A multi-part file without parts.");
  }
  return { multipart, longNames, parts, headerEnd: r.pos };
}
