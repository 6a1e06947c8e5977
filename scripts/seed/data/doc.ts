import type {
  BlockNode,
  CalloutKind,
  CalloutNode,
  CodeBlockNode,
  DocumentMark,
  HeadingNode,
  HorizontalRuleNode,
  InlineNode,
  ListItemNode,
  OrderedListNode,
  BulletListNode,
  ParagraphNode,
  TableCellNode,
  TableHeaderNode,
  TableNode,
  TechniqueDocument,
  TextNode,
  BlockquoteNode,
} from "@/lib/techniques/document";

/*
 * Small builders for the demo technique bodies, so the seed content reads like prose rather
 * than JSON. Plain strings accept two inline shorthands: **bold** and `code` (nothing else,
 * so shot codes with underscores and formulas with * stay literal).
 */

export type Inline = string | InlineNode;
type InlineInput = Inline | Inline[];
/** A list item: inline content for its paragraph, or a ready-made listItem node. */
type ItemInput = InlineInput | ListItemNode;
/** A table cell: inline content for one paragraph, or blocks. */
type CellInput = InlineInput | BlockNode[];

function textNode(text: string, marks: DocumentMark[]): TextNode {
  return marks.length > 0 ? { type: "text", text, marks } : { type: "text", text };
}

/** Splits `code` spans first (their content is never re-read), then **bold** runs. */
export function md(source: string): InlineNode[] {
  const out: InlineNode[] = [];
  source.split("`").forEach((chunk, i) => {
    if (chunk === "") return;
    if (i % 2 === 1) {
      out.push(textNode(chunk, [{ type: "code" }]));
      return;
    }
    chunk.split("**").forEach((run, j) => {
      if (run !== "") out.push(textNode(run, j % 2 === 1 ? [{ type: "bold" }] : []));
    });
  });
  return out;
}

function inlines(input: InlineInput): InlineNode[] {
  const parts = Array.isArray(input) ? input : [input];
  return parts.flatMap((part) => (typeof part === "string" ? md(part) : [part]));
}

function isBlockArray(v: CellInput): v is BlockNode[] {
  return Array.isArray(v) && v.length > 0 && typeof v[0] === "object" && v[0] !== null && v[0].type !== "text" && v[0].type !== "hardBreak";
}

function isListItem(v: ItemInput): v is ListItemNode {
  return typeof v === "object" && !Array.isArray(v) && v.type === "listItem";
}

// ---------- inline ----------

export const b = (text: string): TextNode => textNode(text, [{ type: "bold" }]);
export const i = (text: string): TextNode => textNode(text, [{ type: "italic" }]);
export const code = (text: string): TextNode => textNode(text, [{ type: "code" }]);
export const link = (text: string, href: string): TextNode => textNode(text, [{ type: "link", attrs: { href } }]);
export const br: InlineNode = { type: "hardBreak" };

// ---------- blocks ----------

export function p(...parts: Inline[]): ParagraphNode {
  const content = inlines(parts);
  return content.length > 0 ? { type: "paragraph", content } : { type: "paragraph" };
}

function heading(level: 2 | 3 | 4, text: InlineInput): HeadingNode {
  return { type: "heading", attrs: { level }, content: inlines(text) };
}
export const h2 = (text: InlineInput): HeadingNode => heading(2, text);
export const h3 = (text: InlineInput): HeadingNode => heading(3, text);
export const h4 = (text: InlineInput): HeadingNode => heading(4, text);

/** A list item whose first paragraph is `first`, followed by any nested blocks. */
export function li(first: InlineInput, ...rest: BlockNode[]): ListItemNode {
  return { type: "listItem", content: [p(...inlines(first)), ...rest] };
}

function items(list: ItemInput[]): ListItemNode[] {
  return list.map((item) => (isListItem(item) ? item : li(item)));
}

export function ul(...list: ItemInput[]): BulletListNode {
  return { type: "bulletList", content: items(list) };
}

export function ol(...list: ItemInput[]): OrderedListNode {
  return { type: "orderedList", content: items(list) };
}

/** Callout body: strings become paragraphs. */
export function callout(kind: CalloutKind, ...body: (string | BlockNode)[]): CalloutNode {
  return { type: "callout", attrs: { kind }, content: body.map((x) => (typeof x === "string" ? p(x) : x)) };
}
export const works = (...body: (string | BlockNode)[]): CalloutNode => callout("works", ...body);
export const fails = (...body: (string | BlockNode)[]): CalloutNode => callout("fails", ...body);
export const caution = (...body: (string | BlockNode)[]): CalloutNode => callout("caution", ...body);

export function quote(...body: (string | BlockNode)[]): BlockquoteNode {
  return { type: "blockquote", content: body.map((x) => (typeof x === "string" ? p(x) : x)) };
}

export function codeBlock(text: string, language?: string): CodeBlockNode {
  const content = text.length > 0 ? [{ type: "text" as const, text }] : undefined;
  return {
    type: "codeBlock",
    ...(language ? { attrs: { language } } : {}),
    ...(content ? { content } : {}),
  };
}

export const hr: HorizontalRuleNode = { type: "horizontalRule" };

function cellBlocks(cell: CellInput): BlockNode[] {
  return isBlockArray(cell) ? cell : [p(...inlines(cell as InlineInput))];
}

/** A table with one header row. */
export function table(header: CellInput[], rows: CellInput[][]): TableNode {
  const head: TableHeaderNode[] = header.map((cell) => ({ type: "tableHeader", content: cellBlocks(cell) }));
  const body = rows.map((row) => ({
    type: "tableRow" as const,
    content: row.map((cell): TableCellNode => ({ type: "tableCell", content: cellBlocks(cell) })),
  }));
  return { type: "table", content: [{ type: "tableRow", content: head }, ...body] };
}

export function doc(...content: BlockNode[]): TechniqueDocument {
  return { type: "doc", content };
}
