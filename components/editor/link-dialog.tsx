import { useEffect, useId, useRef, useState, type FormEvent } from "react";

import { safeHref } from "@/lib/techniques/document";

type LinkDialogProps = {
  open: boolean;
  /** The link under the cursor, if any. */
  currentHref: string | null;
  onApply(href: string): void;
  onRemove(): void;
  onClose(): void;
};

/** Asks for a link address and checks it with the same rule the server applies. */
export function LinkDialog({ open, currentHref, onApply, onRemove, onClose }: LinkDialogProps) {
  const ref = useRef<HTMLDialogElement>(null);
  const [href, setHref] = useState("");
  const [error, setError] = useState<string | null>(null);
  const inputId = useId();
  const errorId = useId();
  const titleId = useId();

  useEffect(() => {
    const dialog = ref.current;
    if (!dialog) return;
    if (open && !dialog.open) {
      setHref(currentHref ?? "");
      setError(null);
      dialog.showModal();
    } else if (!open && dialog.open) {
      dialog.close();
    }
  }, [open, currentHref]);

  function submit(event: FormEvent) {
    event.preventDefault();
    const safe = safeHref(href);
    if (safe === null) {
      setError("Use an address starting with https://, http:// or mailto:, or a path inside Plateroom such as /techniques/….");
      return;
    }
    onApply(safe);
  }

  return (
    <dialog
      ref={ref}
      aria-labelledby={titleId}
      onClose={onClose}
      className="m-auto w-full max-w-md rounded border border-line bg-surface p-4 text-ink backdrop:bg-black/60"
    >
      <form onSubmit={submit} className="flex flex-col gap-3">
        <h2 id={titleId} className="text-base font-semibold">
          {currentHref ? "Edit link" : "Add link"}
        </h2>
        <label htmlFor={inputId} className="text-sm text-muted">
          Address
        </label>
        <input
          id={inputId}
          value={href}
          onChange={(event) => setHref(event.target.value)}
          inputMode="url"
          autoComplete="off"
          spellCheck={false}
          placeholder="https://… or /techniques/…"
          aria-invalid={error !== null}
          aria-describedby={error ? errorId : undefined}
          className="rounded border border-line bg-surface-2 px-2 py-1.5 focus-visible:outline-2 focus-visible:outline-accent"
        />
        {error && (
          <p id={errorId} className="text-sm text-bad">
            {error}
          </p>
        )}
        <div className="flex justify-end gap-2">
          {currentHref && (
            <button type="button" onClick={onRemove} className="mr-auto rounded px-3 py-1.5 text-sm text-bad hover:bg-surface-2">
              Remove link
            </button>
          )}
          <button type="button" onClick={onClose} className="rounded border border-line px-3 py-1.5 text-sm hover:bg-surface-2">
            Cancel
          </button>
          <button type="submit" className="rounded bg-accent px-3 py-1.5 text-sm font-medium text-accent-ink hover:brightness-110">
            Apply
          </button>
        </div>
      </form>
    </dialog>
  );
}
