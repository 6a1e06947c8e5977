import { useEffect, useId, useMemo, useState, type FormEvent } from "react";

import { Modal } from "@/components/ui/modal";
import { DOCUMENT_LIMITS } from "@/lib/techniques/document";

export type StillDialogValue = { alt: string; caption: string };

type StillDialogProps = {
  open: boolean;
  /** "insert" asks for a file; "edit" changes the text of the selected still. */
  mode: "insert" | "edit";
  initial: StillDialogValue;
  /** An image dropped or pasted into the body: the dialog asks for its description only. */
  file?: File | null;
  /** "Still 2 of 3" when several images were dropped at once. */
  position?: string;
  /** What adding a still does here, e.g. that it saves a new technique as a draft first. */
  note?: string;
  onInsert(file: File, text: StillDialogValue): Promise<void>;
  onSave(text: StillDialogValue): void;
  onClose(): void;
};

/** Upload a still into the body, or edit its description and caption. */
export function StillDialog({ open, ...props }: StillDialogProps) {
  const titleId = useId();
  return (
    <Modal open={open} onClose={props.onClose} labelledBy={titleId}>
      {/* Mounted while open only, so every opening starts from the selected still's text. */}
      {open ? <StillForm titleId={titleId} {...props} /> : null}
    </Modal>
  );
}

const fieldClass = "rounded border border-line bg-surface-2 px-2 py-1.5 focus-visible:outline-2 focus-visible:outline-accent";

function StillForm({ titleId, mode, initial, file: given, position, note, onInsert, onSave, onClose }: Omit<StillDialogProps, "open"> & { titleId: string }) {
  const [file, setFile] = useState<File | null>(given ?? null);
  const [alt, setAlt] = useState(initial.alt);
  const [caption, setCaption] = useState(initial.caption);
  const [error, setError] = useState<string | null>(null);
  const [isBusy, setIsBusy] = useState(false);
  const ids = { file: useId(), alt: useId(), altHint: useId(), caption: useId(), error: useId(), note: useId() };
  const preview = useObjectUrl(given ?? null);

  async function submit(event: FormEvent) {
    event.preventDefault();
    const text = { alt: alt.trim(), caption: caption.trim() };
    if (!text.alt) return setError("Describe the still in a few words for people who cannot see it.");
    if (mode === "edit") return onSave(text);
    if (!file) return setError("Choose an image file.");
    setIsBusy(true);
    setError(null);
    try {
      await onInsert(file, text);
    } catch (cause) {
      setError(cause instanceof Error ? cause.message : "The upload failed.");
    } finally {
      setIsBusy(false);
    }
  }

  return (
    <form onSubmit={submit} className="flex flex-col gap-3" aria-busy={isBusy} noValidate>
      <h2 id={titleId} className="text-base font-semibold">
        {mode === "insert" ? "Add a still" : "Still description"}
        {position ? <span className="ml-2 text-sm font-normal text-muted">{position}</span> : null}
      </h2>
      {mode === "insert" && (
        <>
          <p id={ids.note} className="text-sm text-muted">
            {note ? `${note} ` : ""}Stills stay inside Plateroom: stored privately and shown only to signed-in people. Follow the studio&apos;s
            content-security policy for unreleased work.
          </p>
          {given ? (
            <div className="flex items-center gap-3 text-sm">
              {preview ? (
                // A local preview of the dropped file (a blob: URL, never sent anywhere).
                // eslint-disable-next-line @next/next/no-img-element
                <img src={preview} alt="" className="h-16 w-24 rounded bg-stage object-contain" />
              ) : null}
              <span className="break-all text-muted">{given.name}</span>
            </div>
          ) : (
            <>
              <label htmlFor={ids.file} className="text-sm text-muted">
                Image file
              </label>
              <input id={ids.file} type="file" accept="image/*" aria-describedby={ids.note} onChange={(e) => setFile(e.target.files?.[0] ?? null)} className={fieldClass} />
            </>
          )}
        </>
      )}
      <label htmlFor={ids.alt} className="text-sm text-muted">
        Description for screen readers
      </label>
      <input
        id={ids.alt}
        value={alt}
        aria-required="true"
        autoFocus={Boolean(given) || mode === "edit"}
        maxLength={DOCUMENT_LIMITS.maxAltLength}
        onChange={(e) => setAlt(e.target.value)}
        aria-describedby={ids.altHint}
        className={fieldClass}
      />
      <p id={ids.altHint} className="-mt-2 text-xs text-muted">
        What the still shows, e.g. &ldquo;Green screen with tape crosses, before cleanup&rdquo;.
      </p>
      <label htmlFor={ids.caption} className="text-sm text-muted">
        Caption (optional)
      </label>
      <input id={ids.caption} value={caption} maxLength={DOCUMENT_LIMITS.maxCaptionLength} onChange={(e) => setCaption(e.target.value)} className={fieldClass} />
      {error && (
        <p id={ids.error} role="alert" className="text-sm text-bad">
          {error}
        </p>
      )}
      <div className="flex justify-end gap-2">
        <button type="button" onClick={onClose} className="rounded border border-line px-3 py-1.5 text-sm hover:bg-surface-2">
          Cancel
        </button>
        <button type="submit" disabled={isBusy} className="rounded bg-accent px-3 py-1.5 text-sm font-medium text-accent-ink hover:brightness-110 disabled:opacity-50">
          {mode === "insert" ? (isBusy ? "Uploading…" : "Upload and insert") : "Save"}
        </button>
      </div>
    </form>
  );
}

/** An object URL for a local file, revoked when the file changes or the dialog closes. */
function useObjectUrl(file: File | null): string | null {
  const url = useMemo(() => (file ? URL.createObjectURL(file) : null), [file]);
  useEffect(() => () => (url ? URL.revokeObjectURL(url) : undefined), [url]);
  return url;
}
