import type { ReactNode } from "react";

import { describeShortcut } from "@/components/editor/shortcuts";
import { cn } from "@/lib/utils";

type ToolbarButtonProps = {
  /** Accessible name, also the tooltip. */
  label: string;
  children: ReactNode;
  onClick(): void;
  shortcut?: string;
  isApple: boolean;
  /** Toggle buttons report their state through aria-pressed; plain actions leave it undefined. */
  isActive?: boolean;
  isDisabled?: boolean;
};

/** One toolbar button. Its tabindex is managed by the toolbar (roving tabindex). */
export function ToolbarButton({ label, children, onClick, shortcut, isApple, isActive, isDisabled }: ToolbarButtonProps) {
  const keys = shortcut ? describeShortcut(shortcut, isApple) : null;
  return (
    <button
      type="button"
      aria-label={label}
      title={keys ? `${label} (${keys.label})` : label}
      aria-keyshortcuts={keys?.aria}
      aria-pressed={isActive}
      disabled={isDisabled}
      // Keep the editor's selection: a mousedown on the button would otherwise blur it.
      onMouseDown={(event) => event.preventDefault()}
      onClick={onClick}
      className={cn(
        "inline-flex h-8 min-w-8 items-center justify-center rounded px-2 text-sm text-ink transition",
        "hover:bg-surface-3 focus-visible:outline-2 focus-visible:outline-offset-1 focus-visible:outline-accent",
        "disabled:cursor-not-allowed disabled:opacity-40",
        isActive && "bg-accent text-accent-ink hover:bg-accent hover:brightness-110",
      )}
    >
      {children}
    </button>
  );
}
