import { COMPRESSIONS, PIXEL_TYPES, type Box2i, type Chromaticities, type ExrChannel, type ExrCompression, type TileDesc } from "@/lib/exr/header";

/*
 * Byte builders for OpenEXR headers ("OpenEXR File Layout": attribute = name\0 type\0 int32
 * size value; a header ends with a null byte). Used to rebuild headers: the decoder's
 * per-band files, the clean header of stored originals, and the chromaticities of lab output.
 */

export class ByteBuilder {
  private parts: Uint8Array[] = [];
  length = 0;

  bytes(b: Uint8Array): this {
    this.parts.push(b);
    this.length += b.length;
    return this;
  }
  private sized(n: number, fill: (v: DataView) => void): this {
    const b = new Uint8Array(n);
    fill(new DataView(b.buffer));
    return this.bytes(b);
  }
  u8(v: number): this {
    return this.sized(1, (d) => d.setUint8(0, v));
  }
  i32(v: number): this {
    return this.sized(4, (d) => d.setInt32(0, v, true));
  }
  u32(v: number): this {
    return this.sized(4, (d) => d.setUint32(0, v, true));
  }
  u64(v: number): this {
    return this.sized(8, (d) => d.setBigUint64(0, BigInt(v), true));
  }
  f32(v: number): this {
    return this.sized(4, (d) => d.setFloat32(0, v, true));
  }
  /** Latin-1 text followed by a null byte. */
  cstring(s: string): this {
    const b = new Uint8Array(s.length + 1);
    for (let i = 0; i < s.length; i++) b[i] = s.charCodeAt(i) & 0xff;
    return this.bytes(b);
  }
  build(): Uint8Array {
    const out = new Uint8Array(this.length);
    let at = 0;
    for (const p of this.parts) {
      out.set(p, at);
      at += p.length;
    }
    return out;
  }
}

/** One attribute: name, type, size, then the value built by `value`. */
export function attribute(name: string, type: string, value: (b: ByteBuilder) => void): Uint8Array {
  const v = new ByteBuilder();
  value(v);
  return new ByteBuilder().cstring(name).cstring(type).i32(v.length).bytes(v.build()).build();
}

export const attr = {
  channels: (channels: ExrChannel[]) =>
    attribute("channels", "chlist", (b) => {
      for (const c of channels) {
        b.cstring(c.name).i32(PIXEL_TYPES.indexOf(c.pixelType)).u8(c.pLinear ? 1 : 0).u8(0).u8(0).u8(0).i32(c.xSampling).i32(c.ySampling);
      }
      b.u8(0);
    }),
  compression: (c: ExrCompression) => attribute("compression", "compression", (b) => b.u8(COMPRESSIONS.indexOf(c))),
  box: (name: "dataWindow" | "displayWindow", box: Box2i) => attribute(name, "box2i", (b) => b.i32(box.xMin).i32(box.yMin).i32(box.xMax).i32(box.yMax)),
  lineOrderIncreasing: () => attribute("lineOrder", "lineOrder", (b) => b.u8(0)),
  float: (name: string, v: number) => attribute(name, "float", (b) => b.f32(v)),
  v2f: (name: string, x: number, y: number) => attribute(name, "v2f", (b) => b.f32(x).f32(y)),
  tiles: (t: Pick<TileDesc, "xSize" | "ySize">) => attribute("tiles", "tiledesc", (b) => b.u32(t.xSize).u32(t.ySize).u8(0)),
  chromaticities: (c: Chromaticities) =>
    attribute("chromaticities", "chromaticities", (b) => {
      for (const [x, y] of [c.red, c.green, c.blue, c.white]) b.f32(x).f32(y);
    }),
};

/** Magic number and version field (version 2; flag 0x200 for a single-part tiled file). */
export function preamble(tiled: boolean, longNames = false): Uint8Array {
  return new ByteBuilder()
    .u32(20000630)
    .u32(2 | (tiled ? 0x200 : 0) | (longNames ? 0x400 : 0))
    .build();
}
