import "server-only";
import { MEMORY_BUDGET } from "@/lib/memory/budget";
import { labWasmInstance } from "@/lib/lab/wasm/modules";

/*
 * A 3×3 colour matrix over interleaved RGB float32 in WebAssembly SIMD (lib/lab/wasm/matrix.wat),
 * and the 8-bit quantiser as a scalar WebAssembly loop (quant8.wat). A JS loop costs ~5 ns per
 * pixel (bounds checks, float32↔float64); one 128-bit lane group per pixel brings the matrix step
 * near the memory-copy floor (≤ 2.5× a float copy).
 *
 * Both work on buffers that live in a WebAssembly memory of their own: allocSimdRgb() hands out
 * such a Float32Array (the engine's working image always is one); for any other array matrixSimd()
 * answers false and the caller uses its JS loop. A module that fails to load throws (see
 * lib/lab/wasm/modules.ts): there is no silent fallback for the engine's own buffers.
 *
 * Memory layout: bytes 0..175 the matrix parameters (see matrix.wat), then the 8-bit quantiser's
 * tables; image floats from PARAM_BYTES, plus 16 bytes of slack because each pixel is read and
 * written as 16 bytes.
 */

const PARAM_BYTES = 8192;
// Tables of the 8-bit quantiser (quantise8InPlace) live in the parameter area after the matrix's.
const Q8_TABLES = 256;

type Q8 = (src: number, end: number, dst: number, cells: number, edges: number, lowBits: number, count: number) => void;
type Backing = { memory: WebAssembly.Memory; run: (p: number, end: number) => void; q8?: Q8 };
const backings = new WeakMap<ArrayBufferLike, Backing>();

/** A zeroed Float32Array of `length` floats in a WebAssembly memory of its own, which the SIMD matrix works on. */
export function allocSimdRgb(length: number): Float32Array {
  const bytes = PARAM_BYTES + length * 4 + 16;
  if (bytes > 2 ** 32 - 65536) throw new RangeError("image too large for the lab's working memory");
  const memory = new WebAssembly.Memory({ initial: Math.ceil(bytes / 65536) });
  const run = labWasmInstance<{ f: (p: number, end: number) => void }>("matrix", memory).f;
  backings.set(memory.buffer, { memory, run });
  return new Float32Array(memory.buffer, PARAM_BYTES, length);
}

/*
 * Working buffers are pooled: a fresh 2K frame's memory costs ~12 ms of page faults on first
 * touch (a 4K one ~50 ms) and wasm memories are only freed by GC. At most POOL_BYTES stay idle.
 */
const POOL_BYTES = MEMORY_BUDGET.labRgbPool;
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
 * gone). Null when `a` is not such an array: quantise in JS then.
 */
export function quantise8InPlace(a: Float32Array, cells: Uint8Array, edgeBits: Int32Array, lowBits: number): Uint8Array | null {
  const backing = backings.get(a.buffer);
  if (!backing || a.byteOffset !== PARAM_BYTES || Q8_TABLES + cells.length + 4 * edgeBits.length + 8 > PARAM_BYTES) return null;
  backing.q8 ??= labWasmInstance<{ f: Q8 }>("quant8", backing.memory).f;
  const buf = backing.memory.buffer;
  const edges = (Q8_TABLES + cells.length + 3) & ~3;
  new Uint8Array(buf, Q8_TABLES, cells.length).set(cells);
  new Int32Array(buf, edges, edgeBits.length).set(edgeBits);
  backing.q8(PARAM_BYTES, PARAM_BYTES + a.length * 4, PARAM_BYTES, Q8_TABLES, edges, lowBits, cells.length);
  return new Uint8Array(buf, PARAM_BYTES, a.length);
}

/** Whether `a` is a working buffer from allocSimdRgb/takeSimdRgb (so the WebAssembly paths serve it). */
export function isSimdRgb(a: Float32Array): boolean {
  const backing = backings.get(a.buffer);
  return backing !== undefined && a.byteOffset === PARAM_BYTES;
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
