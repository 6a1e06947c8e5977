import {
  CALLOUT_KINDS,
  CALLOUT_LABELS,
  CELL_ALIGNS,
  DOCUMENT_LIMITS,
  HEADING_LEVELS,
  ORDERED_LIST_TYPES,
  safeHref,
  type CalloutKind,
} from "@/lib/techniques/document";

/*
 * Server-side HTML for a technique body. The input is normally validated already, but this
 * module trusts nothing: it walks an allow-list of node and mark types, writes only the
 * attributes it builds itself, and encodes every piece of text (OWASP XSS Prevention Cheat
 * Sheet, Rule #1 for element content and Rule #2 for quoted attribute values). Anything it
 * does not know is dropped. Its output is the only input to dangerouslySetInnerHTML.
 */

const ESCAPES: Record<string, string> = { "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" };

export function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (c) => ESCAPES[c] ?? c);
}

type Json = Record<string, unknown>;

function isRecord(v: unknown): v is Json {
  return typeof v === "object" && v !== null && !Array.isArray(v);
}

function attrsOf(node: Json): Json {
  return isRecord(node.attrs) ? node.attrs : {};
}

function childrenOf(node: Json): unknown[] {
  return Array.isArray(node.content) ? node.content : [];
}

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
const LANGUAGE = /^[A-Za-z0-9][A-Za-z0-9+#._-]{0,31}$/;

function smallInt(v: unknown, min: number, max: number): number | null {
  return typeof v === "number" && Number.isInteger(v) && v >= min && v <= max ? v : null;
}

function oneOf<T extends string | number>(list: readonly T[], v: unknown): T | null {
  return (list as readonly unknown[]).includes(v) ? (v as T) : null;
}

// Marks nest in a fixed order so runs of text that share a link stay in one <a>.
const MARK_ORDER = ["link", "bold", "italic", "code"] as const;
type OpenMark = { type: (typeof MARK_ORDER)[number]; href?: string };

function marksOf(node: Json): OpenMark[] {
  if (!Array.isArray(node.marks)) return [];
  const found = new Map<string, OpenMark>();
  for (const mark of node.marks) {
    if (!isRecord(mark)) continue;
    if (mark.type === "link") {
      const href = safeHref(attrsOf(mark).href);
      if (href !== null) found.set("link", { type: "link", href });
    } else if (mark.type === "bold" || mark.type === "italic" || mark.type === "code") {
      found.set(mark.type, { type: mark.type });
    }
  }
  return MARK_ORDER.flatMap((t) => found.get(t) ?? []);
}

function openTag(mark: OpenMark): string {
  switch (mark.type) {
    case "link":
      return `<a href="${escapeHtml(mark.href ?? "")}" rel="noopener noreferrer nofollow">`;
    case "bold":
      return "<strong>";
    case "italic":
      return "<em>";
    case "code":
      return "<code>";
  }
}

const CLOSE: Record<OpenMark["type"], string> = { link: "</a>", bold: "</strong>", italic: "</em>", code: "</code>" };

function sameMark(a: OpenMark, b: OpenMark): boolean {
  return a.type === b.type && a.href === b.href;
}

/** A heading of the rendered body, for the page's in-page contents; `id` is the element's id. */
export type OutlineHeading = { level: number; text: string; id: string };

/** An id from a heading's words: lower-case letters and digits joined by hyphens ("s-" keeps it apart from the app's ids). */
function headingId(text: string, used: Set<string>): string {
  const base = `s-${text.normalize("NFKD").toLowerCase().replace(/[^a-z0-9]+/g, "-").replace(/^-|-$/g, "").slice(0, 60) || "section"}`;
  let id = base;
  for (let n = 2; used.has(id); n += 1) id = `${base}-${n}`;
  used.add(id);
  return id;
}

class Renderer {
  private nodes = 0;
  private usedIds = new Set<string>();
  readonly outline: OutlineHeading[] = [];

  /** false once the node budget is spent; everything after that is dropped. */
  private take(): boolean {
    this.nodes += 1;
    return this.nodes <= DOCUMENT_LIMITS.maxNodes;
  }

  inline(children: unknown[]): string {
    let out = "";
    let open: OpenMark[] = [];
    for (const child of children) {
      if (!isRecord(child) || !this.take()) continue;
      let piece: string;
      let wanted: OpenMark[];
      if (child.type === "text" && typeof child.text === "string") {
        piece = escapeHtml(child.text);
        wanted = marksOf(child);
      } else if (child.type === "hardBreak") {
        piece = "<br>";
        wanted = marksOf(child);
      } else {
        continue;
      }
      let keep = 0;
      while (keep < open.length && keep < wanted.length && sameMark(open[keep]!, wanted[keep]!)) keep += 1;
      for (let i = open.length - 1; i >= keep; i -= 1) out += CLOSE[open[i]!.type];
      for (let i = keep; i < wanted.length; i += 1) out += openTag(wanted[i]!);
      open = wanted;
      out += piece;
    }
    for (let i = open.length - 1; i >= 0; i -= 1) out += CLOSE[open[i]!.type];
    return out;
  }

  blocks(children: unknown[], depth: number): string {
    let out = "";
    for (const child of children) out += this.block(child, depth);
    return out;
  }

  private cell(node: Json, tag: "td" | "th", depth: number): string {
    const attrs = attrsOf(node);
    const colspan = smallInt(attrs.colspan, 2, DOCUMENT_LIMITS.maxSpan);
    const rowspan = smallInt(attrs.rowspan, 2, DOCUMENT_LIMITS.maxSpan);
    const align = oneOf(CELL_ALIGNS, attrs.align);
    let html = `<${tag}`;
    if (colspan !== null) html += ` colspan="${colspan}"`;
    if (rowspan !== null) html += ` rowspan="${rowspan}"`;
    if (align !== null) html += ` class="align-${align}"`;
    return `${html}>${this.blocks(childrenOf(node), depth + 1)}</${tag}>`;
  }

  private rows(node: Json, depth: number): string {
    let out = "";
    for (const row of childrenOf(node)) {
      if (!isRecord(row) || row.type !== "tableRow" || !this.take()) continue;
      out += "<tr>";
      for (const cell of childrenOf(row)) {
        if (!isRecord(cell) || !this.take()) continue;
        if (cell.type === "tableCell") out += this.cell(cell, "td", depth + 2);
        else if (cell.type === "tableHeader") out += this.cell(cell, "th", depth + 2);
      }
      out += "</tr>";
    }
    return out;
  }

  private listItems(node: Json, depth: number): string {
    let out = "";
    for (const item of childrenOf(node)) {
      if (!isRecord(item) || item.type !== "listItem" || !this.take()) continue;
      out += `<li>${this.blocks(childrenOf(item), depth + 2)}</li>`;
    }
    return out;
  }

  block(node: unknown, depth: number): string {
    if (depth > DOCUMENT_LIMITS.maxDepth || !isRecord(node) || !this.take()) return "";
    const attrs = attrsOf(node);
    const inner = () => this.blocks(childrenOf(node), depth + 1);
    switch (node.type) {
      case "paragraph":
        return `<p>${this.inline(childrenOf(node))}</p>`;
      case "heading": {
        const level = oneOf(HEADING_LEVELS, attrs.level) ?? HEADING_LEVELS[0];
        const text = childrenOf(node)
          .map((c) => (isRecord(c) && c.type === "text" && typeof c.text === "string" ? c.text : ""))
          .join("")
          .trim();
        const id = headingId(text, this.usedIds);
        if (text) this.outline.push({ level, text, id });
        return `<h${level} id="${id}">${this.inline(childrenOf(node))}</h${level}>`;
      }
      case "blockquote":
        return `<blockquote>${inner()}</blockquote>`;
      case "callout": {
        const kind = oneOf<CalloutKind>(CALLOUT_KINDS, attrs.kind);
        if (kind === null) return inner();
        return (
          `<aside class="callout callout-${kind}" role="note">` +
          `<p class="callout-label">${escapeHtml(CALLOUT_LABELS[kind])}</p>${inner()}</aside>`
        );
      }
      case "bulletList":
        return `<ul>${this.listItems(node, depth)}</ul>`;
      case "orderedList": {
        const start = smallInt(attrs.start, 0, 99_999);
        const type = oneOf(ORDERED_LIST_TYPES, attrs.type);
        let open = "<ol";
        if (start !== null && start !== 1) open += ` start="${start}"`;
        if (type !== null) open += ` type="${type}"`;
        return `${open}>${this.listItems(node, depth)}</ol>`;
      }
      case "codeBlock": {
        const language = typeof attrs.language === "string" && LANGUAGE.test(attrs.language) ? attrs.language : null;
        const text = childrenOf(node)
          .map((c) => (isRecord(c) && c.type === "text" && typeof c.text === "string" && this.take() ? c.text : ""))
          .join("");
        const cls = language === null ? "" : ` class="language-${escapeHtml(language)}"`;
        return `<pre><code${cls}>${escapeHtml(text)}</code></pre>`;
      }
      case "horizontalRule":
        return "<hr>";
      case "table":
        return `<div class="table-scroll"><table><tbody>${this.rows(node, depth)}</tbody></table></div>`;
      case "still": {
        const id = typeof attrs.stillId === "string" && UUID.test(attrs.stillId) ? attrs.stillId.toLowerCase() : null;
        if (id === null) return "";
        const alt = typeof attrs.alt === "string" ? attrs.alt : "";
        const caption = typeof attrs.caption === "string" ? attrs.caption : "";
        const figcaption = caption === "" ? "" : `<figcaption>${escapeHtml(caption)}</figcaption>`;
        return (
          `<figure class="still"><img src="/api/stills/${id}/preview" alt="${escapeHtml(alt)}" loading="lazy">` +
          `${figcaption}</figure>`
        );
      }
      default:
        return "";
    }
  }
}

/**
 * HTML for a technique body (normally a validated TechniqueDocument; anything else renders to
 * what survives the allow-list, possibly ""). Safe to pass to dangerouslySetInnerHTML.
 */
export function renderDocumentToHtml(doc: unknown): string {
  return renderDocument(doc).html;
}

/** The HTML and its headings (with the ids the HTML gives them), for in-page contents. */
export function renderDocument(doc: unknown): { html: string; outline: OutlineHeading[] } {
  if (!isRecord(doc) || doc.type !== "doc") return { html: "", outline: [] };
  const renderer = new Renderer();
  const html = renderer.blocks(childrenOf(doc), 1);
  return { html, outline: renderer.outline };
}
