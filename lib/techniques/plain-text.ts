import { CALLOUT_LABELS, DOCUMENT_LIMITS, type CalloutKind } from "@/lib/techniques/document";

/*
 * Plain text of a technique body, for search (lib/search) and for revision diffs. Blocks are
 * separated by a blank line, list items and table rows by a newline, table cells by a tab, so a
 * word diff lines up with what the reader sees. Like the renderer it ignores what it does not know.
 */

type Json = Record<string, unknown>;

function isRecord(v: unknown): v is Json {
  return typeof v === "object" && v !== null && !Array.isArray(v);
}

function childrenOf(node: Json): unknown[] {
  return Array.isArray(node.content) ? node.content : [];
}

function attrsOf(node: Json): Json {
  return isRecord(node.attrs) ? node.attrs : {};
}

function inlineText(node: Json): string {
  return childrenOf(node)
    .map((c) => {
      if (!isRecord(c)) return "";
      if (c.type === "text" && typeof c.text === "string") return c.text;
      if (c.type === "hardBreak") return "\n";
      return "";
    })
    .join("");
}

function joinBlocks(parts: string[]): string {
  return parts.filter((p) => p !== "").join("\n\n");
}

/** How a still reads in plain text; the revision diff swaps in a token it shows as a thumbnail. */
export type StillText = (still: { stillId: string; alt: string; caption: string }) => string;

const stillAsWords: StillText = ({ alt, caption }) => {
  const words = [caption, alt].filter((t) => t.trim() !== "");
  return `[still${words.length ? `: ${[...new Set(words)].join(" — ")}` : ""}]`;
};

function blocksText(children: unknown[], depth: number, still: StillText): string {
  return joinBlocks(children.map((c) => blockText(c, depth, still)));
}

function listText(node: Json, depth: number, ordered: boolean, still: StillText): string {
  const start = typeof attrsOf(node).start === "number" ? (attrsOf(node).start as number) : 1;
  return childrenOf(node)
    .filter((item): item is Json => isRecord(item) && item.type === "listItem")
    .map((item, i) => {
      const marker = ordered ? `${start + i}. ` : "- ";
      // Nested blocks of one item stay on following lines, indented under the marker.
      const body = childrenOf(item)
        .map((c) => blockText(c, depth + 2, still))
        .filter((t) => t !== "")
        .join("\n");
      return marker + body.replace(/\n/g, `\n${" ".repeat(marker.length)}`);
    })
    .join("\n");
}

function tableText(node: Json, depth: number, still: StillText): string {
  return childrenOf(node)
    .filter((row): row is Json => isRecord(row) && row.type === "tableRow")
    .map((row) =>
      childrenOf(row)
        .filter((cell): cell is Json => isRecord(cell) && (cell.type === "tableCell" || cell.type === "tableHeader"))
        .map((cell) =>
          childrenOf(cell)
            .map((c) => blockText(c, depth + 3, still))
            .filter((t) => t !== "")
            .join(" ")
            .replace(/\s*\n\s*/g, " "),
        )
        .join("\t"),
    )
    .join("\n");
}

function blockText(node: unknown, depth: number, still: StillText): string {
  if (depth > DOCUMENT_LIMITS.maxDepth || !isRecord(node)) return "";
  switch (node.type) {
    case "paragraph":
    case "heading":
      return inlineText(node);
    case "codeBlock":
      return inlineText(node);
    case "blockquote":
      return blocksText(childrenOf(node), depth + 1, still);
    case "callout": {
      const kind = attrsOf(node).kind;
      const label = typeof kind === "string" && kind in CALLOUT_LABELS ? CALLOUT_LABELS[kind as CalloutKind] : "";
      const body = blocksText(childrenOf(node), depth + 1, still);
      return label === "" ? body : `${label}:\n${body}`;
    }
    case "bulletList":
      return listText(node, depth, false, still);
    case "orderedList":
      return listText(node, depth, true, still);
    case "table":
      return tableText(node, depth, still);
    case "horizontalRule":
      return "---";
    case "still": {
      const { stillId, alt, caption } = attrsOf(node);
      const text = (v: unknown) => (typeof v === "string" ? v : "");
      return still({ stillId: text(stillId), alt: text(alt), caption: text(caption) });
    }
    default:
      return "";
  }
}

/** Plain text of a technique body (any input: unknown parts are skipped). */
export function documentToPlainText(doc: unknown, options: { still?: StillText } = {}): string {
  if (!isRecord(doc) || doc.type !== "doc") return "";
  return blocksText(childrenOf(doc), 1, options.still ?? stillAsWords);
}
