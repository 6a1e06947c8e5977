import { expect, test } from "vitest";

import { documentToPlainText } from "@/lib/techniques/plain-text";

import { everyNodeDocument, STILL_ID } from "./fixtures";

/* Plain text for search and diffs: our own format (blocks split by a blank line, list items and
   table rows by a newline, cells by a tab). */

test("every node type", () => {
  expect(documentToPlainText(everyNodeDocument())).toBe(
    [
      "Recognise it",
      "Steps",
      "Detail",
      "Sample the marker and screen colours, set gain\nsee the guide",
      "- green markers\n- blue markers",
      "3. pick samples\n4. solve the row",
      "out = clean * matte",
      "Check the edges.",
      "---",
      "Step\tValue\nerode 2",
      "Works when:\neven screen",
      "Fails when:\nmotion blur",
      "Caution:\nkeep grain",
      "[still: Before — Marker on green screen]",
    ].join("\n\n"),
  );
});

test("nested list items are indented under their marker", () => {
  expect(
    documentToPlainText({
      type: "doc",
      content: [
        {
          type: "bulletList",
          content: [
            {
              type: "listItem",
              content: [
                { type: "paragraph", content: [{ type: "text", text: "outer" }] },
                { type: "orderedList", content: [{ type: "listItem", content: [{ type: "paragraph", content: [{ type: "text", text: "inner" }] }] }] },
              ],
            },
          ],
        },
      ],
    }),
  ).toBe("- outer\n  1. inner");
});

test("unknown nodes are skipped, empty blocks leave no gaps", () => {
  expect(
    documentToPlainText({
      type: "doc",
      content: [
        { type: "paragraph" },
        { type: "script", content: [{ type: "text", text: "alert(1)" }] },
        { type: "paragraph", content: [{ type: "text", text: "kept" }] },
        { type: "still", attrs: { stillId: STILL_ID, alt: "", caption: "" } },
      ],
    }),
  ).toBe("kept\n\n[still]");
  expect(documentToPlainText(null)).toBe("");
});
