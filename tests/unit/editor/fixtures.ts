import { JSDOM } from "jsdom";
import { expect } from "vitest";

import type { TechniqueDocument } from "@/lib/techniques/document";

/* Shared helpers for the editor tests (not a test file itself). */

export const STILL_ID = "3f2b8a4e-1c2d-4e5f-9a8b-7c6d5e4f3a2b";

/** Parse HTML the way a browser would: jsdom implements the WHATWG HTML parser (parse5). */
const { window } = new JSDOM("<!doctype html>", { url: "https://plateroom.test/techniques/x" });
export function parseHtml(html: string): Document {
  return new window.DOMParser().parseFromString(`<!doctype html><html><body>${html}</body></html>`, "text/html");
}

const ELEMENTS = new Set([
  "P", "H2", "H3", "H4", "STRONG", "EM", "CODE", "A", "UL", "OL", "LI", "PRE", "BLOCKQUOTE", "HR", "BR",
  "DIV", "TABLE", "TBODY", "TR", "TD", "TH", "ASIDE", "FIGURE", "IMG", "FIGCAPTION",
]);
const ATTRIBUTES = new Set(["href", "rel", "src", "alt", "loading", "class", "role", "start", "type", "colspan", "rowspan", "id"]);

/**
 * No live markup: only our elements and attributes, no event handlers, no script-capable URL.
 * The URL check resolves each href with the WHATWG URL parser (as the browser does on click),
 * so tab/NUL/case tricks are judged by what the browser would actually open.
 */
export function expectInert(html: string): Document {
  const doc = parseHtml(html);
  expect(doc.querySelectorAll("script, style, iframe, object, embed, svg, math, form, input, base, meta, link").length).toBe(0);
  for (const el of doc.body.querySelectorAll("*")) {
    expect(ELEMENTS.has(el.tagName), `element ${el.tagName}`).toBe(true);
    for (const attr of el.attributes) {
      expect(attr.name.startsWith("on"), `attribute ${attr.name}`).toBe(false);
      expect(ATTRIBUTES.has(attr.name), `attribute ${attr.name}`).toBe(true);
    }
  }
  for (const a of doc.querySelectorAll("a")) {
    const href = a.getAttribute("href") ?? "";
    const url = new URL(href, "https://plateroom.test/techniques/x");
    expect(["http:", "https:", "mailto:"]).toContain(url.protocol);
    if (!/^(https?|mailto):/i.test(href.trim())) expect(url.origin).toBe("https://plateroom.test");
    expect(a.getAttribute("rel")).toBe("noopener noreferrer nofollow");
  }
  // Headings carry an id for the in-page contents, always "s-" and plain letters, digits and hyphens.
  for (const el of doc.querySelectorAll("[id]")) {
    expect(/^H[2-4]$/.test(el.tagName), `id on ${el.tagName}`).toBe(true);
    expect(el.id).toMatch(/^s-[a-z0-9-]+$/);
  }
  for (const img of doc.querySelectorAll("img")) {
    expect(img.getAttribute("src")).toMatch(/^\/api\/stills\/[0-9a-f-]{36}\/preview$/);
  }
  return doc;
}

/**
 * What a browser's DOM keeps of a text: the HTML Standard's input-stream preprocessing turns
 * CR LF / CR into LF, and the "in body" insertion mode drops U+0000 characters.
 */
export function asParsedText(text: string): string {
  return text.replace(/\r\n?/g, "\n").replace(/\u0000/g, "");
}

/** The same for an attribute value, where the parser turns U+0000 into U+FFFD instead. */
export function asParsedAttribute(text: string): string {
  return text.replace(/\r\n?/g, "\n").replace(/\u0000/g, "\uFFFD");
}

export function paragraph(text: string): TechniqueDocument {
  return { type: "doc", content: [{ type: "paragraph", content: [{ type: "text", text }] }] };
}

export function linkDoc(href: string, text = "read more"): TechniqueDocument {
  return {
    type: "doc",
    content: [{ type: "paragraph", content: [{ type: "text", text, marks: [{ type: "link", attrs: { href } }] }] }],
  };
}

/** One of every supported node and mark, as the editor writes them (Tiptap JSON). */
export function everyNodeDocument(): TechniqueDocument {
  return {
    type: "doc",
    content: [
      { type: "heading", attrs: { level: 2 }, content: [{ type: "text", text: "Recognise it" }] },
      { type: "heading", attrs: { level: 3 }, content: [{ type: "text", text: "Steps" }] },
      { type: "heading", attrs: { level: 4 }, content: [{ type: "text", text: "Detail" }] },
      {
        type: "paragraph",
        content: [
          { type: "text", text: "Sample the " },
          { type: "text", text: "marker", marks: [{ type: "bold" }] },
          { type: "text", text: " and " },
          { type: "text", text: "screen", marks: [{ type: "italic" }] },
          { type: "text", text: " colours, set " },
          { type: "text", text: "gain", marks: [{ type: "code" }] },
          { type: "hardBreak" },
          { type: "text", text: "see the guide", marks: [{ type: "link", attrs: { href: "/techniques/marker-removal" } }] },
        ],
      },
      {
        type: "bulletList",
        content: [
          { type: "listItem", content: [{ type: "paragraph", content: [{ type: "text", text: "green markers" }] }] },
          { type: "listItem", content: [{ type: "paragraph", content: [{ type: "text", text: "blue markers" }] }] },
        ],
      },
      {
        type: "orderedList",
        attrs: { start: 3, type: null },
        content: [
          { type: "listItem", content: [{ type: "paragraph", content: [{ type: "text", text: "pick samples" }] }] },
          { type: "listItem", content: [{ type: "paragraph", content: [{ type: "text", text: "solve the row" }] }] },
        ],
      },
      { type: "codeBlock", attrs: { language: "python" }, content: [{ type: "text", text: "out = clean * matte" }] },
      { type: "blockquote", content: [{ type: "paragraph", content: [{ type: "text", text: "Check the edges." }] }] },
      { type: "horizontalRule" },
      {
        type: "table",
        content: [
          {
            type: "tableRow",
            content: [
              { type: "tableHeader", attrs: { colspan: 1, rowspan: 1, colwidth: null, align: null }, content: [{ type: "paragraph", content: [{ type: "text", text: "Step" }] }] },
              { type: "tableHeader", attrs: { colspan: 1, rowspan: 1, colwidth: null, align: null }, content: [{ type: "paragraph", content: [{ type: "text", text: "Value" }] }] },
            ],
          },
          {
            type: "tableRow",
            content: [
              { type: "tableCell", attrs: { colspan: 2, rowspan: 1, colwidth: null, align: null }, content: [{ type: "paragraph", content: [{ type: "text", text: "erode 2" }] }] },
            ],
          },
        ],
      },
      { type: "callout", attrs: { kind: "works" }, content: [{ type: "paragraph", content: [{ type: "text", text: "even screen" }] }] },
      { type: "callout", attrs: { kind: "fails" }, content: [{ type: "paragraph", content: [{ type: "text", text: "motion blur" }] }] },
      { type: "callout", attrs: { kind: "caution" }, content: [{ type: "paragraph", content: [{ type: "text", text: "keep grain" }] }] },
      { type: "still", attrs: { stillId: STILL_ID, alt: "Marker on green screen", caption: "Before" } },
    ],
  };
}
