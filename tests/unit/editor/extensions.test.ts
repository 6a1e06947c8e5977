// @vitest-environment jsdom
import { Editor } from "@tiptap/react";
import { afterEach, describe, expect, test } from "vitest";

import { createEditorExtensions } from "@/components/editor/extensions";
import { findDocumentIssues, type TechniqueDocument } from "@/lib/techniques/document";
import { renderDocumentToHtml } from "@/lib/techniques/render";

import { everyNodeDocument, STILL_ID } from "@/tests/unit/techniques/fixtures";

/* The editor's extensions write only what the document schema accepts, and read back the
   renderer's HTML (pasting a rendered page into the editor keeps its structure). */

let editor: Editor | null = null;
afterEach(() => editor?.destroy());

function makeEditor(content: TechniqueDocument | string = "<p></p>"): Editor {
  editor = new Editor({ element: document.createElement("div"), extensions: createEditorExtensions(), content });
  return editor;
}

const json = (e: Editor) => e.getJSON() as TechniqueDocument;

describe("editor output fits the schema", () => {
  test("every node the toolbar can make", () => {
    const e = makeEditor("<p>Sample the marker</p>");
    e.chain().setTextSelection({ from: 1, to: 7 }).toggleBold().toggleItalic().run();
    e.chain().setTextSelection({ from: 8, to: 11 }).setLink({ href: "https://example.org/guide" }).run();
    e.chain().setTextSelection(3).toggleCallout("works").run();
    e.chain().focus("end").insertContent("<h2>a</h2><h3>b</h3><h4>c</h4><ul><li><p>d</p></li></ul><ol start='2'><li><p>e</p></li></ol><blockquote><p>f</p></blockquote><pre><code class='language-glsl'>g</code></pre><hr><p>h<br>i <code>j</code></p>").run();
    // prosemirror-tables commands read the editor state, so each runs on its own.
    e.chain().focus("end").insertTable({ rows: 2, cols: 2, withHeaderRow: true }).run();
    expect(e.commands.addColumnAfter()).toBe(true);
    expect(e.commands.addRowAfter()).toBe(true);
    e.chain().focus("end").insertStill({ stillId: STILL_ID, alt: "marker", caption: "before" }).run();
    const doc = json(e);
    expect(findDocumentIssues(doc)).toEqual([]);
    const types = new Set<string>();
    const walk = (n: { type: string; content?: unknown[]; marks?: { type: string }[] }) => {
      types.add(n.type);
      n.marks?.forEach((m) => types.add(`mark:${m.type}`));
      (n.content as (typeof n)[] | undefined)?.forEach(walk);
    };
    walk(doc);
    for (const t of ["callout", "heading", "bulletList", "orderedList", "listItem", "blockquote", "codeBlock", "horizontalRule", "hardBreak", "table", "tableRow", "tableHeader", "tableCell", "still", "mark:bold", "mark:italic", "mark:link", "mark:code"]) {
      expect(types, t).toContain(t);
    }
  });

  test("our fixture loads unchanged, and its rendered HTML parses back to the same JSON", () => {
    const e = makeEditor(everyNodeDocument());
    expect(json(e)).toEqual(everyNodeDocument());
    // After an edit the editor keeps an empty paragraph after a final still (Tiptap's trailing
    // node) so the cursor can get past it.
    const expected = { ...everyNodeDocument(), content: [...everyNodeDocument().content, { type: "paragraph" }] };
    e.commands.setContent(renderDocumentToHtml(everyNodeDocument()));
    expect(json(e)).toEqual(expected);
  });

  test("a line break typed inside bold text keeps a valid document", () => {
    const e = makeEditor("<p><strong>erode two</strong></p>");
    e.chain().setTextSelection(7).setHardBreak().insertContent("by ").run();
    const doc = json(e);
    expect(findDocumentIssues(doc)).toEqual([]);
    const html = renderDocumentToHtml(doc);
    expect(html).toContain("<br>");
    expect(html.replace(/<[^>]+>/g, "")).toBe("erode by two");
  });

  test("pasted HTML loses what we do not allow", () => {
    const e = makeEditor(
      '<h1 onclick="x">Title</h1><p style="color:red"><a href="javascript:alert(1)" target="_blank">bad</a> <a href="https://ok.test/" class="x">ok</a> <s>strike</s></p>' +
        '<img src="https://evil.example/x.png"><pre><code class="language-a&quot;b">c</code></pre><h5>five</h5>',
    );
    const doc = json(e);
    expect(findDocumentIssues(doc)).toEqual([]);
    expect(renderDocumentToHtml(doc)).toBe(
      // h1 and h5 are not ours (the page title is the h1): they arrive as paragraphs.
      '<p>Title</p><p>bad <a href="https://ok.test/" rel="noopener noreferrer nofollow">ok</a> strike</p><pre><code>c</code></pre><p>five</p>',
    );
  });
});

describe("callout commands", () => {
  test("toggle wraps, switches kind, and lifts out", () => {
    const e = makeEditor("<p>keep grain</p>");
    e.chain().setTextSelection(2).toggleCallout("fails").run();
    expect(json(e).content[0]).toMatchObject({ type: "callout", attrs: { kind: "fails" } });
    e.commands.toggleCallout("caution");
    expect(json(e).content[0]).toMatchObject({ type: "callout", attrs: { kind: "caution" } });
    e.commands.toggleCallout("caution");
    expect(json(e).content[0]).toMatchObject({ type: "paragraph" });
  });
});

describe("still node", () => {
  test("refuses an id that is not a uuid", () => {
    const e = makeEditor();
    expect(e.commands.insertStill({ stillId: "../x", alt: "" })).toBe(false);
    expect(json(e)).toEqual({ type: "doc", content: [{ type: "paragraph" }] });
  });
});
