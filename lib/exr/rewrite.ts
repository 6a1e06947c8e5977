import { expectedChunkCount } from "@/lib/exr/chunks";
import { ExrFormatError, parseExrHeader, type ExrAttribute, type ExrPart } from "@/lib/exr/header";
import { ByteBuilder } from "@/lib/exr/write";

/*
 * Rewrites the attributes of an OpenEXR file and leaves its pixels alone: the header(s) are
 * rebuilt, every entry of the offset tables moves by the change in header length (offsets are
 * absolute file positions, "OpenEXR File Layout"), and the chunks are copied byte for byte.
 */

export type AttributeEdit = (part: ExrPart, attributes: { attribute: ExrAttribute; bytes: Uint8Array }[]) => Uint8Array[];

export function rewriteAttributes(bytes: Uint8Array, edit: AttributeEdit): Uint8Array {
  const header = parseExrHeader(bytes);
  const out = new ByteBuilder().bytes(bytes.subarray(0, 8));
  for (const part of header.parts) {
    const attrs = part.attributes.map((attribute) => ({ attribute, bytes: bytes.subarray(attribute.start, attribute.valueStart + attribute.size) }));
    for (const b of edit(part, attrs)) out.bytes(b);
    out.u8(0);
  }
  if (header.multipart) out.u8(0);
  const delta = out.length - header.headerEnd;
  const entries = header.parts.reduce((t, p) => t + expectedChunkCount(p), 0);
  const tableEnd = header.headerEnd + entries * 8;
  if (tableEnd > bytes.length) throw new ExrFormatError("damaged", "The file ends inside its chunk offset table.");
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const table = new Uint8Array(entries * 8);
  const tableView = new DataView(table.buffer);
  for (let i = 0; i < entries; i++) {
    const offset = view.getBigUint64(header.headerEnd + i * 8, true);
    // A zero entry marks a chunk never written; it stays zero.
    tableView.setBigUint64(i * 8, offset === 0n ? 0n : offset + BigInt(delta), true);
  }
  return out.bytes(table).bytes(bytes.subarray(tableEnd)).build();
}

/**
 * Attributes an image needs to be read and shown as intended; everything else goes. Kept:
 * the layout, the colour description (chromaticities, white luminance, adopted neutral,
 * rendering and look transforms), density and view names. Dropped, among others: owner,
 * comments, capture date and UTC offset, longitude/latitude/altitude, camera and lens makes,
 * models and serial numbers, reel names, key and time codes, exposure settings, the preview
 * image, and any attribute a program added under its own name (paths, user names).
 */
export const KEPT_ATTRIBUTES = new Set([
  "channels",
  "compression",
  "dataWindow",
  "displayWindow",
  "lineOrder",
  "pixelAspectRatio",
  "screenWindowCenter",
  "screenWindowWidth",
  "tiles",
  "name",
  "type",
  "version",
  "chunkCount",
  "view",
  "multiView",
  "chromaticities",
  "whiteLuminance",
  "adoptedNeutral",
  "renderingTransform",
  "lookModTransform",
  "xDensity",
  "envmap",
  "wrapmodes",
  "framesPerSecond",
  "dwaCompressionLevel",
]);

/** The file with only KEPT_ATTRIBUTES in its header(s); pixel data untouched. */
export function cleanExrHeader(bytes: Uint8Array): Uint8Array {
  return rewriteAttributes(bytes, (_part, attrs) => attrs.filter((a) => KEPT_ATTRIBUTES.has(a.attribute.name)).map((a) => a.bytes));
}
