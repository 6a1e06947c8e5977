"use client";

// A client component only to keep the page's payload small: the server sends the outline as data
// rather than the list's element tree (issue 19). Its markup is still rendered on the server.
import { CONTENTS_MIN_HEADINGS } from "@/lib/techniques/outline";
import type { OutlineHeading } from "@/lib/techniques/render";
import { cn } from "@/lib/utils";

/** In-page contents of a long write-up: its headings as links to their sections. */
export function PageContents({ outline }: { outline: OutlineHeading[] }) {
  if (outline.length < CONTENTS_MIN_HEADINGS) return null;
  const top = Math.min(...outline.map((h) => h.level));
  return (
    <nav aria-labelledby="page-contents-title" className="text-sm">
      <h2 id="page-contents-title" className="mb-2 text-base font-semibold">
        On this page
      </h2>
      <ol className="space-y-1">
        {outline.map((h) => (
          <li key={h.id} className={cn(h.level > top && "pl-3", h.level > top + 1 && "pl-6")}>
            <a href={`#${h.id}`} className="text-muted hover:text-ink hover:underline">
              {h.text}
            </a>
          </li>
        ))}
      </ol>
    </nav>
  );
}
