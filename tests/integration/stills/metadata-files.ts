import sharp from "sharp";

/*
 * Invented stills carrying identifying metadata, built from the format specifications (not from
 * lib/stills/strip-metadata.ts): EXIF with the artist, software, camera and a GPS position
 * (CIPA DC-008 Exif 2.3: IFD0 tags, GPS IFD 34853), an XMP packet (ISO 16684-1) naming a creator
 * and a city, IPTC-IIM By-line and City records in a Photoshop 8BIM 0x0404 resource, PNG tEXt /
 * zTXt / iTXt / eXIf / tIME chunks (PNG 3rd edition), and TIFF 6.0 tags. Names are invented.
 */

export const PLANTED = {
  artist: "Ingrid Solvang-Marsh",
  software: "Marshlight Grader 7.3",
  camera: "Kestrel Rig Camera B",
  description: "Saltmarsh SLM_040_0120 plate, unreleased",
  city: "Port Kestrel",
  host: "paint-ws-14.kestrel.internal",
} as const;

/** GPS latitude 59° 55' 12.5", longitude 10° 45' 1.25" (invented). */
const GPS = { lat: [[59, 1], [55, 1], [125, 10]], lon: [[10, 1], [45, 1], [125, 100]] };

// ---- a tiny TIFF-structure writer (TIFF 6.0, little-endian), shared by EXIF and the TIFF file ----

type Tag = { tag: number; type: 2 | 3 | 4 | 5 | 7; values: number[] | number[][] | string | Buffer };
const SIZE = { 2: 1, 3: 2, 4: 4, 5: 8, 7: 1 } as const;

function tagBytes(t: Tag): Buffer {
  if (t.type === 2) return Buffer.from(`${t.values as string}\0`, "latin1");
  if (t.type === 7) return t.values as Buffer;
  const values = t.values as (number | number[])[];
  const b = Buffer.alloc(values.length * SIZE[t.type]);
  values.forEach((v, i) => {
    if (t.type === 3) b.writeUInt16LE(v as number, i * 2);
    else if (t.type === 4) b.writeUInt32LE(v as number, i * 4);
    else {
      b.writeUInt32LE((v as number[])[0]!, i * 8);
      b.writeUInt32LE((v as number[])[1]!, i * 8 + 4);
    }
  });
  return b;
}

/**
 * Lays out one IFD at `at` (absolute offset in the final buffer) with its out-of-line values
 * after it. `pointers` are tags whose LONG value is the offset of a following sub-IFD.
 */
function writeIfd(tags: Tag[], at: number, next: (end: number) => { tag: number; bytes: Buffer }[] = () => []): Buffer {
  const sorted = [...tags].sort((a, b) => a.tag - b.tag);
  const placeholders = next(0).map((p) => ({ tag: p.tag, type: 4 as const, values: [0] }));
  const all = [...sorted, ...placeholders].sort((a, b) => a.tag - b.tag);
  const dirSize = 2 + all.length * 12 + 4;
  let dataAt = at + dirSize;
  const data: Buffer[] = [];
  const dir = Buffer.alloc(dirSize);
  dir.writeUInt16LE(all.length, 0);
  const valueOffsets = new Map<Tag, number>();
  for (const t of all) {
    const bytes = tagBytes(t);
    if (bytes.length > 4) {
      if (dataAt % 2) {
        data.push(Buffer.alloc(1));
        dataAt++;
      }
      valueOffsets.set(t, dataAt);
      data.push(bytes);
      dataAt += bytes.length;
    }
  }
  const subs = next(dataAt + (dataAt % 2));
  if (dataAt % 2) {
    data.push(Buffer.alloc(1));
    dataAt++;
  }
  let subAt = dataAt;
  const subOffsets = new Map<number, number>();
  for (const s of subs) {
    subOffsets.set(s.tag, subAt);
    data.push(s.bytes);
    subAt += s.bytes.length;
  }
  all.forEach((t, i) => {
    const e = 2 + i * 12;
    const bytes = tagBytes(t);
    const count = t.type === 2 || t.type === 7 ? bytes.length : (t.values as unknown[]).length;
    dir.writeUInt16LE(t.tag, e);
    dir.writeUInt16LE(t.type, e + 2);
    dir.writeUInt32LE(count, e + 4);
    const sub = subOffsets.get(t.tag);
    if (sub !== undefined) dir.writeUInt32LE(sub, e + 8);
    else if (valueOffsets.has(t)) dir.writeUInt32LE(valueOffsets.get(t)!, e + 8);
    else bytes.copy(dir, e + 8);
  });
  return Buffer.concat([dir, ...data]);
}

function gpsIfd(at: number): Buffer {
  return writeIfd(
    [
      { tag: 1, type: 2, values: "N" },
      { tag: 2, type: 5, values: GPS.lat },
      { tag: 3, type: 2, values: "E" },
      { tag: 4, type: 5, values: GPS.lon },
    ],
    at,
  );
}

const identifyingTags = (): Tag[] => [
  { tag: 270, type: 2, values: PLANTED.description },
  { tag: 271, type: 2, values: "Kestrel Optics" },
  { tag: 272, type: 2, values: PLANTED.camera },
  { tag: 305, type: 2, values: PLANTED.software },
  { tag: 306, type: 2, values: "2024:03:14 09:26:53" },
  { tag: 315, type: 2, values: PLANTED.artist },
  { tag: 316, type: 2, values: PLANTED.host },
  { tag: 33432, type: 2, values: `(c) ${PLANTED.artist}` },
];

/** The TIFF structure inside an EXIF block: IFD0 with identifying tags and a GPS IFD. */
export function exifTiff(): Buffer {
  const header = Buffer.from([0x49, 0x49, 0x2a, 0, 8, 0, 0, 0]);
  const ifd = writeIfd(identifyingTags(), 8, (end) => [{ tag: 34853, bytes: gpsIfd(end) }]);
  return Buffer.concat([header, ifd]);
}

export function xmpPacket(): string {
  return `<?xpacket begin="\uFEFF" id="W5M0MpCehiHzreSzNTczkc9d"?><x:xmpmeta xmlns:x="adobe:ns:meta/"><rdf:RDF xmlns:rdf="http://www.w3.org/1999/02/22-rdf-syntax-ns#"><rdf:Description rdf:about="" xmlns:dc="http://purl.org/dc/elements/1.1/" xmlns:photoshop="http://ns.adobe.com/photoshop/1.0/"><dc:creator><rdf:Seq><rdf:li>${PLANTED.artist}</rdf:li></rdf:Seq></dc:creator><photoshop:City>${PLANTED.city}</photoshop:City></rdf:Description></rdf:RDF></x:xmpmeta><?xpacket end="w"?>`;
}

/** IPTC-IIM records 2:80 By-line and 2:90 City inside a Photoshop 8BIM resource 0x0404. */
export function photoshopIptc(): Buffer {
  const record = (dataset: number, text: string) => {
    const value = Buffer.from(text, "latin1");
    const head = Buffer.from([0x1c, 2, dataset, 0, 0]);
    head.writeUInt16BE(value.length, 3);
    return Buffer.concat([head, value]);
  };
  const iptc = Buffer.concat([record(80, PLANTED.artist), record(90, PLANTED.city)]);
  const resource = Buffer.alloc(12);
  resource.write("8BIM", 0, "latin1");
  resource.writeUInt16BE(0x0404, 4);
  resource.writeUInt32BE(iptc.length, 8); // empty Pascal name (2 bytes: length 0 + pad) then size
  const padded = iptc.length % 2 ? Buffer.concat([iptc, Buffer.alloc(1)]) : iptc;
  return Buffer.concat([Buffer.from("Photoshop 3.0\0", "latin1"), resource, padded]);
}

/** Seeded noise pixels (invented), `bits` per channel. */
export function noise(width: number, height: number, channels: number, bits: 8 | 16, seed = 7): Uint8Array | Uint16Array {
  const out = bits === 8 ? new Uint8Array(width * height * channels) : new Uint16Array(width * height * channels);
  let s = seed;
  for (let i = 0; i < out.length; i++) {
    s = (s * 1103515245 + 12345) >>> 0;
    out[i] = bits === 8 ? s >>> 24 : s >>> 16;
  }
  return out;
}

/** An ICC profile as sharp embeds it (libvips' built-in Display P3), for files that carry one. */
export async function p3Profile(): Promise<Buffer> {
  const png = await sharp({ create: { width: 1, height: 1, channels: 3, background: "#808080" } }).withIccProfile("p3").png().toBuffer();
  const icc = (await sharp(png).metadata()).icc;
  if (!icc) throw new Error("sharp embedded no profile");
  return icc;
}

// ---- JPEG ----

function jpegSegment(marker: number, payload: Buffer): Buffer {
  const head = Buffer.from([0xff, marker, 0, 0]);
  head.writeUInt16BE(payload.length + 2, 2);
  return Buffer.concat([head, payload]);
}

/** A baseline JPEG with ICC profile, then APP1 Exif, APP1 XMP, APP13 IPTC and a comment, plus bytes after EOI. */
export async function jpegWithMetadata(): Promise<Buffer> {
  const jpeg = await sharp(noise(96, 64, 3, 8), { raw: { width: 96, height: 64, channels: 3 } }).withIccProfile("p3").jpeg({ quality: 92 }).toBuffer();
  const afterApp0 = jpeg[3] === 0xe0 ? 4 + jpeg.readUInt16BE(4) : 2;
  const inserted = Buffer.concat([
    jpegSegment(0xe1, Buffer.concat([Buffer.from("Exif\0\0", "latin1"), exifTiff()])),
    jpegSegment(0xe1, Buffer.concat([Buffer.from("http://ns.adobe.com/xap/1.0/\0", "latin1"), Buffer.from(xmpPacket(), "utf8")])),
    jpegSegment(0xed, photoshopIptc()),
    jpegSegment(0xfe, Buffer.from(`Graded by ${PLANTED.artist}`, "latin1")),
  ]);
  return Buffer.concat([jpeg.subarray(0, afterApp0), inserted, jpeg.subarray(afterApp0), Buffer.from(`trailing note: ${PLANTED.host}`, "latin1")]);
}

// ---- PNG ----

const CRC_TABLE = Array.from({ length: 256 }, (_, n) => {
  let c = n;
  for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
  return c >>> 0;
});

/** CRC-32 as the PNG specification's sample code computes it (PNG 3rd edition, Annex D). */
function crc32(bytes: Buffer): number {
  let c = 0xffffffff;
  for (const b of bytes) c = CRC_TABLE[(c ^ b) & 0xff]! ^ (c >>> 8);
  return (c ^ 0xffffffff) >>> 0;
}

function pngChunk(type: string, data: Buffer): Buffer {
  const head = Buffer.alloc(8);
  head.writeUInt32BE(data.length, 0);
  head.write(type, 4, "latin1");
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(crc32(Buffer.concat([head.subarray(4), data])), 0);
  return Buffer.concat([head, data, crc]);
}

/** A 16-bit RGB PNG with an iCCP profile, then tEXt, zTXt, iTXt (XMP), eXIf and tIME before the image data. */
export async function png16WithMetadata(): Promise<Buffer> {
  const png = await sharp(noise(80, 60, 3, 16), { raw: { width: 80, height: 60, channels: 3 } }).toColourspace("rgb16").withIccProfile("p3").png().toBuffer();
  const firstIdat = png.indexOf(Buffer.from("IDAT", "latin1")) - 4;
  const { deflateSync } = await import("node:zlib");
  const inserted = Buffer.concat([
    pngChunk("tEXt", Buffer.from(`Author\0${PLANTED.artist}`, "latin1")),
    pngChunk("tEXt", Buffer.from(`Software\0${PLANTED.software}`, "latin1")),
    pngChunk("zTXt", Buffer.concat([Buffer.from("Comment\0\0", "latin1"), deflateSync(Buffer.from(PLANTED.description, "latin1"))])),
    pngChunk("iTXt", Buffer.concat([Buffer.from("XML:com.adobe.xmp\0\0\0\0\0", "latin1"), Buffer.from(xmpPacket(), "utf8")])),
    pngChunk("eXIf", exifTiff()),
    pngChunk("tIME", Buffer.from([0x07, 0xe8, 3, 14, 9, 26, 53])),
  ]);
  return Buffer.concat([png.subarray(0, firstIdat), inserted, png.subarray(firstIdat)]);
}

// ---- TIFF ----

/** An uncompressed 16-bit RGB TIFF (TIFF 6.0 baseline) with an ICC profile, identifying tags, XMP, IPTC and a GPS IFD. */
export async function tiff16WithMetadata(): Promise<Buffer> {
  const width = 40, height = 30;
  const pixels = Buffer.from((noise(width, height, 3, 16, 11) as Uint16Array).buffer);
  const icc = await p3Profile();
  const header = Buffer.from([0x49, 0x49, 0x2a, 0, 8, 0, 0, 0]);
  // Pixels go first after the header so the strip offset is known before the directory.
  const stripAt = 8;
  const ifdAt = stripAt + pixels.length;
  const tags: Tag[] = [
    { tag: 256, type: 3, values: [width] },
    { tag: 257, type: 3, values: [height] },
    { tag: 258, type: 3, values: [16, 16, 16] },
    { tag: 259, type: 3, values: [1] },
    { tag: 262, type: 3, values: [2] },
    { tag: 273, type: 4, values: [stripAt] },
    { tag: 277, type: 3, values: [3] },
    { tag: 278, type: 3, values: [height] },
    { tag: 279, type: 4, values: [pixels.length] },
    { tag: 284, type: 3, values: [1] },
    { tag: 700, type: 7, values: Buffer.from(xmpPacket(), "utf8") },
    { tag: 33723, type: 7, values: photoshopIptc().subarray(14 + 12) },
    { tag: 34377, type: 7, values: photoshopIptc().subarray(14) },
    { tag: 34675, type: 7, values: icc },
    ...identifyingTags(),
  ];
  const ifd = writeIfd(tags, ifdAt, (end) => [{ tag: 34853, bytes: gpsIfd(end) }]);
  const out = Buffer.concat([header, pixels, ifd]);
  out.writeUInt32LE(ifdAt, 4);
  return out;
}

// ---- WebP ----

function riffChunk(fourcc: string, data: Buffer): Buffer {
  const head = Buffer.alloc(8);
  head.write(fourcc, 0, "latin1");
  head.writeUInt32LE(data.length, 4);
  return Buffer.concat([head, data, data.length % 2 ? Buffer.alloc(1) : Buffer.alloc(0)]);
}

/** A lossless WebP with an ICC profile, then EXIF and XMP chunks with their VP8X flags set (RFC 9649). */
export async function webpWithMetadata(): Promise<Buffer> {
  const webp = await sharp(noise(64, 48, 3, 8, 3), { raw: { width: 64, height: 48, channels: 3 } }).withIccProfile("p3").webp({ lossless: true }).toBuffer();
  if (webp.toString("latin1", 12, 16) !== "VP8X") throw new Error("expected an extended WebP");
  const body = Buffer.concat([webp.subarray(12), riffChunk("EXIF", exifTiff()), riffChunk("XMP ", Buffer.from(xmpPacket(), "utf8"))]);
  body[8] = body[8]! | 0x08 | 0x04;
  const header = Buffer.from("RIFF\0\0\0\0WEBP", "latin1");
  header.writeUInt32LE(4 + body.length, 4);
  return Buffer.concat([header, body]);
}
