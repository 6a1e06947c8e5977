import type { ReactNode, TableHTMLAttributes } from "react";

/**
 * The app's plain list table: full width, scrolls sideways when the window is narrow, a muted
 * header row with a rule under it. `head` holds the header cells, children the body rows.
 */
export function DataTable({ head, caption, children, ...props }: { head: ReactNode; caption?: string; children: ReactNode } & Omit<TableHTMLAttributes<HTMLTableElement>, "className">) {
  return (
    <div className="overflow-x-auto">
      <table className="w-full border-collapse text-sm" {...props}>
        {caption ? <caption className="sr-only">{caption}</caption> : null}
        <thead>
          <tr className="border-b border-line text-left text-muted">{head}</tr>
        </thead>
        <tbody>{children}</tbody>
      </table>
    </div>
  );
}
