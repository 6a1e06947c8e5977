import { execFileSync } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { describe, it } from "vitest";

/*
 * OpenEXR fixtures made at run time by the reference implementation (Debian packages
 * `imagemagick` — /usr/bin/convert with its OpenEXR delegate — and `openexr` — exrheader,
 * exrmaketiled, exrmultiview, exrmultipart, exrstdattr), and the reference's own decode of
 * any file, used as the expected values.
 *
 * Expected values come from OpenEXR itself: `exrmaketiled -z none -t W H` rewrites a file as
 * one uncompressed tile, so the samples are the file's last W·H·(bytes per pixel) bytes, in
 * the layout's order (per line, per channel in the channel list's order, per pixel). Half
 * samples become float32 through numpy (Debian python3-numpy, np.float16 → np.float32), not
 * through any code of ours.
 */

export const TOOLS = {
  convert: "/usr/bin/convert",
  exrheader: "/usr/bin/exrheader",
  exrmaketiled: "/usr/bin/exrmaketiled",
  exrmultiview: "/usr/bin/exrmultiview",
  exrmultipart: "/usr/bin/exrmultipart",
  exrstdattr: "/usr/bin/exrstdattr",
  python3: "/usr/bin/python3",
} as const;

export function missingTools(): string[] {
  const missing: string[] = Object.values(TOOLS).filter((t) => !fs.existsSync(t));
  if (!missing.length) {
    try {
      execFileSync(TOOLS.python3, ["-c", "import numpy"], { stdio: "ignore" });
    } catch {
      missing.push("python3-numpy");
    }
  }
  return missing;
}

/**
 * describe() that needs the reference tools: skipped with a clear message when they are not
 * installed locally, and failing in CI (process.env.CI), where .ci/run installs them.
 */
export function describeWithExrTools(name: string, body: () => void): void {
  const missing = missingTools();
  if (missing.length && !process.env.CI) {
    describe.skip(`${name} — SKIPPED: reference tools missing (${missing.join(", ")}); apt-get install imagemagick openexr python3-numpy`, body);
    return;
  }
  describe(name, () => {
    if (missing.length) it("has the OpenEXR reference tools installed", () => {
      throw new Error(`Reference tools missing in CI: ${missing.join(", ")}`);
    });
    else body();
  });
}

export function run(tool: string, args: string[]): string {
  return execFileSync(tool, args, { encoding: "utf8", stdio: ["ignore", "pipe", "pipe"] });
}

export function tempDir(): { dir: string; file: (name: string) => string; remove: () => void } {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), "plateroom-exr-"));
  return { dir, file: (name) => path.join(dir, name), remove: () => fs.rmSync(dir, { recursive: true, force: true }) };
}

export type RefChannel = { name: string; type: "half" | "float" | "uint" };
export type RefHeader = {
  channels: RefChannel[];
  dataWindow: [number, number, number, number];
  displayWindow: [number, number, number, number];
  compression: string;
  parts: number;
  raw: string;
};

/** exrheader's description of one part (0 for single-part files). */
export function refHeader(file: string, part = 0): RefHeader {
  const raw = run(TOOLS.exrheader, [file]);
  const partTexts = raw.split(/\n part \d+:\n/);
  const text = partTexts.length > 1 ? partTexts[part + 1]! : raw;
  const channels: RefChannel[] = [];
  const chSection = /channels \(type chlist\):\n((?: {4}.*\n)+)/.exec(text)?.[1] ?? "";
  for (const line of chSection.trim().split("\n")) {
    const m = /^\s*(.+?), (16-bit floating-point|32-bit floating-point|32-bit unsigned integer)/.exec(line);
    if (m) channels.push({ name: m[1]!, type: m[2]!.startsWith("16") ? "half" : m[2]!.startsWith("32-bit f") ? "float" : "uint" });
  }
  const box = (label: string): [number, number, number, number] => {
    const m = new RegExp(`${label} \\(type box2i\\): \\((-?\\d+) (-?\\d+)\\) - \\((-?\\d+) (-?\\d+)\\)`).exec(text);
    if (!m) throw new Error(`exrheader printed no ${label}`);
    return [Number(m[1]), Number(m[2]), Number(m[3]), Number(m[4])];
  };
  return {
    channels,
    dataWindow: box("dataWindow"),
    displayWindow: box("displayWindow"),
    compression: /compression \(type compression\): (.*)/.exec(text)?.[1] ?? "",
    parts: Math.max(1, partTexts.length - 1),
    raw,
  };
}

/** half → float32 by numpy (IEEE 754 binary16 → binary32, exact). */
export function halfToFloat32(bits: Uint16Array): Float32Array {
  const out = execFileSync(
    TOOLS.python3,
    ["-c", "import sys, numpy as np; sys.stdout.buffer.write(np.frombuffer(sys.stdin.buffer.read(), dtype='<f2').astype('<f4').tobytes())"],
    { input: Buffer.from(bits.buffer, bits.byteOffset, bits.byteLength), maxBuffer: 1 << 30 },
  );
  return new Float32Array(out.buffer.slice(out.byteOffset, out.byteOffset + out.byteLength));
}

/** float32 → half by numpy (round to nearest even, as OpenEXR's half(float) does), as half bits. */
export function float32ToHalf(values: Float32Array): Uint16Array {
  const out = execFileSync(
    TOOLS.python3,
    ["-c", "import sys, numpy as np; sys.stdout.buffer.write(np.frombuffer(sys.stdin.buffer.read(), dtype='<f4').astype('<f2').tobytes())"],
    { input: Buffer.from(values.buffer, values.byteOffset, values.byteLength), maxBuffer: 1 << 30 },
  );
  return new Uint16Array(out.buffer.slice(out.byteOffset, out.byteOffset + out.byteLength));
}

export type RefImage = { header: RefHeader; width: number; height: number; channels: Map<string, Float32Array>; bits: Map<string, Uint16Array | Uint32Array> };

/**
 * The samples of one part as OpenEXR decodes them: the data window, per channel, float32
 * (half converted by numpy; uint channels as their integer values).
 */
export function referenceDecode(file: string, part = 0): RefImage {
  const header = refHeader(file, part);
  const [x0, y0, x1, y1] = header.dataWindow;
  const width = x1 - x0 + 1, height = y1 - y0 + 1;
  const tmp = tempDir();
  try {
    let source = file;
    if (header.parts > 1) {
      // A multi-part file is split by the reference first (exrmultipart names parts from 1).
      run(TOOLS.exrmultipart, ["-separate", "-i", file, "-o", tmp.file("part")]);
      source = tmp.file(`part.${part + 1}.exr`);
    }
    const flat = tmp.file("flat.exr");
    run(TOOLS.exrmaketiled, ["-o", "-z", "none", "-t", String(width), String(height), source, flat]);
    const bytes = fs.readFileSync(flat);
    const bpp = header.channels.reduce((t, c) => t + (c.type === "half" ? 2 : 4), 0);
    const size = width * height * bpp;
    const data = bytes.subarray(bytes.length - size);
    if (bytes.readInt32LE(bytes.length - size - 4) !== size) throw new Error("The reference tile is not where the layout puts it.");
    const channels = new Map<string, Float32Array>();
    const bits = new Map<string, Uint16Array | Uint32Array>();
    for (const c of header.channels) bits.set(c.name, c.type === "half" ? new Uint16Array(width * height) : new Uint32Array(width * height));
    let at = 0;
    for (let y = 0; y < height; y++) {
      for (const c of header.channels) {
        const target = bits.get(c.name)!;
        for (let x = 0; x < width; x++) {
          if (c.type === "half") {
            target[y * width + x] = data.readUInt16LE(at);
            at += 2;
          } else {
            target[y * width + x] = data.readUInt32LE(at);
            at += 4;
          }
        }
      }
    }
    // One numpy call for every half channel.
    const halves = header.channels.filter((c) => c.type === "half");
    const all = new Uint16Array(halves.length * width * height);
    halves.forEach((c, k) => all.set(bits.get(c.name) as Uint16Array, k * width * height));
    const floats = halves.length ? halfToFloat32(all) : new Float32Array(0);
    for (const c of header.channels) {
      const b = bits.get(c.name)!;
      const k = halves.indexOf(c);
      if (k >= 0) channels.set(c.name, floats.slice(k * width * height, (k + 1) * width * height));
      else if (c.type === "float") channels.set(c.name, new Float32Array(b.buffer.slice(0)));
      else channels.set(c.name, Float32Array.from(b as Uint32Array));
    }
    return { header, width, height, channels, bits };
  } finally {
    tmp.remove();
  }
}

/**
 * An uncompressed scan-line OpenEXR file written byte by byte from the layout (the source
 * that the reference tools then re-compress, tile, combine and re-read). Samples are given
 * per channel: half bits or float32 values, data window order.
 */
export function rawExr(opts: {
  channels: { name: string; type: "half" | "float"; samples: Uint16Array | Float32Array }[];
  dataWindow: [number, number, number, number];
  displayWindow?: [number, number, number, number];
  extra?: Buffer[];
}): Buffer {
  const channels = [...opts.channels].sort((a, b) => (a.name < b.name ? -1 : 1));
  const [x0, y0, x1, y1] = opts.dataWindow;
  const width = x1 - x0 + 1, height = y1 - y0 + 1;
  const attr = (name: string, type: string, value: Buffer) => {
    const size = Buffer.alloc(4);
    size.writeInt32LE(value.length);
    return Buffer.concat([Buffer.from(`${name}\0${type}\0`, "latin1"), size, value]);
  };
  const i32s = (...v: number[]) => {
    const b = Buffer.alloc(4 * v.length);
    v.forEach((n, i) => b.writeInt32LE(n, 4 * i));
    return b;
  };
  const f32s = (...v: number[]) => {
    const b = Buffer.alloc(4 * v.length);
    v.forEach((n, i) => b.writeFloatLE(n, 4 * i));
    return b;
  };
  const chlist = Buffer.concat([
    ...channels.map((c) => Buffer.concat([Buffer.from(`${c.name}\0`, "latin1"), i32s(c.type === "half" ? 1 : 2), Buffer.from([0, 0, 0, 0]), i32s(1, 1)])),
    Buffer.from([0]),
  ]);
  const header = Buffer.concat([
    i32s(20000630, 2),
    attr("channels", "chlist", chlist),
    attr("compression", "compression", Buffer.from([0])),
    attr("dataWindow", "box2i", i32s(...opts.dataWindow)),
    attr("displayWindow", "box2i", i32s(...(opts.displayWindow ?? opts.dataWindow))),
    attr("lineOrder", "lineOrder", Buffer.from([0])),
    attr("pixelAspectRatio", "float", f32s(1)),
    attr("screenWindowCenter", "v2f", f32s(0, 0)),
    attr("screenWindowWidth", "float", f32s(1)),
    ...(opts.extra ?? []),
    Buffer.from([0]),
  ]);
  const bpp = channels.reduce((t, c) => t + (c.type === "half" ? 2 : 4), 0);
  const lineBytes = width * bpp;
  const table = Buffer.alloc(8 * height);
  const chunks: Buffer[] = [];
  let at = header.length + table.length;
  for (let y = 0; y < height; y++) {
    table.writeBigUInt64LE(BigInt(at), 8 * y);
    const chunk = Buffer.alloc(8 + lineBytes);
    chunk.writeInt32LE(y0 + y, 0);
    chunk.writeInt32LE(lineBytes, 4);
    let p = 8;
    for (const c of channels) {
      for (let x = 0; x < width; x++) {
        const v = c.samples[y * width + x]!;
        if (c.type === "half") p = chunk.writeUInt16LE(v, p);
        else p = chunk.writeFloatLE(v, p);
      }
    }
    chunks.push(chunk);
    at += chunk.length;
  }
  return Buffer.concat([header, table, ...chunks]);
}

/** Deterministic half bit patterns: ordinary values, values above 1 and below 0, tiny and zero. */
export function halfPattern(count: number, seed: number): Uint16Array {
  const out = new Uint16Array(count);
  let s = seed >>> 0;
  const next = () => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return s;
  };
  for (let i = 0; i < count; i++) {
    const r = next();
    const kind = r % 10;
    // Exponent field 0..30 (31 is inf/NaN, left out): subnormals, in-range, large.
    const exponent = kind < 5 ? 10 + (next() % 6) : kind < 7 ? 15 + (next() % 8) : kind < 8 ? next() % 10 : next() % 31;
    const sign = kind === 9 || next() % 7 === 0 ? 0x8000 : 0;
    out[i] = sign | (exponent << 10) | (next() & 0x3ff);
  }
  return out;
}
