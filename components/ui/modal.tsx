"use client";

import { useEffect, useRef, useSyncExternalStore, type ReactNode } from "react";
import { createPortal } from "react-dom";
import { cn } from "@/lib/utils";

const noSubscription = () => () => {};

/**
 * A modal <dialog> (focus trapped, Escape closes) rendered into <body> through a portal, so a form
 * inside it is never nested in a form of the page that opened it: its submit cannot reach the
 * page's form in the DOM, and it is stopped here before React passes it up the component tree
 * (React bubbles events through portals to the parent that rendered them).
 */
export function Modal({
  open,
  onClose,
  labelledBy,
  label,
  className,
  children,
}: {
  open: boolean;
  onClose(): void;
  /** id of the visible title; or `label` when there is none */
  labelledBy?: string;
  label?: string;
  className?: string;
  children: ReactNode;
}) {
  const ref = useRef<HTMLDialogElement>(null);
  const isClient = useSyncExternalStore(noSubscription, () => true, () => false);

  useEffect(() => {
    const dialog = ref.current;
    if (!dialog) return;
    if (open && !dialog.open) dialog.showModal();
    if (!open && dialog.open) dialog.close();
  }, [open, isClient]);

  if (!isClient) return null;
  return createPortal(
    <dialog
      ref={ref}
      aria-labelledby={labelledBy}
      aria-label={labelledBy ? undefined : label}
      onClose={onClose}
      onSubmit={(event) => event.stopPropagation()}
      className={cn("m-auto w-full max-w-md rounded-lg border border-line bg-surface p-4 text-ink backdrop:bg-black/60", className)}
    >
      {children}
    </dialog>,
    document.body,
  );
}
