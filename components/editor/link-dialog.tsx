import { useId, useState, type FormEvent } from "react";

import { Modal } from "@/components/ui/modal";
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
  const titleId = useId();
  return (
    <Modal open={open} onClose={onClose} labelledBy={titleId}>
      {/* Mounted while open only, so every opening starts from the link under the cursor. */}
      {open ? <LinkForm titleId={titleId} currentHref={currentHref} onApply={onApply} onRemove={onRemove} onClose={onClose} /> : null}
    </Modal>
  );
}

function LinkForm({ titleId, currentHref, onApply, onRemove, onClose }: Omit<LinkDialogProps, "open"> & { titleId: string }) {
  const [href, setHref] = useState(currentHref ?? "");
  const [error, setError] = useState<string | null>(null);
  const inputId = useId();
  const errorId = useId();

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
        autoFocus
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
  );
}
