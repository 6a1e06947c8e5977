import { useEffect, useId, useRef, useState, type FormEvent } from "react";

import { DOCUMENT_LIMITS } from "@/lib/techniques/document";

export type StillDialogValue = { alt: string; caption: string };

type StillDialogProps = {
  open: boolean;
  /** "insert" asks for a file; "edit" changes the text of the selected still. */
  mode: "insert" | "edit";
  initial: StillDialogValue;
  onInsert(file: File, text: StillDialogValue): Promise<void>;
  onSave(text: StillDialogValue): void;
  onClose(): void;
};

const fieldClass = "rounded border border-line bg-surface-2 px-2 py-1.5 focus-visible:outline-2 focus-visible:outline-accent";

/** Upload a still into the body, or edit its description and caption. */
export function StillDialog({ open, mode, initial, onInsert, onSave, onClose }: StillDialogProps) {
  const ref = useRef<HTMLDialogElement>(null);
  const [file, setFile] = useState<File | null>(null);
  const [alt, setAlt] = useState("");
  const [caption, setCaption] = useState("");
  const [error, setError] = useState<string | null>(null);
  const [isBusy, setIsBusy] = useState(false);
  const ids = { title: useId(), file: useId(), alt: useId(), caption: useId(), error: useId(), note: useId() };

  useEffect(() => {
    const dialog = ref.current;
    if (!dialog) return;
    if (open && !dialog.open) {
      setFile(null);
      setAlt(initial.alt);
      setCaption(initial.caption);
      setError(null);
      dialog.showModal();
    } else if (!open && dialog.open) {
      dialog.close();
    }
  }, [open, initial]);

  async function submit(event: FormEvent) {
    event.preventDefault();
    const text = { alt: alt.trim(), caption: caption.trim() };
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
    <dialog ref={ref} aria-labelledby={ids.title} onClose={onClose} className="m-auto w-full max-w-md rounded border border-line bg-surface p-4 text-ink backdrop:bg-black/60">
      <form onSubmit={submit} className="flex flex-col gap-3" aria-busy={isBusy}>
        <h2 id={ids.title} className="text-base font-semibold">
          {mode === "insert" ? "Add a still" : "Still description"}
        </h2>
        {mode === "insert" && (
          <>
            <p id={ids.note} className="text-sm text-muted">
              Stills stay inside Plateroom: stored privately and shown only to signed-in people. Follow the
              studio&apos;s content-security policy for unreleased work.
            </p>
            <label htmlFor={ids.file} className="text-sm text-muted">Image file</label>
            <input id={ids.file} type="file" accept="image/*" aria-describedby={ids.note} onChange={(e) => setFile(e.target.files?.[0] ?? null)} className={fieldClass} />
          </>
        )}
        <label htmlFor={ids.alt} className="text-sm text-muted">Description for screen readers</label>
        <input id={ids.alt} value={alt} maxLength={DOCUMENT_LIMITS.maxAltLength} onChange={(e) => setAlt(e.target.value)} className={fieldClass} />
        <label htmlFor={ids.caption} className="text-sm text-muted">Caption (optional)</label>
        <input id={ids.caption} value={caption} maxLength={DOCUMENT_LIMITS.maxCaptionLength} onChange={(e) => setCaption(e.target.value)} className={fieldClass} />
        {error && <p id={ids.error} role="alert" className="text-sm text-bad">{error}</p>}
        <div className="flex justify-end gap-2">
          <button type="button" onClick={onClose} className="rounded border border-line px-3 py-1.5 text-sm hover:bg-surface-2">Cancel</button>
          <button type="submit" disabled={isBusy} className="rounded bg-accent px-3 py-1.5 text-sm font-medium text-accent-ink hover:brightness-110 disabled:opacity-50">
            {mode === "insert" ? (isBusy ? "Uploading…" : "Upload and insert") : "Save"}
          </button>
        </div>
      </form>
    </dialog>
  );
}
