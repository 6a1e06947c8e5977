import fc from "fast-check";
import { describe, expect, test } from "vitest";

import { DOCUMENT_LIMITS, type TechniqueDocument } from "@/lib/techniques/document";
import { renderDocumentToHtml } from "@/lib/techniques/render";

import { asParsedAttribute, asParsedText, expectInert, linkDoc, paragraph, STILL_ID } from "./fixtures";

/*
 * The renderer against hostile documents. Vectors follow the OWASP XSS Filter Evasion Cheat
 * Sheet (case variation, embedded tab/newline, leading NUL and spaces, data: and vbscript: URLs,
 * event-handler attributes) — from memory of that sheet. Safety is judged on the parsed DOM
 * (jsdom's WHATWG HTML parser), not on the string, as OWASP's XSS Prevention Cheat Sheet asks for
 * output encoding per context (element content vs. quoted attribute vs. URL).
 */

const cast = (v: unknown) => v as TechniqueDocument;

describe("text that looks like markup stays text", () => {
  const samples = [
    "<script>alert(1)</script>",
    '<img src=x onerror="alert(1)">',
    "\"'><svg onload=alert(1)>",
    "</p><iframe src=javascript:alert(1)></iframe>",
    "&lt;script&gt; is not decoded twice",
    "<!-- comment --> <![CDATA[ x ]]>",
    "a\u0000b\r\nc",
  ];
  test.each(samples)("%j", (text) => {
    const html = renderDocumentToHtml(paragraph(text));
    const doc = expectInert(html);
    expect(doc.body.querySelectorAll("*").length).toBe(1); // only the <p>
    expect(doc.body.textContent).toBe(asParsedText(text));
  });

  test("in every text-bearing place: headings, code, captions, alt text, table cells", () => {
    const evil = '<script>alert("x")</script>';
    const html = renderDocumentToHtml(
      cast({
        type: "doc",
        content: [
          { type: "heading", attrs: { level: 3 }, content: [{ type: "text", text: evil }] },
          { type: "codeBlock", attrs: { language: "js" }, content: [{ type: "text", text: evil }] },
          { type: "still", attrs: { stillId: STILL_ID, alt: `" onerror="alert(1)`, caption: evil } },
          {
            type: "table",
            content: [{ type: "tableRow", content: [{ type: "tableCell", content: [{ type: "paragraph", content: [{ type: "text", text: evil }] }] }] }],
          },
        ],
      }),
    );
    const doc = expectInert(html);
    expect(doc.querySelector("h3")?.textContent).toBe(evil);
    expect(doc.querySelector("pre code")?.textContent).toBe(evil);
    expect(doc.querySelector("img")?.getAttribute("alt")).toBe(`" onerror="alert(1)`);
    expect(doc.querySelector("figcaption")?.textContent).toBe(evil);
    expect(doc.querySelector("td")?.textContent).toBe(evil);
  });
});

describe("links", () => {
  const scriptCapable = [
    "javascript:alert(1)",
    "JaVaScRiPt:alert(1)",
    "\u0000javascript:alert(1)",
    "  javascript:alert(1)",
    "java\tscript:alert(1)",
    "java\nscript:alert(1)",
    "\u0001\u001fjavascript:alert(1)",
    "javascript\u200b:alert(1)",
    "data:text/html;base64,PHNjcmlwdD5hbGVydCgxKTwvc2NyaXB0Pg==",
    "DATA:text/html,<script>alert(1)</script>",
    "vbscript:msgbox(1)",
    "//evil.example/x",
    "/\\evil.example/x",
    "\\\\evil.example/x",
    "/\t/evil.example/x",
  ];
  test.each(scriptCapable)("%j renders as plain text, no <a>", (href) => {
    const doc = expectInert(renderDocumentToHtml(linkDoc(href, "click me")));
    expect(doc.querySelector("a")).toBeNull();
    expect(doc.body.textContent).toBe("click me");
  });

  test("an entity-looking scheme is written encoded, so the browser sees a relative path", () => {
    const doc = expectInert(renderDocumentToHtml(linkDoc("javascript&colon;alert(1)")));
    const a = doc.querySelector("a");
    expect(a?.getAttribute("href")).toBe("javascript&colon;alert(1)");
    expect(a?.protocol).toBe("https:");
  });

  test.each(["https://example.org/a?b=1&c=2", "http://example.org", "mailto:paint@kestrel.test", "/techniques/wire-removal#steps", "#top"])(
    "%j is kept, with rel=noopener noreferrer nofollow",
    (href) => {
      const doc = expectInert(renderDocumentToHtml(linkDoc(href)));
      expect(doc.querySelector("a")?.getAttribute("href")).toBe(href);
    },
  );

  test("attributes beside href (target, onclick) are not copied", () => {
    const html = renderDocumentToHtml(
      cast({
        type: "doc",
        content: [
          {
            type: "paragraph",
            content: [{ type: "text", text: "x", marks: [{ type: "link", attrs: { href: "https://example.org", onclick: "alert(1)", target: "_top" } }] }],
          },
        ],
      }),
    );
    const a = expectInert(html).querySelector("a");
    expect(a?.getAttributeNames().sort()).toEqual(["href", "rel"]);
  });
});

describe("unknown nodes and attributes are dropped", () => {
  test("event handlers and styles on known nodes", () => {
    const html = renderDocumentToHtml(
      cast({
        type: "doc",
        content: [
          { type: "paragraph", attrs: { onclick: "alert(1)", style: "position:fixed", class: "x" }, content: [{ type: "text", text: "p" }] },
          { type: "heading", attrs: { level: '1 onclick="alert(1)"' }, content: [{ type: "text", text: "h" }] },
          { type: "codeBlock", attrs: { language: 'js" onmouseover="alert(1)' }, content: [{ type: "text", text: "c" }] },
          { type: "callout", attrs: { kind: 'works" onclick="alert(1)' }, content: [{ type: "paragraph", content: [{ type: "text", text: "k" }] }] },
          { type: "orderedList", attrs: { start: "1 onclick=alert(1)", type: "disc" }, content: [{ type: "listItem", content: [{ type: "paragraph", content: [{ type: "text", text: "o" }] }] }] },
          { type: "still", attrs: { stillId: `${STILL_ID}" onerror="alert(1)`, alt: "a", caption: "" } },
          { type: "still", attrs: { stillId: STILL_ID, src: "https://evil.example/x.png", onerror: "alert(1)", alt: "b", caption: "" } },
        ],
      }),
    );
    const doc = expectInert(html);
    expect(doc.querySelector("p")?.attributes.length).toBe(0);
    expect(doc.querySelector("h2")?.textContent).toBe("h"); // invalid level falls back to h2
    expect(doc.querySelector("code")?.hasAttribute("class")).toBe(false);
    expect(doc.querySelector("aside")).toBeNull(); // unknown kind: content kept, box dropped
    expect(doc.querySelector("ol")?.attributes.length).toBe(0);
    expect([...doc.querySelectorAll("img")].map((i) => i.getAttribute("alt"))).toEqual(["b"]);
    expect(doc.body.textContent).toBe("phcko");
  });

  test.each(["script", "iframe", "html", "rawHtml", "image", "embed", "__proto__", "constructor"])("node type %j", (type) => {
    const html = renderDocumentToHtml(
      cast({
        type: "doc",
        content: [
          { type, attrs: { src: "javascript:alert(1)", html: "<script>alert(1)</script>" }, content: [{ type: "text", text: "alert(1)" }], text: "<b>x</b>" },
          { type: "paragraph", content: [{ type: "text", text: "after" }] },
        ],
      }),
    );
    expect(html).toBe("<p>after</p>");
  });

  test("unknown marks and inline nodes", () => {
    const html = renderDocumentToHtml(
      cast({
        type: "doc",
        content: [
          {
            type: "paragraph",
            content: [
              { type: "text", text: "a", marks: [{ type: "script" }, { type: "span", attrs: { style: "x" } }, "bold", null] },
              { type: "mention", attrs: { id: "1" } },
              { type: "text", text: 42 },
              { type: "text", text: "b" },
            ],
          },
        ],
      }),
    );
    expect(html).toBe("<p>ab</p>");
  });

  test("not a document at all", () => {
    for (const value of [null, undefined, 42, "<script>alert(1)</script>", [], { type: "paragraph" }, { type: "doc", content: "x" }]) {
      expect(renderDocumentToHtml(value)).toBe("");
    }
  });
});

describe("size and depth", () => {
  function nested(depth: number): TechniqueDocument {
    let node: Record<string, unknown> = { type: "paragraph", content: [{ type: "text", text: "deep" }] };
    for (let i = 0; i < depth; i += 1) node = { type: "blockquote", content: [node] };
    return cast({ type: "doc", content: [node] });
  }

  test("a 100 000-level nesting renders without a stack overflow and stops at the depth limit", () => {
    const html = renderDocumentToHtml(nested(100_000));
    const doc = expectInert(html);
    expect(doc.querySelectorAll("blockquote").length).toBeLessThanOrEqual(DOCUMENT_LIMITS.maxDepth);
    expect(doc.body.textContent).toBe("");
  });

  test("nesting within the limit keeps its text", () => {
    const doc = expectInert(renderDocumentToHtml(nested(10)));
    expect(doc.querySelectorAll("blockquote").length).toBe(10);
    expect(doc.body.textContent).toBe("deep");
  });

  test("more nodes than the limit: output stops at the node budget", () => {
    const content = Array.from({ length: DOCUMENT_LIMITS.maxNodes + 500 }, () => ({ type: "horizontalRule" }));
    const doc = expectInert(renderDocumentToHtml(cast({ type: "doc", content })));
    expect(doc.querySelectorAll("hr").length).toBe(DOCUMENT_LIMITS.maxNodes);
  });

  test("one very long text is encoded in full", () => {
    const text = "<b>".repeat(100_000);
    const doc = expectInert(renderDocumentToHtml(paragraph(text)));
    expect(doc.body.textContent).toBe(text);
  });
});

describe("property: any text, href, alt or caption", () => {
  const anyString = fc.string({ unit: "binary", maxLength: 60 });
  const hostileHref = fc.oneof(
    anyString,
    fc.constantFrom("javascript:", "JAVASCRIPT:", "data:", "vbscript:", "//", "/\\", "\u0000", "\t", " ", "&colon;", "https://a.test/").chain((prefix) =>
      anyString.map((rest) => prefix + rest),
    ),
  );

  test("never produce live markup, and text survives unchanged", () => {
    fc.assert(
      fc.property(anyString.filter((s) => s !== ""), hostileHref, anyString, anyString, (text, href, alt, caption) => {
        const doc = cast({
          type: "doc",
          content: [
            { type: "paragraph", content: [{ type: "text", text, marks: [{ type: "link", attrs: { href } }, { type: "bold" }] }] },
            { type: "still", attrs: { stillId: STILL_ID, alt, caption } },
          ],
        });
        const parsed = expectInert(renderDocumentToHtml(doc));
        expect(parsed.querySelector("p")?.textContent).toBe(asParsedText(text));
        expect(parsed.querySelector("img")?.getAttribute("alt")).toBe(asParsedAttribute(alt));
      }),
      { numRuns: 300 },
    );
  });
});
