import { describe, expect, test } from "vitest";
import { renderDocument } from "@/lib/techniques/render";

/* Issue 13, item 8: long technique pages get in-page contents; headings carry the ids it links to. */

const heading = (level: number, text: string) => ({ type: "heading", attrs: { level }, content: [{ type: "text", text }] });

describe("outline of a technique body", () => {
  test("headings in order with ids that match the rendered elements; repeats get a number", () => {
    const { html, outline } = renderDocument({
      type: "doc",
      content: [heading(2, "Recognising the problem"), { type: "paragraph" }, heading(3, "Steps"), heading(2, "Steps"), heading(4, "Grain <b> & noise")],
    });
    expect(outline).toEqual([
      { level: 2, text: "Recognising the problem", id: "s-recognising-the-problem" },
      { level: 3, text: "Steps", id: "s-steps" },
      { level: 2, text: "Steps", id: "s-steps-2" },
      { level: 4, text: "Grain <b> & noise", id: "s-grain-b-noise" },
    ]);
    for (const h of outline) expect(html).toContain(`id="${h.id}"`);
    expect(html).toContain("Grain &lt;b&gt; &amp; noise");
  });

  test("a heading without letters still gets a safe id, an empty one is left out of the outline", () => {
    const { outline, html } = renderDocument({ type: "doc", content: [heading(2, "!!!"), { type: "heading", attrs: { level: 2 } }] });
    expect(outline).toEqual([{ level: 2, text: "!!!", id: "s-section" }]);
    expect(html).toContain('id="s-section-2"');
  });
});
