import type { ShotResponse } from "@/lib/shots/schemas";

/*
 * Display helpers shared by server pages and client components. Kept out of "use client" files:
 * a server component that imports a value from one gets a client reference, not the value.
 */

/** Shots per page on a show page, for the first server render and the client pages after it. */
export const SHOTS_PAGE_SIZE = 50;

/** "1001–1096 (96 frames)": both ends are included, so the count is end − start + 1 (common practice, no published source). */
export function frameRange(s: Pick<ShotResponse, "frameStart" | "frameEnd">): string {
  if (s.frameStart === null && s.frameEnd === null) return "—";
  if (s.frameStart === null || s.frameEnd === null) return `${s.frameStart ?? "?"}–${s.frameEnd ?? "?"}`;
  const n = s.frameEnd - s.frameStart + 1;
  return `${s.frameStart}–${s.frameEnd} (${n} frame${n === 1 ? "" : "s"})`;
}
