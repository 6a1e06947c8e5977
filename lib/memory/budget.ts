/*
 * Every in-process cache's byte cap, in one place, with their total: what a Plateroom process may
 * hold on to between requests beyond its working set. Caches are lru-cache instances sized from
 * here (maxSize in bytes); the still lab's buffer pools keep at most their entry idle.
 */

const MB = 1024 * 1024;

export const MEMORY_BUDGET = {
  /** Encoded lab results by recipe and still (lib/lab/runner.ts), answered again without a run. */
  labResults: 256 * MB,
  /** Decoded proxy stills as working-space floats (lib/lab/runner.ts): re-renders skip the decode. */
  labDecodedProxies: 128 * MB,
  /** Idle float32 RGB working buffers in WebAssembly memory (lib/lab/simd.ts). */
  labRgbPool: 160 * MB,
  /** Idle matte and scratch planes (lib/lab/engine.ts). */
  labPlanePool: 64 * MB,
  /** The exact blur's working memory kept after a run (lib/lab/gaussian.ts); larger is let go. */
  labExactBlurIdle: 96 * MB,
  /** Decoded originals for the pixel probe (lib/stills/pixels.ts). */
  stillPixels: 256 * MB,
  /** Rendered technique pages kept per person (lib/page-cache/rendered-pages.ts). */
  renderedPages: 64 * MB,
  /** A technique page's reads per viewer until the next write (lib/remembered-reads.ts). */
  rememberedReads: 64 * MB,
  /** Decoded OpenEXR stills (float samples) for the pixel probe and display renders (lib/stills/exr.ts). */
  decodedExr: 256 * MB,
} as const;

export const MEMORY_BUDGET_TOTAL: number = Object.values(MEMORY_BUDGET).reduce((a, b) => a + b, 0);
