"use client";

import { useCallback, useRef, useState } from "react";
import { useDropzone } from "react-dropzone";
import { Button } from "@/components/ui/button";
import { ConfidentialNotice } from "@/components/stills/confidential-notice";
import { sendStill } from "@/components/stills/upload-request";
import { UploadRow, type UploadItem } from "@/components/stills/upload-row";
import type { StillCreatedResponse, StillOwner, StillRole } from "@/lib/stills/schemas";
import { cn } from "@/lib/utils";

// crypto.randomUUID needs a secure context; studio intranets often serve plain http.
let nextKey = 0;

type UploadedStill = StillCreatedResponse & { alt: string; caption: string; role: StillRole; originalName: string };

type StillUploaderProps = {
  /** Technique slug the stills belong to (or are tried against, for trials). */
  technique?: string;
  owner: StillOwner;
  role?: StillRole;
  /** Largest file the server takes (PLATEROOM_MAX_UPLOAD_BYTES); only used to warn early. */
  maxBytes?: number;
  onUploaded?: (still: UploadedStill) => void;
  className?: string;
};

/**
 * Drop or pick several stills; each gets its own row with alt text, progress, cancel and the
 * server's verdict. Nothing is sent before the row has alt text. The server checks every
 * file by content, so no type filter here decides anything.
 */
export function StillUploader({ technique, owner, role = "reference", maxBytes = 80 * 1024 * 1024, onUploaded, className }: StillUploaderProps) {
  const [items, setItems] = useState<UploadItem[]>([]);
  const aborts = useRef(new Map<string, () => void>());

  const patch = useCallback((key: string, change: Partial<UploadItem>) => {
    setItems((list) => list.map((i) => (i.key === key ? { ...i, ...change } : i)));
  }, []);

  const onDrop = useCallback(
    (files: File[]) => {
      setItems((list) => [
        ...list,
        ...files.map<UploadItem>((file) => {
          const tooBig = file.size > maxBytes;
          return {
            key: `${file.name}-${file.size}-${(nextKey += 1)}`,
            file,
            alt: "",
            caption: "",
            status: tooBig ? "failed" : "waiting",
            progress: 0,
            message: tooBig ? `This file is larger than ${Math.round(maxBytes / (1024 * 1024))} MB, the most Plateroom accepts.` : undefined,
          };
        }),
      ]);
    },
    [maxBytes],
  );
  const { getRootProps, getInputProps, isDragActive, open } = useDropzone({ onDrop, multiple: true, noClick: true, noKeyboard: true });

  async function upload(item: UploadItem) {
    if (!item.alt.trim()) return patch(item.key, { altPrompted: true });
    if (item.file.size > maxBytes) return;
    patch(item.key, { status: "uploading", progress: 0, message: undefined });
    const { done, abort } = sendStill(item.file, { alt: item.alt.trim(), caption: item.caption.trim() || undefined, technique, role, owner }, (progress) =>
      patch(item.key, { progress }),
    );
    aborts.current.set(item.key, abort);
    const outcome = await done;
    aborts.current.delete(item.key);
    if (outcome.ok) {
      patch(item.key, { status: "done", progress: 1 });
      onUploaded?.({ ...outcome.still, alt: item.alt.trim(), caption: item.caption.trim(), role, originalName: item.file.name });
    } else {
      patch(item.key, { status: outcome.cancelled ? "cancelled" : "failed", progress: 0, message: outcome.message });
    }
  }

  const ready = items.filter((i) => (i.status === "waiting" || i.status === "cancelled") && i.alt.trim());

  return (
    <section className={cn("space-y-3", className)} aria-label="Upload stills">
      <ConfidentialNotice />
      <div
        {...getRootProps({
          className: cn(
            "flex flex-col items-center gap-2 rounded border-2 border-dashed border-line bg-surface-2 px-4 py-6 text-center text-sm",
            isDragActive && "border-accent text-accent",
          ),
        })}
      >
        <input {...getInputProps({ "aria-label": "Choose still files" })} />
        <p>{isDragActive ? "Drop the stills to add them." : "Drop PNG, JPEG, TIFF or WebP stills here (8 or 16 bits per channel, up to 8192 × 8192 pixels), or"}</p>
        <Button variant="secondary" onClick={open}>
          Choose files…
        </Button>
      </div>

      {items.length ? (
        <>
          <ul className="space-y-2">
            {items.map((item) => (
              <UploadRow
                key={item.key}
                item={item}
                onChange={(change) => patch(item.key, change)}
                onUpload={() => void upload(item)}
                onCancel={() => aborts.current.get(item.key)?.()}
                onRemove={() => setItems((list) => list.filter((i) => i.key !== item.key))}
              />
            ))}
          </ul>
          {ready.length > 1 ? (
            <Button variant="primary" onClick={() => ready.forEach((i) => void upload(i))}>
              Upload {ready.length} stills
            </Button>
          ) : null}
        </>
      ) : null}
    </section>
  );
}
