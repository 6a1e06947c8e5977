/**
 * Every in-process cache's byte cap, in one place, so their sum is known (agreed interface
 * between the issues that add caches; add an entry beside your cache's name).
 */
export const MEMORY_BUDGET = {
  /** Decoded OpenEXR stills (float samples) for the pixel probe and display renders (lib/stills/exr.ts). */
  decodedExr: 256 * 1024 * 1024,
} as const;

export const MEMORY_BUDGET_TOTAL: number = Object.values(MEMORY_BUDGET).reduce((a, b) => a + b, 0);
