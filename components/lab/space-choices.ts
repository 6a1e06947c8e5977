import type { LabSpaceChoice, LabStillInfo } from "@/components/lab/lab-api";
import { COLOUR_SPACE_SHORT, LINEAR_SPACES, linearOf } from "@/lib/colour/spaces";

/**
 * The lab's "work in" options for a still: linear light of its own space (an sRGB-encoded
 * still decoded to linear Rec.709), another linear space (converted with the published 3×3
 * matrices), or the stored values. A still declared as data has stored values only.
 */
export function spaceChoices(still: Pick<LabStillInfo, "colourSpace"> | null): [LabSpaceChoice, string][] {
  const colour = still?.colourSpace ?? "srgb";
  const own = linearOf(colour);
  if (!own) return [["stored", "Stored values (not colour)"]];
  const ownLabel = colour === "srgb" ? "Linear light (sRGB decoded)" : `Linear light, its own space (${COLOUR_SPACE_SHORT[own]})`;
  return [
    ["linear", ownLabel],
    ...LINEAR_SPACES.filter((s) => s !== own).map((s): [LabSpaceChoice, string] => [`linear:${s}`, `Linear light, converted to ${COLOUR_SPACE_SHORT[s]}`]),
    ["stored", "Stored values"],
  ];
}
