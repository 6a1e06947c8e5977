import zlib from "node:zlib";
import sharp from "sharp";

/** Test images, all built here with sharp or by hand; nothing is read from anywhere. */

export async function noisePng(width: number, height: number, channels: 3 | 4 = 3): Promise<Buffer> {
  return sharp({ create: { width, height, channels, background: { r: 128, g: 128, b: 128 }, noise: { type: "gaussian", mean: 128, sigma: 40 } } })
    .png()
    .toBuffer();
}

export async function solidPng(width: number, height: number): Promise<Buffer> {
  return sharp({ create: { width, height, channels: 3, background: { r: 40, g: 160, b: 90 } } }).png().toBuffer();
}

/** 16-bit RGB PNG with the given samples (row-major RGB). LAB-NOTES: toColourspace('rgb16') keeps 16 bits. */
export async function png16(width: number, height: number, samples: number[]): Promise<Buffer> {
  return sharp(Uint16Array.from(samples), { raw: { width, height, channels: 3 } }).toColourspace("rgb16").png().toBuffer();
}

export async function jpegWithExif(): Promise<Buffer> {
  return sharp({ create: { width: 64, height: 48, channels: 3, background: { r: 200, g: 30, b: 30 } } })
    .withMetadata({ exif: { IFD0: { Copyright: "Kestrel Yard test", Artist: "test" } } })
    .jpeg()
    .toBuffer();
}

export async function cmykJpeg(): Promise<Buffer> {
  return sharp({ create: { width: 32, height: 32, channels: 3, background: { r: 10, g: 120, b: 200 } } }).toColourspace("cmyk").jpeg().toBuffer();
}

/** Two frames joined as an animation (sharp's `join.animated`). */
export async function animated(format: "webp" | "gif"): Promise<Buffer> {
  const a = await solidPng(16, 16);
  const b = await sharp({ create: { width: 16, height: 16, channels: 3, background: "blue" } }).png().toBuffer();
  const joined = sharp([a, b], { join: { animated: true } });
  return format === "webp" ? joined.webp({ loop: 0 }).toBuffer() : joined.gif({ loop: 0 }).toBuffer();
}

/** A PNG that is cut off part-way through its image data (header intact). */
export async function truncatedPng(): Promise<Buffer> {
  const full = await noisePng(200, 150);
  return full.subarray(0, Math.floor(full.length * 0.6));
}

/** A JPEG whose header is intact but whose entropy-coded scan data is overwritten. */
export async function corruptJpeg(): Promise<Buffer> {
  const j = await sharp({ create: { width: 64, height: 64, channels: 3, background: "grey", noise: { type: "gaussian", mean: 128, sigma: 30 } } })
    .jpeg()
    .toBuffer();
  let sos = -1;
  for (let i = 2; i < j.length - 1; i++) {
    if (j[i] === 0xff && j[i + 1] === 0xda) {
      sos = i;
      break;
    }
  }
  if (sos < 0) throw new Error("no SOS marker");
  const bad = Buffer.from(j);
  for (let i = sos + 20; i < bad.length - 2; i += 3) bad[i] = 0xff;
  return bad;
}

function chunk(type: string, data: Buffer): Buffer {
  const len = Buffer.alloc(4);
  len.writeUInt32BE(data.length);
  const body = Buffer.concat([Buffer.from(type, "ascii"), data]);
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(zlib.crc32(body) >>> 0);
  return Buffer.concat([len, body, crc]);
}

/**
 * A decompression bomb: a valid PNG (W3C PNG 2nd ed. §11.2.2 IHDR layout) declaring
 * 16000×16000 1-bit grey pixels (256 megapixels) whose zlib stream of zero rows packs
 * into a few tens of kilobytes.
 */
export function pngBomb(): Buffer {
  const width = 16000;
  const height = 16000;
  const rowBytes = Math.ceil(width / 8) + 1; // filter byte + packed bits
  const idat = zlib.deflateSync(Buffer.alloc(rowBytes * height), { level: 9 });
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(width, 0);
  ihdr.writeUInt32BE(height, 4);
  ihdr[8] = 1; // bit depth
  ihdr[9] = 0; // colour type: grey
  return Buffer.concat([Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), chunk("IHDR", ihdr), chunk("IDAT", idat), chunk("IEND", Buffer.alloc(0))]);
}

/** IHDR fields straight from the bytes (PNG spec §11.2.2): width, height, bit depth, colour type. */
export function readIhdr(png: Uint8Array): { width: number; height: number; bitDepth: number; colourType: number } {
  const b = Buffer.from(png.buffer, png.byteOffset, png.byteLength);
  return { width: b.readUInt32BE(16), height: b.readUInt32BE(20), bitDepth: b[24]!, colourType: b[25]! };
}

/**
 * A baseline uncompressed RGB TIFF with 32-bit IEEE float samples, written by hand from the
 * TIFF 6.0 specification (Part 1 §2 header and IFD; §8 RGB images) and the SampleFormat tag
 * (339, value 3 = IEEE floating point) of the same specification's Part 2 §19.
 */
export function floatTiff(width: number, height: number, samples: number[]): Buffer {
  const pixels = Buffer.alloc(width * height * 3 * 4);
  samples.forEach((v, i) => pixels.writeFloatLE(v, i * 4));
  const entries: [number, number, number, number | number[]][] = [
    [256, 3, 1, width], // ImageWidth, SHORT
    [257, 3, 1, height], // ImageLength
    [258, 3, 3, [32, 32, 32]], // BitsPerSample
    [259, 3, 1, 1], // Compression: none
    [262, 3, 1, 2], // PhotometricInterpretation: RGB
    [273, 4, 1, 0], // StripOffsets (filled below), LONG
    [277, 3, 1, 3], // SamplesPerPixel
    [278, 3, 1, height], // RowsPerStrip
    [279, 4, 1, pixels.length], // StripByteCounts
    [284, 3, 1, 1], // PlanarConfiguration: chunky
    [339, 3, 3, [3, 3, 3]], // SampleFormat: IEEE float
  ];
  const ifdOffset = 8;
  const ifdSize = 2 + entries.length * 12 + 4;
  const extraStart = ifdOffset + ifdSize;
  const extra: Buffer[] = [];
  let extraLength = 0;
  const ifd = Buffer.alloc(ifdSize);
  ifd.writeUInt16LE(entries.length, 0);
  entries.forEach(([tag, type, count, value], i) => {
    const at = 2 + i * 12;
    ifd.writeUInt16LE(tag, at);
    ifd.writeUInt16LE(type, at + 2);
    ifd.writeUInt32LE(count, at + 4);
    if (Array.isArray(value)) {
      const b = Buffer.alloc(value.length * 2);
      value.forEach((v, j) => b.writeUInt16LE(v, j * 2));
      ifd.writeUInt32LE(extraStart + extraLength, at + 8);
      extra.push(b);
      extraLength += b.length;
    } else if (type === 3) ifd.writeUInt16LE(value, at + 8);
    else ifd.writeUInt32LE(value, at + 8);
  });
  const pixelStart = extraStart + extraLength;
  const stripEntry = entries.findIndex(([tag]) => tag === 273);
  ifd.writeUInt32LE(pixelStart, 2 + stripEntry * 12 + 8);
  const header = Buffer.from([0x49, 0x49, 0x2a, 0x00, 0x08, 0x00, 0x00, 0x00]);
  return Buffer.concat([header, ifd, ...extra, pixels]);
}
