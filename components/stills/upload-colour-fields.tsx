"use client";

import { useId } from "react";
import type { ExrPreflight } from "@/components/stills/exr-sniff";
import { inputClasses } from "@/components/ui/field";
import { COLOUR_SPACE_LABELS, COLOUR_SPACES, type ColourSpace } from "@/lib/colour/spaces";

export type ColourChoice = ColourSpace | "auto";

type Props = {
  colourSpace: ColourChoice;
  layer: string | undefined;
  exr: ExrPreflight | null | undefined;
  disabled: boolean;
  onChange: (patch: { colourSpace?: ColourChoice; layer?: string }) => void;
};

/** What the automatic choice will be, in words, for the row's file. */
function automaticLabel(exr: ExrPreflight | null | undefined): string {
  if (exr?.ok) return exr.space ? `Automatic: ${COLOUR_SPACE_LABELS[exr.space]} (the file's chromaticities)` : "Automatic: linear Rec.709 (the file's chromaticities are none of these)";
  if (exr === null) return "Automatic: sRGB-encoded (linear for float TIFF)";
  return "Automatic (from the file)";
}

/** The colour space a still is declared in, and for OpenEXR the layer to show. */
export function UploadColourFields({ colourSpace, layer, exr, disabled, onChange }: Props) {
  const id = useId();
  return (
    <div className="grid gap-2 sm:grid-cols-2">
      <div className="space-y-1">
        <label htmlFor={`${id}-space`} className="block text-xs font-medium">
          Colour space
        </label>
        <select id={`${id}-space`} className={inputClasses} value={colourSpace} disabled={disabled} onChange={(e) => onChange({ colourSpace: e.target.value as ColourChoice })}>
          <option value="auto">{automaticLabel(exr)}</option>
          {COLOUR_SPACES.map((s) => (
            <option key={s} value={s}>
              {COLOUR_SPACE_LABELS[s]}
            </option>
          ))}
        </select>
      </div>
      {exr?.ok ? (
        <div className="space-y-1">
          <label htmlFor={`${id}-layer`} className="block text-xs font-medium">
            Layer shown <span className="text-muted">({exr.size}, {exr.compression}{exr.pixelAspectRatio !== 1 ? `, pixel aspect ${exr.pixelAspectRatio}` : ""})</span>
          </label>
          <select id={`${id}-layer`} className={inputClasses} value={layer ?? exr.defaultLayer} disabled={disabled} onChange={(e) => onChange({ layer: e.target.value })}>
            {exr.layers.map((l) => (
              <option key={l.id} value={l.id}>
                {l.label}
              </option>
            ))}
          </select>
        </div>
      ) : exr && !exr.ok ? (
        <p className="self-end text-xs text-bad">{exr.message}</p>
      ) : null}
    </div>
  );
}
