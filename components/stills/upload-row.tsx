"use client";

import { useId } from "react";
import { Button } from "@/components/ui/button";
import { describedBy, FieldError, inputClasses } from "@/components/ui/field";
import type { ExrPreflight } from "@/components/stills/exr-sniff";
import { UploadColourFields, type ColourChoice } from "@/components/stills/upload-colour-fields";
import { ALT_MAX } from "@/lib/stills/schemas";
import { cn } from "@/lib/utils";

export type UploadItem = {
  key: string;
  file: File;
  alt: string;
  caption: string;
  status: "waiting" | "uploading" | "done" | "failed" | "cancelled";
  progress: number;
  message?: string;
  /** Set when someone tried to upload without alt text. */
  altPrompted?: boolean;
  colourSpace: ColourChoice;
  /** OpenEXR: the layer to show (the file's default when unset). */
  layer?: string;
  /** OpenEXR header read in the browser; null: not OpenEXR; undefined: not read yet. */
  exr?: ExrPreflight | null;
};

type Props = {
  item: UploadItem;
  onChange: (patch: Partial<Pick<UploadItem, "alt" | "caption" | "colourSpace" | "layer">>) => void;
  onUpload: () => void;
  onCancel: () => void;
  onRemove: () => void;
};

function megabytes(bytes: number): string {
  return `${(bytes / (1024 * 1024)).toFixed(bytes < 1024 * 1024 ? 2 : 1)} MB`;
}

/** One dropped file: alt text (required), caption, progress, cancel, and the outcome in words. */
export function UploadRow({ item, onChange, onUpload, onCancel, onRemove }: Props) {
  const id = useId();
  const editable = item.status === "waiting" || item.status === "failed" || item.status === "cancelled";
  const altMissing = item.alt.trim().length === 0;
  const altError = editable && altMissing && item.altPrompted ? "Describe the still before uploading it." : undefined;
  const outcome = item.status === "failed" || item.status === "cancelled" ? item.message : item.status === "done" ? "Uploaded." : undefined;

  return (
    <li className="space-y-2 rounded border border-line bg-surface p-3" aria-label={`Upload of ${item.file.name}`}>
      <div className="flex items-baseline justify-between gap-3">
        <span className="truncate font-mono text-sm" title={item.file.name}>
          {item.file.name}
        </span>
        <span className="shrink-0 text-xs text-muted">{megabytes(item.file.size)}</span>
      </div>

      <div className="grid gap-2 sm:grid-cols-2">
        <div className="space-y-1">
          <label htmlFor={`${id}-alt`} className="block text-xs font-medium">
            Alt text <span className="text-muted">(required)</span>
          </label>
          <input
            id={`${id}-alt`}
            className={inputClasses}
            value={item.alt}
            maxLength={ALT_MAX}
            required
            disabled={!editable}
            aria-invalid={altError ? true : undefined}
            aria-describedby={describedBy(`${id}-alt`, altError)}
            placeholder="e.g. Blue screen with four tracking markers, before cleanup"
            onChange={(e) => onChange({ alt: e.target.value })}
          />
          <FieldError id={`${id}-alt`} error={altError} />
        </div>
        <div className="space-y-1">
          <label htmlFor={`${id}-caption`} className="block text-xs font-medium">
            Caption <span className="text-muted">(optional)</span>
          </label>
          <input id={`${id}-caption`} className={inputClasses} value={item.caption} maxLength={500} disabled={!editable} onChange={(e) => onChange({ caption: e.target.value })} />
        </div>
      </div>

      <UploadColourFields colourSpace={item.colourSpace} layer={item.layer} exr={item.exr} disabled={!editable} onChange={onChange} />

      <div className="flex items-center gap-3">
        <progress
          className="h-2 flex-1 accent-[var(--color-accent)]"
          max={1}
          value={item.status === "done" ? 1 : item.progress}
          aria-label={`Upload progress of ${item.file.name}`}
        />
        <span className="w-10 text-right text-xs tabular-nums text-muted">{Math.round((item.status === "done" ? 1 : item.progress) * 100)} %</span>
        {item.status === "uploading" ? (
          <Button variant="danger" onClick={onCancel}>
            Cancel
          </Button>
        ) : editable ? (
          <>
            <Button variant="primary" onClick={onUpload} aria-disabled={altMissing || undefined}>
              {item.status === "waiting" ? "Upload" : "Try again"}
            </Button>
            <Button variant="ghost" onClick={onRemove}>
              Remove
            </Button>
          </>
        ) : null}
      </div>

      {outcome ? (
        <p role="status" className={cn("text-sm", item.status === "done" ? "text-ok" : "text-bad")}>
          {outcome}
        </p>
      ) : null}
    </li>
  );
}
