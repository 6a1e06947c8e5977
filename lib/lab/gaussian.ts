import "server-only";
import { MEMORY_BUDGET } from "@/lib/memory/budget";
import { labWasmInstance } from "@/lib/lab/wasm/modules";

/*
 * The exact Gaussian of the still lab (soften, and the two blurs of flatten on exact renders).
 *
 * Definition, the same at every sigma and at the borders:
 *   weights  g(t) = exp(−t² / 2σ²) for integer t in [−R, R], divided by their sum;
 *   radius   R = floor(4σ + 0.5) (the kernel is cut at 4 sigma, rounded to the nearest pixel);
 *   borders  outside the frame the edge pixel repeats (a row's first and last pixel, a column's
 *            top and bottom pixel);
 *   applied  along rows, then along columns (the 2-D kernel is the product of the two).
 * This is scipy.ndimage.gaussian_filter(plane, σ, mode="nearest", truncate=4.0), which the tests
 * compare against in float64.
 *
 * Two exact methods, chosen per call by the radius, where the measured times cross
 * (bench/lab.ts prints both): direct convolution in WebAssembly SIMD (cost grows with R), and
 * convolution through the FFT in float64 (cost grows with log of the padded row length, whatever
 * the radius). Both compute every output pixel from the full kernel; neither approximates.
 */

const GAUSS_TRUNCATE = 4;

export function gaussianRadius(sigma: number): number {
  return Math.floor(GAUSS_TRUNCATE * sigma + 0.5);
}

/** k[0..R]: the centre weight and one half of the normalised kernel, in float64. */
export function gaussianHalfKernel(sigma: number): Float64Array {
  const r = gaussianRadius(sigma);
  const k = new Float64Array(r + 1);
  let sum = 0;
  for (let t = 0; t <= r; t++) {
    k[t] = Math.exp(-(t * t) / (2 * sigma * sigma));
    sum += t === 0 ? k[t]! : 2 * k[t]!;
  }
  for (let t = 0; t <= r; t++) k[t] = k[t]! / sum;
  return k;
}

/*
 * Above these radii the FFT is the faster exact method (measured on 2048 × 1080 and 4096 × 2160
 * planes, bench/lab.ts "exact blur methods"); float64 direct passes carry two values per SIMD lane
 * group instead of four, so they cross earlier.
 */
export const DIRECT_MAX_RADIUS = { f32: 48, f64: 16 } as const;

type BlurMethod = "direct" | "fft";

type GaussExports = {
  rows32(src: number, dst: number, w: number, rows: number, k: number, r: number, pad: number): void;
  rows64(src: number, dst: number, w: number, rows: number, k: number, r: number, pad: number): void;
  transpose32(src: number, dst: number, w: number, h: number): void;
  transpose64(src: number, dst: number, w: number, h: number): void;
};
type FftExports = {
  dif(buf: number, m: number, tw: number): void;
  convLines(src: number, dst: number, n: number, lines: number, lineStride: number, elemStride: number, r: number, m: number,
    spec: number, tw: number, work: number): void;
  convColumns8(src: number, dst: number, w: number, h: number, x0: number, x1: number, r: number, m: number, spec: number,
    tw: number, work: number): void;
};

/*
 * One working memory per process for both modules (a blur runs to the end without yielding, so
 * calls never overlap). It grows to the largest plane blurred — two float64 planes of it, ~140 MB
 * for a 4096 × 2160 flatten — and the engine lets it go after a run when it holds more than
 * EXACT_BLUR_KEEP_BYTES.
 */
let memory: WebAssembly.Memory | null = null;
let gauss: GaussExports | null = null;
let fft: FftExports | null = null;

const EXACT_BLUR_KEEP_BYTES = MEMORY_BUDGET.labExactBlurIdle;

function workspace(bytes: number): { buffer: ArrayBuffer; gauss: GaussExports; fft: FftExports } {
  const pages = Math.ceil(bytes / 65536);
  if (!memory || memory.buffer.byteLength < bytes) {
    if (memory && memory.buffer.byteLength > 0) memory.grow(pages - memory.buffer.byteLength / 65536);
    else memory = new WebAssembly.Memory({ initial: pages });
    if (!gauss) {
      gauss = labWasmInstance<GaussExports>("gauss", memory);
      fft = labWasmInstance<FftExports>("fft", memory);
    }
  }
  return { buffer: memory.buffer, gauss: gauss!, fft: fft! };
}

const align = (n: number): number => (n + 63) & ~63;

const twiddleTables = new Map<number, Float64Array>();

/** tw[j], j < M/2: [cos θ, cos θ, sin θ, −sin θ] for θ = 2πj/M (the layout fft.wat multiplies by). */
function twiddles(m: number): Float64Array {
  let tw = twiddleTables.get(m);
  if (!tw) {
    tw = new Float64Array(2 * m);
    for (let j = 0; j < m / 2; j++) {
      const th = (2 * Math.PI * j) / m, c = Math.cos(th), s = Math.sin(th);
      tw.set([c, c, s, -s], 4 * j);
    }
    twiddleTables.set(m, tw);
  }
  return tw;
}

/**
 * Spectrum of the kernel laid out circularly (k[t] at t and M − t), divided by M, in the bit-reversed
 * order the forward transform leaves the data in: the same transform of the kernel. Real up to
 * rounding (the kernel is even), so the imaginary parts are dropped.
 */
function kernelSpectrum(k: Float64Array, m: number): Float64Array {
  const r = k.length - 1;
  const TW = 0, WORK = align(TW + m * 16);
  const { buffer, fft: f } = workspace(WORK + m * 16);
  new Float64Array(buffer, TW, 2 * m).set(twiddles(m));
  const work = new Float64Array(buffer, WORK, 2 * m).fill(0);
  work[0] = k[0]!;
  for (let j = 1; j <= r; j++) { work[2 * j] = k[j]!; work[2 * (m - j)] = k[j]!; }
  f.dif(WORK, m, TW);
  const spec = new Float64Array(m);
  for (let j = 0; j < m; j++) spec[j] = work[2 * j]! / m;
  return spec;
}

const spectra = new Map<string, Float64Array>();

function spectrumFor(sigma: number, k: Float64Array, m: number): Float64Array {
  const key = `${sigma}:${m}`;
  let s = spectra.get(key);
  if (!s) {
    s = kernelSpectrum(k, m);
    if (spectra.size >= 16) spectra.delete(spectra.keys().next().value!);
    spectra.set(key, s);
  }
  return s;
}

/*
 * The transform length for lines of n values: the power of two with the least work for the whole
 * line, in segments of M − 2R outputs each. Above 2048 points the transform's data and twiddles
 * outgrow the first-level cache (measured: ~35 % more time per point and stage).
 */
function transformLength(n: number, r: number): number {
  let best = 0, bestCost = Infinity;
  for (let m = 64; m <= 1 << 16; m *= 2) {
    if (m - 2 * r < 1) continue;
    const segments = Math.ceil(n / (m - 2 * r));
    const cost = segments * m * Math.log2(m) * (m > 2048 ? 1.35 : 1);
    if (cost < bestCost) { best = m; bestCost = cost; }
    if (m >= n + 2 * r) break;
  }
  return best;
}

/** How often each method ran in this process (tests check that the WebAssembly paths serve). */
const counts = { direct: 0, fft: 0, definition: 0 };
export function exactBlurCounts(): Readonly<typeof counts> {
  return { ...counts };
}

type Plane = Float32Array | Float64Array;

/**
 * The exact Gaussian of a plane held in the blur's own working memory: `fill` writes the input
 * (width × height values, row by row) into the plane it is handed, `read` reads the result from the
 * plane it is handed; neither may keep it. `kind` is the precision the caller needs: "f64" keeps
 * float64 throughout; "f32" may store the direct passes' values in float32 (the FFT path computes
 * in float64 either way). Saves the copies (and a 4K plane's memory) that blurExact makes.
 */
export function exactBlurWith(width: number, height: number, sigma: number, kind: "f32" | "f64",
  fill: (input: Plane) => void, read: (output: Plane) => void, method: BlurMethod = defaultMethod(sigma, kind)): void {
  const k = gaussianHalfKernel(sigma);
  const r = k.length - 1;
  const n = width * height;
  if (width < 4 || height < 4 || r === 0) {
    const plane = new Float64Array(n);
    fill(plane);
    if (r > 0) {
      counts.definition++;
      blurDefinition(plane, width, height, k);
    }
    read(plane);
    return;
  }
  if (method === "direct") {
    counts.direct++;
    const is64 = kind === "f64", e = is64 ? 8 : 4;
    const K = 0, PAD = align((r + 1) * e), A = align(PAD + (Math.max(width, height) + 2 * r) * e);
    const B = align(A + n * e), end = B + n * e;
    const { buffer, gauss: g } = workspace(end);
    const view = (off: number, len: number): Plane => (is64 ? new Float64Array(buffer, off, len) : new Float32Array(buffer, off, len));
    view(K, r + 1).set(k);
    fill(view(A, n));
    const rows = is64 ? g.rows64 : g.rows32, transpose = is64 ? g.transpose64 : g.transpose32;
    rows(A, B, width, height, K, r, PAD);
    transpose(B, A, width, height);
    rows(A, B, height, width, K, r, PAD);
    transpose(B, A, height, width);
    read(view(A, n));
    return;
  }
  counts.fft++;
  const mRow = transformLength(width, r), mCol = transformLength(height, r), mMax = Math.max(mRow, mCol);
  const specRow = spectrumFor(sigma, k, mRow), specCol = spectrumFor(sigma, k, mCol);
  // WORK: four lines of M complex (the column pass fills four at a time).
  const SPEC = 0, TW = align(SPEC + mMax * 8), WORK = align(TW + mMax * 16), A = align(WORK + 4 * mMax * 16);
  const B = align(A + n * 8), end = B + n * 8;
  const { buffer, fft: f } = workspace(end);
  fill(new Float64Array(buffer, A, n));
  const tables = (m: number, spec: Float64Array): void => {
    new Float64Array(buffer, SPEC, m).set(spec);
    new Float64Array(buffer, TW, 2 * m).set(twiddles(m));
  };
  tables(mRow, specRow);
  f.convLines(A, B, width, height, width * 8, 8, r, mRow, SPEC, TW, WORK); // rows, two per transform
  tables(mCol, specCol);
  // Columns: eight at a time (one cache line of each row), the rest two at a time.
  const w8 = width - (width % 8);
  f.convColumns8(B, A, width, height, 0, w8, r, mCol, SPEC, TW, WORK);
  if (w8 < width) f.convLines(B + w8 * 8, A + w8 * 8, height, width - w8, 8, width * 8, r, mCol, SPEC, TW, WORK);
  read(new Float64Array(buffer, A, n));
}

function defaultMethod(sigma: number, kind: "f32" | "f64"): BlurMethod {
  return gaussianRadius(sigma) <= DIRECT_MAX_RADIUS[kind] ? "direct" : "fft";
}

/** Gaussian blur of a plane in place, exactly as defined above (float32 planes keep float32 storage). */
export function blurExact(plane: Plane, width: number, height: number, sigma: number, method?: BlurMethod): void {
  if (plane.length !== width * height) throw new Error("blurExact: plane size does not match width × height");
  exactBlurWith(width, height, sigma, plane instanceof Float64Array ? "f64" : "f32", (a) => a.set(plane), (b) => plane.set(b), method);
}

/** Lets the blur's working memory go if it grew beyond EXACT_BLUR_KEEP_BYTES (call after a run). */
export function releaseExactBlurMemory(): void {
  if (memory && memory.buffer.byteLength > EXACT_BLUR_KEEP_BYTES) {
    memory = null;
    gauss = null;
    fft = null;
  }
}

/** The definition, literally (float64 sums): for planes too narrow for the SIMD passes. */
function blurDefinition(plane: Float32Array | Float64Array, width: number, height: number, k: Float64Array): void {
  const r = k.length - 1;
  const tmp = new Float64Array(width * height);
  const clamp = (v: number, n: number): number => (v < 0 ? 0 : v >= n ? n - 1 : v);
  for (let y = 0; y < height; y++) for (let x = 0; x < width; x++) {
    let s = 0;
    for (let t = -r; t <= r; t++) s += k[Math.abs(t)]! * plane[y * width + clamp(x + t, width)]!;
    tmp[y * width + x] = s;
  }
  for (let y = 0; y < height; y++) for (let x = 0; x < width; x++) {
    let s = 0;
    for (let t = -r; t <= r; t++) s += k[Math.abs(t)]! * tmp[clamp(y + t, height) * width + x]!;
    plane[y * width + x] = s;
  }
}
