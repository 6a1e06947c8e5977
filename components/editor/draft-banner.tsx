import { formatDateTime } from "@/lib/utils";

type DraftBannerProps = {
  savedAt: Date | null;
  onRestore(): void;
  onDiscard(): void;
  /** What the draft covers, e.g. "this technique" or "this answer". */
  subject?: string;
};

/** Offers a locally stored draft; the choice is always the person's. */
export function DraftBanner({ savedAt, onRestore, onDiscard, subject = "this page" }: DraftBannerProps) {
  return (
    <div role="status" className="flex flex-wrap items-center gap-3 rounded border border-accent/60 bg-surface-2 px-3 py-2 text-sm">
      <p className="grow">
        This browser kept unsaved changes to {subject}
        {savedAt ? ` from ${formatDateTime(savedAt)}` : ""}. They differ from the saved version.
      </p>
      <button
        type="button"
        onClick={onRestore}
        className="rounded bg-accent px-3 py-1 font-medium text-accent-ink hover:brightness-110 focus-visible:outline-2 focus-visible:outline-offset-2 focus-visible:outline-accent"
      >
        Restore my changes
      </button>
      <button
        type="button"
        onClick={onDiscard}
        className="rounded border border-line px-3 py-1 hover:bg-surface-3 focus-visible:outline-2 focus-visible:outline-offset-2 focus-visible:outline-accent"
      >
        Discard them
      </button>
    </div>
  );
}
