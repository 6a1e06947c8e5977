/*
 * A 3×3 colour matrix over interleaved RGB float32 in WebAssembly SIMD. A JS loop costs ~5 ns
 * per pixel (bounds checks, float32↔float64); one 128-bit lane per pixel brings the step near
 * the memory-copy floor the issue sets (≤ 2.5× a float copy).
 *
 * The module is assembled here from bytes (no toolchain needed). It works on buffers that live
 * in its own memory: allocSimdRgb() hands out such a Float32Array; for any other array
 * matrixSimd() returns false and the caller uses the JS loop.
 *
 * Memory layout: bytes 0..79 parameters (three matrix columns, the offset, a keep-mask), image
 * floats from byte 128, plus 16 bytes of slack because each pixel is read and written as 16
 * bytes (r, g, b and the next pixel's r, which the mask writes back unchanged).
 */

const PARAM_BYTES = 8192;
// Tables of the 8-bit quantiser (quantise8InPlace) live in the parameter area after the matrix's.
const Q8_TABLES = 256;

function leb(n: number): number[] {
  const out: number[] = [];
  do {
    let b = n & 0x7f;
    n >>>= 7;
    if (n) b |= 0x80;
    out.push(b);
  } while (n);
  return out;
}

const section = (id: number, body: number[]): number[] => [id, ...leb(body.length), ...body];

function moduleBytes(): Uint8Array<ArrayBuffer> {
  const SIMD = 0xfd;
  const load = (offset: number): number[] => [SIMD, 0x00, 0x00, ...leb(offset)];
  const store = (offset: number): number[] => [SIMD, 0x0b, 0x00, ...leb(offset)];
  const shuffle = (lanes: number[]): number[] => [SIMD, 0x0d, ...lanes.flatMap((k) => [4 * k, 4 * k + 1, 4 * k + 2, 4 * k + 3])];
  const F32X4_ADD = [SIMD, ...leb(0xe4)];
  const F32X4_MUL = [SIMD, ...leb(0xe6)];
  const BITSELECT = [SIMD, ...leb(0x52)];
  const get = (i: number): number[] => [0x20, i];
  const set = (i: number): number[] => [0x21, i];
  // Locals: 0 p, 1 end (i32); v128: 2-4 columns, 5 offset, 6 mask; 7-11 the same rotated one
  // lane up (for the group's last pixel, read from 4 bytes earlier); 12 lanes-1..3 mask;
  // 13-16 pixels read, 17-20 results.
  const params = [0, 16, 32, 48, 64, 80, 96, 112, 128, 144, 160].flatMap((off, i) => [0x41, 0x00, ...load(off), ...set(2 + i)]);
  const product = (v: number, cols: [number, number, number], off: number, mask: number, lanes: [number, number, number]): number[] => [
    ...get(off),
    ...get(cols[0]), ...get(v), ...get(v), ...shuffle([lanes[0], lanes[0], lanes[0], lanes[0]]), ...F32X4_MUL, ...F32X4_ADD,
    ...get(cols[1]), ...get(v), ...get(v), ...shuffle([lanes[1], lanes[1], lanes[1], lanes[1]]), ...F32X4_MUL, ...F32X4_ADD,
    ...get(cols[2]), ...get(v), ...get(v), ...shuffle([lanes[2], lanes[2], lanes[2], lanes[2]]), ...F32X4_MUL, ...F32X4_ADD,
    ...get(v), ...get(mask), ...BITSELECT, // changed rows from the product, the rest as read
  ];
  const std = (v: number): number[] => product(v, [2, 3, 4], 5, 6, [0, 1, 2]);
  // Four pixels (48 bytes) per turn: all reads before all writes, and the last pixel read and
  // written as [b of pixel 2, r, g, b] so no write spills into the next group (a spill would
  // stall the next read on store forwarding).
  const body = [
    0x01, 0x13, 0x7b, // nineteen v128 locals
    ...params,
    0x02, 0x40, 0x03, 0x40, // block, loop
    ...get(0), ...get(1), 0x4f, 0x0d, 0x01, // if p >= end: break
    ...get(0), ...load(0), ...set(13),
    ...get(0), ...load(12), ...set(14),
    ...get(0), ...load(24), ...set(15),
    ...get(0), ...load(32), ...set(16),
    ...std(13), ...set(17),
    ...std(14), ...set(18),
    ...std(15), ...set(19),
    ...product(16, [7, 8, 9], 10, 11, [1, 2, 3]),
    ...get(19), ...get(19), ...shuffle([2, 2, 2, 2]), ...get(12), ...BITSELECT, ...set(20),
    ...get(0), ...get(17), ...store(0),
    ...get(0), ...get(18), ...store(12),
    ...get(0), ...get(19), ...store(24),
    ...get(0), ...get(20), ...store(32),
    ...get(0), 0x41, ...leb(48), 0x6a, ...set(0), // p += 48 (i32.const takes signed LEB: 48 < 64)
    0x0c, 0x00, // continue
    0x0b, 0x0b, // end loop, end block
    0x0b, // end function
  ];
  const bytes = [
    0x00, 0x61, 0x73, 0x6d, 0x01, 0x00, 0x00, 0x00,
    ...section(1, [0x01, 0x60, 0x02, 0x7f, 0x7f, 0x00]),
    ...section(2, [0x01, 0x01, 0x65, 0x01, 0x6d, 0x02, 0x00, 0x01]), // import e.m: memory, min 1 page
    ...section(3, [0x01, 0x00]),
    ...section(7, [0x01, 0x01, 0x66, 0x00, 0x00]), // export "f"
    ...section(10, [0x01, ...leb(body.length), ...body]),
  ];
  return new Uint8Array(bytes);
}

/** Signed LEB128, for i32.const. */
function sleb(n: number): number[] {
  const out: number[] = [];
  n |= 0;
  for (;;) {
    const b = n & 0x7f;
    n >>= 7;
    if ((n === 0 && (b & 0x40) === 0) || (n === -1 && (b & 0x40) !== 0)) {
      out.push(b);
      return out;
    }
    out.push(b | 0x80);
  }
}

/*
 * The 8-bit cell quantiser (srgb.ts quantiseCells) as a scalar loop: the JS loop's bounds checks
 * and three dependent typed-array reads cost ~4 ns a value, a third of a 1024-px proxy render.
 * q8(src, end, dst, cells, edges, lowBits, count): for each float's bits b at src..end,
 *   t = (b − lowBits) >> 15, 0 when outside the table; k = cells[t];
 *   v = k + ((edges[k] − b − 1) >>> 31); 0 below lowBits; ≥ 1.0: 255, NaN: 0. One byte to dst.
 * dst may equal src: byte i is written after float i is read, and later floats lie beyond it.
 */
function quant8ModuleBytes(): Uint8Array<ArrayBuffer> {
  const get = (i: number): number[] => [0x20, i];
  const set = (i: number): number[] => [0x21, i];
  const c = (v: number): number[] => [0x41, ...sleb(v)];
  const [SRC, END, DST, CELLS, EDGES, LOW, COUNT, B, T, K, V] = [0, 1, 2, 3, 4, 5, 6, 7, 8, 9, 10];
  const I32_ADD = 0x6a, I32_SUB = 0x6b, SHL = 0x74, SHR_S = 0x75, SHR_U = 0x76, LT_S = 0x48, LT_U = 0x49, GT_S = 0x4a, GE_S = 0x4e, GE_U = 0x4f, SELECT = 0x1b;
  const body = [
    0x01, 0x04, 0x7f, // four i32 locals: b, t, k, v
    0x02, 0x40, 0x03, 0x40,
    ...get(SRC), ...get(END), GE_U, 0x0d, 0x01,
    ...get(SRC), 0x28, 0x02, 0x00, ...set(B),
    ...get(B), ...get(LOW), I32_SUB, ...c(15), SHR_S, ...set(T),
    ...get(T), ...c(0), ...get(T), ...get(COUNT), LT_U, SELECT, ...set(T),
    ...get(CELLS), ...get(T), I32_ADD, 0x2d, 0x00, 0x00, ...set(K),
    ...get(K),
    ...get(EDGES), ...get(K), ...c(2), SHL, I32_ADD, 0x28, 0x02, 0x00,
    ...get(B), I32_SUB, ...c(1), I32_SUB, ...c(31), SHR_U,
    I32_ADD, ...set(V),
    ...c(0), ...get(V), ...get(B), ...get(LOW), LT_S, SELECT, ...set(V),
    ...c(0), ...c(255), ...get(B), ...c(0x7f800000), GT_S, SELECT,
    ...get(V), ...get(B), ...c(0x3f800000), GE_S, SELECT, ...set(V),
    ...get(DST), ...get(V), 0x3a, 0x00, 0x00,
    ...get(DST), ...c(1), I32_ADD, ...set(DST),
    ...get(SRC), ...c(4), I32_ADD, ...set(SRC),
    0x0c, 0x00,
    0x0b, 0x0b,
    0x0b,
  ];
  const bytes = [
    0x00, 0x61, 0x73, 0x6d, 0x01, 0x00, 0x00, 0x00,
    ...section(1, [0x01, 0x60, 0x07, 0x7f, 0x7f, 0x7f, 0x7f, 0x7f, 0x7f, 0x7f, 0x00]),
    ...section(2, [0x01, 0x01, 0x65, 0x01, 0x6d, 0x02, 0x00, 0x01]),
    ...section(3, [0x01, 0x00]),
    ...section(7, [0x01, 0x01, 0x66, 0x00, 0x00]),
    ...section(10, [0x01, ...leb(body.length), ...body]),
  ];
  return new Uint8Array(bytes);
}

let quant8Compiled: WebAssembly.Module | null | undefined;
function quant8Module(): WebAssembly.Module | null {
  if (quant8Compiled === undefined) {
    try {
      const bytes = quant8ModuleBytes();
      quant8Compiled = typeof WebAssembly !== "undefined" && WebAssembly.validate(bytes) ? new WebAssembly.Module(bytes) : null;
    } catch {
      quant8Compiled = null;
    }
  }
  return quant8Compiled;
}

let compiled: WebAssembly.Module | null | undefined;
function simdModule(): WebAssembly.Module | null {
  if (compiled === undefined) {
    try {
      const bytes = moduleBytes();
      compiled = typeof WebAssembly !== "undefined" && WebAssembly.validate(bytes) ? new WebAssembly.Module(bytes) : null;
    } catch {
      compiled = null;
    }
  }
  return compiled;
}

type Q8 = (src: number, end: number, dst: number, cells: number, edges: number, lowBits: number, count: number) => void;
type Backing = { memory: WebAssembly.Memory; run: (p: number, end: number) => void; q8?: Q8 | null };
const backings = new WeakMap<ArrayBufferLike, Backing>();

/** A zeroed Float32Array of `length` floats that the SIMD matrix can work on (plain array if no SIMD). */
export function allocSimdRgb(length: number): Float32Array {
  const mod = simdModule();
  const bytes = PARAM_BYTES + length * 4 + 16;
  if (!mod || bytes > 2 ** 32 - 65536) return new Float32Array(length);
  const memory = new WebAssembly.Memory({ initial: Math.ceil(bytes / 65536) });
  const instance = new WebAssembly.Instance(mod, { e: { m: memory } });
  const run = instance.exports.f as (p: number, end: number) => void;
  backings.set(memory.buffer, { memory, run });
  return new Float32Array(memory.buffer, PARAM_BYTES, length);
}

/*
 * Working buffers are pooled: a fresh 2K frame's memory costs ~12 ms of page faults on first
 * touch (a 4K one ~50 ms) and wasm memories are only freed by GC. At most POOL_BYTES stay idle.
 */
const POOL_BYTES = 160 * 1024 * 1024;
const idle: Float32Array[] = [];

/** As allocSimdRgb, but may hand back a released buffer with old contents (caller overwrites all). */
export function takeSimdRgb(length: number): Float32Array {
  const i = idle.findIndex((a) => a.length === length);
  if (i >= 0) return idle.splice(i, 1)[0]!;
  return allocSimdRgb(length);
}

/** Gives a buffer from allocSimdRgb/takeSimdRgb back for reuse; the caller must not touch it again. */
export function releaseSimdRgb(a: Float32Array): void {
  if (!backings.has(a.buffer) || idle.includes(a)) return;
  idle.push(a);
  let bytes = idle.reduce((s, b) => s + b.byteLength, 0);
  while (bytes > POOL_BYTES && idle.length) bytes -= idle.shift()!.byteLength;
}

/**
 * Quantises `a` (from allocSimdRgb/takeSimdRgb) to 8-bit codes in place with the cell tables of
 * srgb.ts's 8-bit quantiser and answers the codes, a view over `a`'s first bytes (its floats are
 * gone). Null when `a` is not such an array or WebAssembly is missing: quantise in JS then.
 */
export function quantise8InPlace(a: Float32Array, cells: Uint8Array, edgeBits: Int32Array, lowBits: number): Uint8Array | null {
  const backing = backings.get(a.buffer);
  if (!backing || a.byteOffset !== PARAM_BYTES || Q8_TABLES + cells.length + 4 * edgeBits.length + 8 > PARAM_BYTES) return null;
  if (backing.q8 === undefined) {
    const mod = quant8Module();
    backing.q8 = mod ? (new WebAssembly.Instance(mod, { e: { m: backing.memory } }).exports.f as Q8) : null;
  }
  if (!backing.q8) return null;
  const buf = backing.memory.buffer;
  const edges = (Q8_TABLES + cells.length + 3) & ~3;
  new Uint8Array(buf, Q8_TABLES, cells.length).set(cells);
  new Int32Array(buf, edges, edgeBits.length).set(edgeBits);
  backing.q8(PARAM_BYTES, PARAM_BYTES + a.length * 4, PARAM_BYTES, Q8_TABLES, edges, lowBits, cells.length);
  return new Uint8Array(buf, PARAM_BYTES, a.length);
}

/** out = M · rgb + offset in place, for arrays from allocSimdRgb; false when `a` is not one. */
export function matrixSimd(a: Float32Array, m: readonly (readonly number[])[], offset: readonly number[], keep: readonly boolean[]): boolean {
  const backing = backings.get(a.buffer);
  if (!backing || a.byteOffset !== PARAM_BYTES || a.length % 3 !== 0) return false;
  const f = new Float32Array(backing.memory.buffer, 0, 48);
  const u = new Uint32Array(backing.memory.buffer, 0, 48);
  const ones = 0xffffffff;
  for (let col = 0; col < 3; col++) {
    f.set([m[0]![col]!, m[1]![col]!, m[2]![col]!, 0], col * 4);
    f.set([0, m[0]![col]!, m[1]![col]!, m[2]![col]!], 20 + col * 4);
  }
  const o = [offset[0] ?? 0, offset[1] ?? 0, offset[2] ?? 0];
  f.set([o[0]!, o[1]!, o[2]!, 0], 12);
  f.set([0, o[0]!, o[1]!, o[2]!], 32);
  const ch = keep.map((k) => (k ? 0 : ones));
  u.set([ch[0]!, ch[1]!, ch[2]!, 0], 16);
  u.set([0, ch[0]!, ch[1]!, ch[2]!], 36);
  u.set([0, ones, ones, ones], 40);
  const pixels = a.length / 3;
  const grouped = pixels - (pixels % 4);
  backing.run(PARAM_BYTES, PARAM_BYTES + grouped * 12);
  // The tail (< 4 pixels) in float32 steps with the same float32 coefficients as the lanes.
  const m00 = f[0]!, m10 = f[1]!, m20 = f[2]!, m01 = f[4]!, m11 = f[5]!, m21 = f[6]!, m02 = f[8]!, m12 = f[9]!, m22 = f[10]!;
  const ob = [f[12]!, f[13]!, f[14]!];
  for (let i = grouped * 3; i < a.length; i += 3) {
    const r = a[i]!, g = a[i + 1]!, b = a[i + 2]!;
    if (!keep[0]) a[i] = Math.fround(Math.fround(Math.fround(ob[0]! + Math.fround(m00 * r)) + Math.fround(m01 * g)) + Math.fround(m02 * b));
    if (!keep[1]) a[i + 1] = Math.fround(Math.fround(Math.fround(ob[1]! + Math.fround(m10 * r)) + Math.fround(m11 * g)) + Math.fround(m12 * b));
    if (!keep[2]) a[i + 2] = Math.fround(Math.fround(Math.fround(ob[2]! + Math.fround(m20 * r)) + Math.fround(m21 * g)) + Math.fround(m22 * b));
  }
  return true;
}
