"use client";

import { useState, type ReactNode } from "react";

/**
 * A <details> whose body is first rendered when someone opens it. Forms tucked away in a closed
 * section (log a use, add stills) are not rendered on the server for every page view that never
 * opens them; once opened, the body stays mounted so what was typed survives closing it.
 */
export function LazyDetails({ summary, className, children }: { summary: ReactNode; className?: string; children: ReactNode }) {
  const [opened, setOpened] = useState(false);
  return (
    <details className={className} onToggle={(e) => e.currentTarget.open && setOpened(true)}>
      <summary className="cursor-pointer text-sm font-medium">{summary}</summary>
      {opened ? children : null}
    </details>
  );
}
