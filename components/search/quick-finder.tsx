"use client";

import { useEffect, useState, useSyncExternalStore } from "react";
import { FinderDialog } from "@/components/search/finder-dialog";
import { isFinderShortcut } from "@/lib/search-ui/shortcut";

/** The header's "Find…" button and the Ctrl+K / ⌘K / "/" shortcut, on every signed-in page. */
export function QuickFinder({ userId }: { userId: string }) {
  const [isOpen, setIsOpen] = useState(false);
  // Rendered as Ctrl K on the server; ⌘K after hydration on Apple keyboards.
  const keys = useSyncExternalStore(noSubscription, platformKeys, () => "Ctrl K");
  useEffect(() => {
    function onKey(e: KeyboardEvent) {
      if (!isFinderShortcut(e)) return;
      // Another modal (a confirmation, the link dialog) keeps the keyboard to itself.
      if (document.querySelector("dialog[open]:not([data-finder])")) return;
      e.preventDefault();
      setIsOpen(true);
    }
    window.addEventListener("keydown", onKey);
    return () => window.removeEventListener("keydown", onKey);
  }, []);
  return (
    <>
      <button
        type="button"
        onClick={() => setIsOpen(true)}
        aria-haspopup="dialog"
        aria-keyshortcuts="Control+K Meta+K /"
        className="flex items-center gap-3 rounded border border-line bg-surface-2 px-2.5 py-1 text-sm text-muted hover:border-accent hover:text-ink"
        data-testid="quick-finder-button"
      >
        <span>Find…</span>
        <kbd className="rounded border border-line px-1 font-mono text-xs">{keys}</kbd>
      </button>
      <FinderDialog open={isOpen} onClose={() => setIsOpen(false)} userId={userId} />
    </>
  );
}

const noSubscription = () => () => {};
const platformKeys = () => (/Mac|iPhone|iPad/i.test(navigator.platform || navigator.userAgent) ? "⌘K" : "Ctrl K");
