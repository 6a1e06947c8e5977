import { z } from "zod";

/*
 * The stored form of a technique body: the editor's JSON document, restricted to an
 * allow-list of our own node and mark types. Client-safe (used by the editor, the API
 * and the renderer). Anything not listed here is refused with a path naming where.
 */

export const HEADING_LEVELS = [2, 3, 4] as const;
type HeadingLevel = (typeof HEADING_LEVELS)[number];

export const CALLOUT_KINDS = ["works", "fails", "caution"] as const;
export type CalloutKind = (typeof CALLOUT_KINDS)[number];
export const CALLOUT_LABELS: Record<CalloutKind, string> = {
  works: "Works when",
  fails: "Fails when",
  caution: "Caution",
};

export const ORDERED_LIST_TYPES = ["1", "a", "A", "i", "I"] as const;
export const CELL_ALIGNS = ["left", "center", "right"] as const;

export const DOCUMENT_LIMITS = {
  maxDepth: 40,
  maxTextChars: 200_000,
  maxNodes: 20_000,
  maxHrefLength: 2_048,
  maxAltLength: 300,
  maxCaptionLength: 500,
  maxSpan: 20,
  /** Stop collecting after this many problems: a hostile document should not make a huge 400. */
  maxIssues: 20,
} as const;

// ---------- types ----------

type BoldMark = { type: "bold" };
type ItalicMark = { type: "italic" };
type CodeMark = { type: "code" };
type LinkMark = { type: "link"; attrs: { href: string } };
export type DocumentMark = BoldMark | ItalicMark | CodeMark | LinkMark;

export type TextNode = { type: "text"; text: string; marks?: DocumentMark[] };
/** Marks on a break come from the editor carrying the surrounding formatting across it. */
type HardBreakNode = { type: "hardBreak"; marks?: DocumentMark[] };
export type InlineNode = TextNode | HardBreakNode;

export type ParagraphNode = { type: "paragraph"; content?: InlineNode[] };
export type HeadingNode = { type: "heading"; attrs: { level: HeadingLevel }; content?: InlineNode[] };
export type BlockquoteNode = { type: "blockquote"; content: BlockNode[] };
export type CalloutNode = { type: "callout"; attrs: { kind: CalloutKind }; content: BlockNode[] };
export type ListItemNode = { type: "listItem"; content: [ParagraphNode, ...BlockNode[]] };
export type BulletListNode = { type: "bulletList"; content: ListItemNode[] };
export type OrderedListNode = {
  type: "orderedList";
  attrs?: { start?: number; type?: (typeof ORDERED_LIST_TYPES)[number] | null };
  content: ListItemNode[];
};
export type CodeBlockNode = {
  type: "codeBlock";
  attrs?: { language?: string | null };
  content?: { type: "text"; text: string }[];
};
export type HorizontalRuleNode = { type: "horizontalRule" };
type TableCellAttrs = {
  colspan?: number;
  rowspan?: number;
  colwidth?: number[] | null;
  align?: (typeof CELL_ALIGNS)[number] | null;
};
export type TableCellNode = { type: "tableCell"; attrs?: TableCellAttrs; content: BlockNode[] };
export type TableHeaderNode = { type: "tableHeader"; attrs?: TableCellAttrs; content: BlockNode[] };
type TableRowNode = { type: "tableRow"; content?: (TableCellNode | TableHeaderNode)[] };
export type TableNode = { type: "table"; content: TableRowNode[] };
type StillNode = { type: "still"; attrs: { stillId: string; alt: string; caption: string } };

export type BlockNode =
  | ParagraphNode
  | HeadingNode
  | BlockquoteNode
  | CalloutNode
  | BulletListNode
  | OrderedListNode
  | CodeBlockNode
  | HorizontalRuleNode
  | TableNode
  | StillNode;

export type TechniqueDocument = { type: "doc"; content: BlockNode[] };

// ---------- links ----------

// C0/C1 controls, soft hyphen, zero-width and bidi-format characters: browsers drop some of
// these while parsing a URL, so "java\tscript:" or "\u0000javascript:" would still run script.
// OWASP XSS Prevention Cheat Sheet, "Output Encoding for URL Contexts": allow-list the scheme.
const INVISIBLE = /[\u0000-\u001F\u007F-\u009F\u00AD\u061C\u180E\u200B-\u200F\u2028-\u202E\u2060-\u206F\uFEFF]/g;
const SCHEME = /^([a-z][a-z0-9+.-]*):/;
const SAME_ORIGIN_BASE = "https://plateroom.invalid/";

/**
 * The href as it may be written into a page, or null when it is not an http(s), mailto or
 * same-site relative link. Invisible characters are removed before deciding (and from the result);
 * the scheme is judged with all whitespace removed and case folded.
 */
export function safeHref(raw: unknown): string | null {
  if (typeof raw !== "string" || raw.length > DOCUMENT_LIMITS.maxHrefLength) return null;
  const href = raw.replace(INVISIBLE, "").trim();
  if (href === "") return null;
  const probe = href.replace(/\s+/g, "").toLowerCase();
  const scheme = SCHEME.exec(probe)?.[1];
  if (scheme !== undefined) {
    if (scheme === "mailto") return probe.length > "mailto:".length ? href : null;
    if (scheme !== "http" && scheme !== "https") return null;
    try {
      return new URL(href).hostname ? href : null;
    } catch {
      return null;
    }
  }
  // Relative: a backslash or a leading "//" would let the browser pick another host.
  if (href.includes("\\") || probe.startsWith("//")) return null;
  try {
    return new URL(href, SAME_ORIGIN_BASE).origin === new URL(SAME_ORIGIN_BASE).origin ? href : null;
  } catch {
    return null;
  }
}

// ---------- structure ----------

type Issue = { path: (string | number)[]; message: string };

const BLOCK = [
  "paragraph",
  "heading",
  "blockquote",
  "callout",
  "bulletList",
  "orderedList",
  "codeBlock",
  "horizontalRule",
  "table",
  "still",
] as const;
const INLINE = ["text", "hardBreak"] as const;

type NodeSpec = {
  /** allowed child types; null = leaf */
  children: readonly string[] | null;
  minChildren?: 0 | 1;
  firstChild?: string;
  attrs: Record<string, z.ZodType>;
  requiredAttrs?: readonly string[];
};

const span = z.number().int().min(1).max(DOCUMENT_LIMITS.maxSpan);
const cellAttrs = {
  colspan: span,
  rowspan: span,
  colwidth: z.array(z.number().int().min(1).max(10_000)).max(DOCUMENT_LIMITS.maxSpan).nullable(),
  align: z.enum(CELL_ALIGNS).nullable(),
};

const SPECS: Record<string, NodeSpec> = {
  doc: { children: BLOCK, minChildren: 1, attrs: {} },
  paragraph: { children: INLINE, attrs: {} },
  heading: {
    children: INLINE,
    attrs: { level: z.union(HEADING_LEVELS.map((l) => z.literal(l))) },
    requiredAttrs: ["level"],
  },
  blockquote: { children: BLOCK, minChildren: 1, attrs: {} },
  callout: { children: BLOCK, minChildren: 1, attrs: { kind: z.enum(CALLOUT_KINDS) }, requiredAttrs: ["kind"] },
  bulletList: { children: ["listItem"], minChildren: 1, attrs: {} },
  orderedList: {
    children: ["listItem"],
    minChildren: 1,
    attrs: { start: z.number().int().min(0).max(99_999), type: z.enum(ORDERED_LIST_TYPES).nullable() },
  },
  listItem: { children: BLOCK, minChildren: 1, firstChild: "paragraph", attrs: {} },
  codeBlock: {
    children: ["text"],
    attrs: {
      language: z
        .string()
        .regex(/^[A-Za-z0-9][A-Za-z0-9+#._-]{0,31}$/, "Use a short language name such as python or glsl")
        .nullable(),
    },
  },
  horizontalRule: { children: null, attrs: {} },
  table: { children: ["tableRow"], minChildren: 1, attrs: {} },
  tableRow: { children: ["tableCell", "tableHeader"], attrs: {} },
  tableCell: { children: BLOCK, minChildren: 1, attrs: cellAttrs },
  tableHeader: { children: BLOCK, minChildren: 1, attrs: cellAttrs },
  still: {
    children: null,
    attrs: {
      stillId: z.uuid(),
      alt: z.string().max(DOCUMENT_LIMITS.maxAltLength),
      caption: z.string().max(DOCUMENT_LIMITS.maxCaptionLength),
    },
    requiredAttrs: ["stillId", "alt", "caption"],
  },
  text: { children: null, attrs: {} },
  hardBreak: { children: null, attrs: {} },
};

const MARK_ATTRS: Record<string, Record<string, z.ZodType>> = {
  bold: {},
  italic: {},
  code: {},
  link: {
    href: z
      .string()
      .refine(
        (h) => safeHref(h) !== null,
        `Links must be http, https, mailto or a relative path, at most ${DOCUMENT_LIMITS.maxHrefLength} characters`,
      ),
  },
};

const NODE_KEYS = new Set(["type", "attrs", "content", "marks", "text"]);

function isRecord(v: unknown): v is Record<string, unknown> {
  return typeof v === "object" && v !== null && !Array.isArray(v);
}

function has(o: object, key: string): boolean {
  return Object.prototype.hasOwnProperty.call(o, key);
}

class DocumentChecker {
  readonly issues: Issue[] = [];
  nodes = 0;
  textChars = 0;
  private stopped = false;

  add(path: (string | number)[], message: string): void {
    if (this.issues.length >= DOCUMENT_LIMITS.maxIssues) {
      this.stopped = true;
      return;
    }
    this.issues.push({ path, message });
  }

  get done(): boolean {
    return this.stopped;
  }

  checkAttrs(
    attrs: unknown,
    spec: Record<string, z.ZodType>,
    required: readonly string[],
    path: (string | number)[],
  ): void {
    if (attrs === undefined) {
      for (const key of required) this.add([...path, "attrs", key], `Missing attribute "${key}"`);
      return;
    }
    if (!isRecord(attrs)) {
      this.add([...path, "attrs"], "Attributes must be an object");
      return;
    }
    for (const key of Object.keys(attrs)) {
      const schema = has(spec, key) ? spec[key] : undefined;
      if (schema === undefined) {
        this.add([...path, "attrs", key], `Unknown attribute "${key}"`);
        continue;
      }
      const result = schema.safeParse(attrs[key]);
      if (!result.success) {
        for (const issue of result.error.issues) {
          this.add([...path, "attrs", key, ...(issue.path as (string | number)[])], issue.message);
        }
      }
    }
    for (const key of required) {
      if (!has(attrs, key)) this.add([...path, "attrs", key], `Missing attribute "${key}"`);
    }
  }

  checkMarks(marks: unknown, path: (string | number)[], allowed: boolean): void {
    if (marks === undefined) return;
    const marksPath = [...path, "marks"];
    if (!Array.isArray(marks)) return this.add(marksPath, "Marks must be a list");
    if (!allowed && marks.length > 0) return this.add(marksPath, "Code blocks hold plain text only");
    const seen = new Set<string>();
    marks.forEach((mark: unknown, i) => {
      const markPath = [...marksPath, i];
      if (!isRecord(mark)) return this.add(markPath, "A mark must be an object");
      for (const key of Object.keys(mark)) {
        if (key !== "type" && key !== "attrs") this.add([...markPath, key], `Unknown key "${key}"`);
      }
      const type = mark.type;
      const spec = typeof type === "string" && has(MARK_ATTRS, type) ? MARK_ATTRS[type] : undefined;
      if (spec === undefined) return this.add([...markPath, "type"], `Unknown mark type ${JSON.stringify(type)}`);
      if (seen.has(type as string)) return this.add([...markPath, "type"], `Mark "${String(type)}" appears twice`);
      seen.add(type as string);
      this.checkAttrs(mark.attrs, spec, type === "link" ? ["href"] : [], markPath);
    });
  }

  checkNode(node: unknown, path: (string | number)[], depth: number, parent: string | null): void {
    if (this.stopped) return;
    this.nodes += 1;
    if (this.nodes > DOCUMENT_LIMITS.maxNodes) {
      this.add([], `The document has more than ${DOCUMENT_LIMITS.maxNodes} nodes`);
      this.stopped = true;
      return;
    }
    if (depth > DOCUMENT_LIMITS.maxDepth) {
      this.add(path, `Nested more than ${DOCUMENT_LIMITS.maxDepth} levels deep`);
      return;
    }
    if (!isRecord(node)) return this.add(path, "A node must be an object");
    const type = node.type;
    const spec = typeof type === "string" && has(SPECS, type) ? SPECS[type] : undefined;
    if (spec === undefined) return this.add([...path, "type"], `Unknown node type ${JSON.stringify(type)}`);
    if (parent === null && type !== "doc") return this.add([...path, "type"], 'The document must be of type "doc"');

    for (const key of Object.keys(node)) {
      if (!NODE_KEYS.has(key)) this.add([...path, key], `Unknown key "${key}"`);
    }
    this.checkAttrs(node.attrs, spec.attrs, spec.requiredAttrs ?? [], path);

    if (type === "text") {
      if (typeof node.text !== "string" || node.text.length === 0) {
        this.add([...path, "text"], "A text node needs non-empty text");
      } else {
        this.textChars += node.text.length;
      }
    } else if (has(node, "text")) {
      this.add([...path, "text"], `A "${type}" node cannot carry text`);
    }
    if (type === "text" || type === "hardBreak") {
      this.checkMarks(node.marks, path, parent !== "codeBlock");
    } else if (has(node, "marks")) {
      this.add([...path, "marks"], `A "${type}" node cannot carry marks`);
    }

    const content = node.content;
    if (spec.children === null) {
      if (content !== undefined) this.add([...path, "content"], `A "${type}" node has no content`);
      return;
    }
    if (content !== undefined && !Array.isArray(content)) {
      return this.add([...path, "content"], "Content must be a list");
    }
    const children: unknown[] = content ?? [];
    if (children.length < (spec.minChildren ?? 0)) {
      this.add([...path, "content"], `A "${type}" node needs at least one child`);
    }
    children.forEach((child, i) => {
      if (this.stopped) return;
      const childPath = [...path, "content", i];
      const childType = isRecord(child) ? child.type : undefined;
      if (typeof childType === "string" && has(SPECS, childType)) {
        if (!spec.children!.includes(childType)) {
          return this.add([...childPath, "type"], `"${childType}" is not allowed inside "${type}"`);
        }
        if (i === 0 && spec.firstChild && childType !== spec.firstChild) {
          return this.add([...childPath, "type"], `A "${type}" must start with a "${spec.firstChild}"`);
        }
      }
      this.checkNode(child, childPath, depth + 1, type as string);
    });
  }
}

/** Problems in a stored/submitted document, each with a path relative to the document. */
export function findDocumentIssues(value: unknown): Issue[] {
  const checker = new DocumentChecker();
  checker.checkNode(value, [], 0, null);
  if (checker.textChars > DOCUMENT_LIMITS.maxTextChars && !checker.done) {
    checker.add([], `The document has more than ${DOCUMENT_LIMITS.maxTextChars} characters of text`);
  }
  return checker.issues;
}

/**
 * zod schema for a technique body. Nest it (e.g. `z.object({ body: techniqueDocumentSchema })`)
 * and issue paths come out like ["body","content",3,"content",0,"type"].
 */
export const techniqueDocumentSchema = z.custom<TechniqueDocument>().superRefine((value, ctx) => {
  for (const issue of findDocumentIssues(value)) {
    ctx.addIssue({ code: "custom", message: issue.message, path: issue.path, input: value });
  }
});

export function emptyDocument(): TechniqueDocument {
  return { type: "doc", content: [{ type: "paragraph" }] };
}

/** Paragraphs from plain text (blank lines split paragraphs, single newlines become line breaks). */
export function documentFromText(text: string): TechniqueDocument {
  const paragraphs = text
    .replace(/\r\n?/g, "\n")
    .split(/\n[ \t]*\n+/)
    .map((p) => p.trim())
    .filter((p) => p !== "");
  if (paragraphs.length === 0) return emptyDocument();
  return {
    type: "doc",
    content: paragraphs.map((p): ParagraphNode => {
      const content: InlineNode[] = [];
      p.split("\n").forEach((line, i) => {
        if (i > 0) content.push({ type: "hardBreak" });
        if (line !== "") content.push({ type: "text", text: line });
      });
      return { type: "paragraph", content };
    }),
  };
}
