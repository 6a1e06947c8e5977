import { renderDocumentToHtml } from "@/lib/techniques/render";

/** The write-up, rendered on the server through the allow-list in lib/techniques/render.ts (or given already rendered by it). */
export function RenderedBody({ doc, html: rendered }: { doc: unknown; html?: string }) {
  const html = rendered ?? renderDocumentToHtml(doc);
  // A new technique's body is one empty paragraph; show the note rather than an empty card.
  if (!html.replace(/<p><\/p>/g, "").trim()) return <p className="text-sm text-muted">No write-up yet.</p>;
  // Safe by construction: the renderer escapes all text and emits only allow-listed elements and attributes.
  return <div className="prose-plate" dangerouslySetInnerHTML={{ __html: html }} />;
}
