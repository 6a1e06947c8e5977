"use client";

// A client component only to keep page payloads small: the server sends a reference to it instead
// of its element tree, and the mark is in every page's header and on the pages outside the shell
// (issue 19). It has no state; its markup is still rendered on the server.

/** Plateroom's mark: a plate frame, half wiped clean, with one tracking marker left to remove. */
function LogoMark({ size = 28 }: { size?: number }) {
  return (
    <svg width={size} height={size} viewBox="0 0 32 32" aria-hidden focusable="false">
      <rect x="3" y="6" width="26" height="20" rx="2" fill="var(--color-surface-2)" stroke="currentColor" strokeWidth="1.5" />
      <path d="M18 6 L14 26 L29 26 L29 8 Q29 6 27 6 Z" fill="var(--color-accent)" />
      <circle cx="9.5" cy="12.5" r="2" fill="none" stroke="currentColor" strokeWidth="1.5" />
      <path d="M9.5 9.5v6M6.5 12.5h6" stroke="currentColor" strokeWidth="1" />
    </svg>
  );
}

export function Wordmark() {
  return (
    <span className="inline-flex items-center gap-2 font-semibold tracking-tight">
      <LogoMark />
      <span>Plateroom</span>
    </span>
  );
}
