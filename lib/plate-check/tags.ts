import type { Findings, TagReason } from "@/lib/plate-check/schemas";
import { UNEVEN_SCREEN_PERCENT } from "@/lib/plate-check/screen";

/*
 * Findings → the department's problem tags (slugs of scripts/seed/data/tags.ts), each with the
 * measurement behind it. Client-safe. Clipping has no problem tag of its own: it is reported but
 * points to no method.
 */

export const PROBLEM_TAG = {
  markers: "tracking-markers",
  unevenScreen: "uneven-screen",
  defects: "dead-or-stuck-pixels",
  dust: "dust-and-scratches",
  grain: "grain-and-noise",
} as const;

export const PLATE_TAG = { green: "green-screen", blue: "blue-screen" } as const;

/**
 * Grain worth restoring after a cleanup: σ above ~0.3 % of full scale (about 0.8 of an 8-bit
 * code). Rule of thumb, no published source: below it a patch without grain does not show.
 */
export const VISIBLE_GRAIN = 0.003;

export function problemTagsFor(f: Findings): { problemTags: TagReason[]; plateTags: string[] } {
  const tags: TagReason[] = [];
  if (f.markers.count > 0) {
    const r = { slug: PROBLEM_TAG.markers, because: `${f.markers.count} tracking marker${f.markers.count === 1 ? "" : "s"} in ${f.markers.shades.length} shade${f.markers.shades.length === 1 ? "" : "s"} on the screen` };
    f.markers.tags.push(r);
    tags.push(r);
  }
  if (f.screen.present && f.screen.unevenness !== null && f.screen.unevenness > UNEVEN_SCREEN_PERCENT) {
    const r = { slug: PROBLEM_TAG.unevenScreen, because: `screen brightness varies by ${f.screen.unevenness.toFixed(1)} % (more than ${UNEVEN_SCREEN_PERCENT} %)` };
    f.screen.tags.push(r);
    tags.push(r);
  }
  if (f.defects.count > 0) {
    const r = { slug: PROBLEM_TAG.defects, because: `${f.defects.count} dead, hot or stuck pixel${f.defects.count === 1 ? "" : "s"}` };
    f.defects.tags.push(r);
    tags.push(r);
  }
  if (f.dust.dust + f.dust.hairs > 0) {
    const r = { slug: PROBLEM_TAG.dust, because: `${f.dust.dust} dust speck${f.dust.dust === 1 ? "" : "s"} and ${f.dust.hairs} hair${f.dust.hairs === 1 ? "" : "s"}` };
    f.dust.tags.push(r);
    tags.push(r);
  }
  const worst = Math.max(...f.noise.sigma);
  if (worst >= VISIBLE_GRAIN) {
    const r = { slug: PROBLEM_TAG.grain, because: `grain σ ${f.noise.codeMax > 1 ? `${(worst * f.noise.codeMax).toFixed(2)} code values` : worst.toFixed(4)} in ${f.noise.noisiest.toUpperCase()} — a cleaned area needs it put back` };
    f.noise.tags.push(r);
    tags.push(r);
  }
  const plateTags: string[] = [];
  if (f.screen.present && f.screen.kind === "green") plateTags.push(PLATE_TAG.green);
  if (f.screen.present && f.screen.kind === "blue") plateTags.push(PLATE_TAG.blue);
  return { problemTags: tags, plateTags };
}
