import { describe, expect, test } from "vitest";
import { z } from "zod";

import {
  DOCUMENT_LIMITS,
  documentFromText,
  emptyDocument,
  safeHref,
  techniqueDocumentSchema,
} from "@/lib/techniques/document";

import { everyNodeDocument, linkDoc, STILL_ID } from "./fixtures";

/* The stored-document schema: what it accepts, and where it says the problem is. */

const bodySchema = z.object({ body: techniqueDocumentSchema });

function issuesOf(body: unknown) {
  const result = bodySchema.safeParse({ body });
  expect(result.success).toBe(false);
  return result.error!.issues.map((i) => ({ path: i.path, message: i.message }));
}

function firstPath(body: unknown) {
  return issuesOf(body)[0]?.path;
}

const p = (text: string) => ({ type: "paragraph", content: [{ type: "text", text }] });

describe("accepts", () => {
  test("every supported node and mark", () => {
    expect(bodySchema.safeParse({ body: everyNodeDocument() }).success).toBe(true);
  });
  test("the empty document and documents built from text", () => {
    expect(techniqueDocumentSchema.safeParse(emptyDocument()).success).toBe(true);
    expect(techniqueDocumentSchema.safeParse(documentFromText("One\nline two\n\nPara <b>two</b>")).success).toBe(true);
  });
  test.each(["https://example.org/x", "http://example.org", "mailto:lead@kestrel.test", "/techniques/a", "#steps", "?q=grain", "../b"])(
    "link %j",
    (href) => expect(techniqueDocumentSchema.safeParse(linkDoc(href)).success).toBe(true),
  );
});

describe("rejects, naming the path", () => {
  test("an unknown node type, deep inside", () => {
    const body = { type: "doc", content: [p("a"), p("b"), p("c"), { type: "bulletList", content: [{ type: "script", content: [] }] }] };
    expect(issuesOf(body)).toEqual([{ path: ["body", "content", 3, "content", 0, "type"], message: 'Unknown node type "script"' }]);
  });

  test("a node in the wrong place", () => {
    expect(firstPath({ type: "doc", content: [{ type: "text", text: "loose" }] })).toEqual(["body", "content", 0, "type"]);
    expect(firstPath({ type: "doc", content: [{ type: "bulletList", content: [p("x")] }] })).toEqual(["body", "content", 0, "content", 0, "type"]);
    expect(firstPath({ type: "doc", content: [{ type: "listItem", content: [p("x")] }] })).toEqual(["body", "content", 0, "type"]);
  });

  test.each([
    ["onclick on a paragraph", { type: "paragraph", attrs: { onclick: "alert(1)" } }, ["body", "content", 0, "attrs", "onclick"]],
    ["onerror on a still", { type: "still", attrs: { stillId: STILL_ID, alt: "", caption: "", onerror: "x" } }, ["body", "content", 0, "attrs", "onerror"]],
    ["src on a still", { type: "still", attrs: { stillId: STILL_ID, alt: "", caption: "", src: "https://x" } }, ["body", "content", 0, "attrs", "src"]],
    ["a still id that is not a uuid", { type: "still", attrs: { stillId: "../../etc/passwd", alt: "", caption: "" } }, ["body", "content", 0, "attrs", "stillId"]],
    ["heading level 1", { type: "heading", attrs: { level: 1 } }, ["body", "content", 0, "attrs", "level"]],
    ["heading level 5", { type: "heading", attrs: { level: 5 } }, ["body", "content", 0, "attrs", "level"]],
    ["a callout of an unknown kind", { type: "callout", attrs: { kind: "note" }, content: [p("x")] }, ["body", "content", 0, "attrs", "kind"]],
    ["a code language with markup", { type: "codeBlock", attrs: { language: '"><script>' } }, ["body", "content", 0, "attrs", "language"]],
    ["a huge colspan", { type: "table", content: [{ type: "tableRow", content: [{ type: "tableCell", attrs: { colspan: 1000 }, content: [p("x")] }] }] }, ["body", "content", 0, "content", 0, "content", 0, "attrs", "colspan"]],
    ["an extra key on a node", { type: "paragraph", html: "<b>x</b>" }, ["body", "content", 0, "html"]],
    ["marks on a paragraph", { type: "paragraph", marks: [{ type: "bold" }] }, ["body", "content", 0, "marks"]],
    ["an empty text node", { type: "paragraph", content: [{ type: "text", text: "" }] }, ["body", "content", 0, "content", 0, "text"]],
    ["an unknown mark", { type: "paragraph", content: [{ type: "text", text: "x", marks: [{ type: "span" }] }] }, ["body", "content", 0, "content", 0, "marks", 0, "type"]],
    ["a link with target", { type: "paragraph", content: [{ type: "text", text: "x", marks: [{ type: "link", attrs: { href: "/a", target: "_blank" } }] }] }, ["body", "content", 0, "content", 0, "marks", 0, "attrs", "target"]],
    ["marks in a code block", { type: "codeBlock", content: [{ type: "text", text: "x", marks: [{ type: "bold" }] }] }, ["body", "content", 0, "content", 0, "marks"]],
  ])("%s", (_name, node, path) => {
    expect(firstPath({ type: "doc", content: [node] })).toEqual(path);
  });

  test("an own __proto__ attribute from JSON.parse is an unknown attribute", () => {
    const node = JSON.parse('{"type":"paragraph","attrs":{"__proto__":{"polluted":true}}}');
    expect(firstPath({ type: "doc", content: [node] })).toEqual(["body", "content", 0, "attrs", "__proto__"]);
  });

  // Vectors from the OWASP XSS Filter Evasion Cheat Sheet (case, embedded tab/newline, leading
  // NUL and spaces, data:/vbscript:), from memory; the WHATWG URL Standard's parser strips leading
  // C0 controls and spaces and removes tab/newline anywhere, which is why each of these would run.
  test.each([
    "javascript:alert(1)",
    "JaVaScRiPt:alert(1)",
    "\u0000javascript:alert(1)",
    " \u0001javascript:alert(1)",
    "java\tscript:alert(1)",
    "jav&#x09;ascript:alert(1)".replace("&#x09;", "\t"),
    "javascript\u200b:alert(1)",
    "data:text/html;base64,PHNjcmlwdD4=",
    "vbscript:msgbox(1)",
    "//evil.example",
    "/\\evil.example",
    "\\\\evil.example",
    "",
  ])("link %j", (href) => {
    expect(issuesOf(linkDoc(href))).toEqual([
      { path: ["body", "content", 0, "content", 0, "marks", 0, "attrs", "href"], message: expect.any(String) },
    ]);
  });

  test("an overlong link", () => {
    const href = `/${"x".repeat(DOCUMENT_LIMITS.maxHrefLength)}`;
    expect(firstPath(linkDoc(href))).toEqual(["body", "content", 0, "content", 0, "marks", 0, "attrs", "href"]);
  });

  test("not a document", () => {
    expect(firstPath("<p>hi</p>")).toEqual(["body"]);
    expect(firstPath({ type: "paragraph" })).toEqual(["body", "type"]);
    expect(firstPath({ type: "doc", content: [] })).toEqual(["body", "content"]);
    expect(firstPath({ type: "doc", content: {} })).toEqual(["body", "content"]);
  });

  test("nesting deeper than the limit names the first node past it", () => {
    let node: Record<string, unknown> = p("deep");
    for (let i = 0; i < 10_000; i += 1) node = { type: "blockquote", content: [node] };
    const path = firstPath({ type: "doc", content: [node] })!;
    // doc is depth 0; each level adds ["content", 0]
    expect(path).toEqual(["body", ...Array.from({ length: DOCUMENT_LIMITS.maxDepth + 1 }, () => ["content", 0]).flat()]);
  });

  test("more nodes than the limit", () => {
    const content = Array.from({ length: DOCUMENT_LIMITS.maxNodes }, () => ({ type: "horizontalRule" }));
    expect(issuesOf({ type: "doc", content })).toEqual([{ path: ["body"], message: expect.stringContaining("nodes") }]);
  });

  test("more text than the limit", () => {
    const body = { type: "doc", content: [p("x".repeat(DOCUMENT_LIMITS.maxTextChars)), p("y")] };
    expect(issuesOf(body)).toEqual([{ path: ["body"], message: expect.stringContaining("characters") }]);
  });

  test("a flood of problems is cut short", () => {
    const content = Array.from({ length: 500 }, () => ({ type: "paragraph", attrs: { onclick: "x" } }));
    expect(issuesOf({ type: "doc", content }).length).toBe(DOCUMENT_LIMITS.maxIssues);
  });
});

describe("safeHref", () => {
  test("returns the cleaned href, without invisible characters", () => {
    expect(safeHref("  https://example.org/a\u200b ")).toBe("https://example.org/a");
    expect(safeHref("\u0000/techniques/x")).toBe("/techniques/x");
  });
});

describe("documentFromText", () => {
  test("blank lines split paragraphs, single newlines become line breaks", () => {
    expect(documentFromText("First line\r\nsecond line\n\n\nNext")).toEqual({
      type: "doc",
      content: [
        { type: "paragraph", content: [{ type: "text", text: "First line" }, { type: "hardBreak" }, { type: "text", text: "second line" }] },
        { type: "paragraph", content: [{ type: "text", text: "Next" }] },
      ],
    });
    expect(documentFromText("  \n \n")).toEqual(emptyDocument());
  });
});
