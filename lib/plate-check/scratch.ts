/*
 * Large scratch buffers of the check (3×3 means, departure map, spot labels), kept between checks:
 * a fresh 2K buffer costs its page faults on first write (~25 ms for the 26 MB of 3×3 means),
 * which is a twentieth of a check. Idle buffers are capped; whoever takes one owns it until it is
 * given back and must not assume any contents.
 */

/** Idle bytes kept at most (a 4K check's three buffers are ~180 MB; a 2K check's ~45 MB). */
export const PLATE_CHECK_SCRATCH_BYTES = 64 * 1024 * 1024;

const idle: ArrayBuffer[] = [];

export function takeBuffer(bytes: number): ArrayBuffer {
  const i = idle.findIndex((b) => b.byteLength === bytes);
  return i >= 0 ? idle.splice(i, 1)[0]! : new ArrayBuffer(bytes);
}

export function giveBack(...buffers: ArrayBuffer[]): void {
  for (const b of buffers) if (!idle.includes(b)) idle.push(b);
  let total = idle.reduce((t, b) => t + b.byteLength, 0);
  while (total > PLATE_CHECK_SCRATCH_BYTES && idle.length) total -= idle.shift()!.byteLength;
}
