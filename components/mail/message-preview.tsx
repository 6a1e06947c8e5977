"use client";

import { useId, useState, type ReactNode } from "react";
import { cn } from "@/lib/utils";

// Mail HTML is shown in a sandbox with no scripts and no same-origin; this policy also stops
// remote images and fonts, so opening a message fetches nothing (as careful mail readers do).
const PREVIEW_CSP = "default-src 'none'; style-src 'unsafe-inline'; img-src data:; font-src data:";

/** The HTML part with a Content-Security-Policy meta element placed first in its head. */
function previewDocument(html: string): string {
  const meta = `<meta http-equiv="Content-Security-Policy" content="${PREVIEW_CSP}">`;
  const head = /<head(\s[^>]*)?>/i.exec(html);
  if (head) return html.slice(0, head.index + head[0].length) + meta + html.slice(head.index + head[0].length);
  const doctype = /^\s*<!doctype[^>]*>/i.exec(html);
  if (doctype) return doctype[0] + `<head>${meta}</head>` + html.slice(doctype[0].length);
  return `<!doctype html><head>${meta}</head>${html}`;
}

/** Plain text with its http(s) addresses made into links (React escapes the rest). */
function linkify(text: string): ReactNode[] {
  const parts: ReactNode[] = [];
  const re = /https?:\/\/[^\s<>"]+/g;
  let last = 0;
  for (const match of text.matchAll(re)) {
    const url = match[0].replace(/[.,;:)]+$/, "");
    const at = match.index;
    parts.push(text.slice(last, at));
    parts.push(
      <a key={at} href={url} className="text-accent underline" target="_blank" rel="noreferrer noopener">
        {url}
      </a>,
    );
    last = at + url.length;
  }
  parts.push(text.slice(last));
  return parts;
}

/** A message body as the recipient would see it: the HTML part (sandboxed) or the plain-text part. */
export function MessagePreview({ html, text, subject }: { html: string | null; text: string; subject: string }) {
  const [view, setView] = useState<"html" | "text">(html ? "html" : "text");
  const id = useId();
  const shown = html ? view : "text";
  return (
    <div className="space-y-2">
      <div role="group" aria-label="Message part" className="inline-flex rounded border border-line p-0.5">
        {(
          [
            ["html", "HTML"],
            ["text", "Plain text"],
          ] as const
        ).map(([v, label]) => (
          <button
            key={v}
            type="button"
            aria-pressed={shown === v}
            aria-controls={id}
            disabled={v === "html" && !html}
            onClick={() => setView(v)}
            className={cn(
              "rounded px-2.5 py-1 text-xs font-medium disabled:cursor-not-allowed disabled:opacity-50",
              shown === v ? "bg-accent text-accent-ink" : "text-muted hover:text-ink",
            )}
          >
            {label}
          </button>
        ))}
      </div>
      <div id={id}>
        {shown === "html" && html ? (
          <iframe
            // Empty sandbox: no scripts, no forms, no same-origin access to Plateroom, no top navigation.
            sandbox=""
            srcDoc={previewDocument(html)}
            title={`HTML part of “${subject}”`}
            className="h-[34rem] w-full rounded border border-line bg-white"
            data-testid="mail-html"
          />
        ) : (
          <pre className="max-h-[34rem] overflow-auto rounded border border-line bg-surface-2 p-3 font-mono text-xs whitespace-pre-wrap" data-testid="mail-text">
            {linkify(text)}
          </pre>
        )}
      </div>
    </div>
  );
}
