import type { ReactNode } from "react";

export function EmptyState({ title, children }: { title: string; children?: ReactNode }) {
  return (
    <div className="rounded border border-dashed border-line px-4 py-6 text-center text-sm text-muted">
      <p className="font-medium text-ink">{title}</p>
      {children ? <div className="mt-1">{children}</div> : null}
    </div>
  );
}
