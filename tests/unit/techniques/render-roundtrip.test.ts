import { describe, expect, test } from "vitest";

import { renderDocumentToHtml } from "@/lib/techniques/render";

import { everyNodeDocument, expectInert, STILL_ID } from "./fixtures";

/* JSON → HTML for every supported node: the elements the brief (issue 3) asks for, read back
   through jsdom's HTML parser. */

describe("every supported node renders to its element", () => {
  const html = renderDocumentToHtml(everyNodeDocument());
  const doc = expectInert(html);
  const q = (s: string) => doc.querySelector(s);

  test("headings 2–4", () => {
    expect([...doc.querySelectorAll("h2, h3, h4")].map((h) => `${h.tagName}:${h.textContent}`)).toEqual([
      "H2:Recognise it",
      "H3:Steps",
      "H4:Detail",
    ]);
    expect(doc.querySelector("h1, h5, h6")).toBeNull();
  });

  test("marks and line break", () => {
    expect(q("p strong")?.textContent).toBe("marker");
    expect(q("p em")?.textContent).toBe("screen");
    expect(q("p > code")?.textContent).toBe("gain");
    expect(q("p br")).not.toBeNull();
    const a = q("p a");
    expect(a?.getAttribute("href")).toBe("/techniques/marker-removal");
    expect(a?.getAttribute("rel")).toBe("noopener noreferrer nofollow");
    expect(a?.textContent).toBe("see the guide");
  });

  test("lists", () => {
    expect([...doc.querySelectorAll("ul > li")].map((li) => li.textContent)).toEqual(["green markers", "blue markers"]);
    expect(q("ol")?.getAttribute("start")).toBe("3");
    expect([...doc.querySelectorAll("ol > li > p")].map((p) => p.textContent)).toEqual(["pick samples", "solve the row"]);
  });

  test("code block, quote, rule", () => {
    expect(q("pre > code.language-python")?.textContent).toBe("out = clean * matte");
    expect(q("blockquote > p")?.textContent).toBe("Check the edges.");
    expect(q("hr")).not.toBeNull();
  });

  test("table with header cells and a span", () => {
    expect(q(".table-scroll > table > tbody")).not.toBeNull();
    expect([...doc.querySelectorAll("tr:first-child > th")].map((th) => th.textContent)).toEqual(["Step", "Value"]);
    const td = q("tr:nth-child(2) > td");
    expect(td?.getAttribute("colspan")).toBe("2");
    expect(td?.hasAttribute("rowspan")).toBe(false);
  });

  test("callouts with their labels", () => {
    const asides = [...doc.querySelectorAll("aside.callout")];
    expect(asides.map((a) => [a.className, a.getAttribute("role"), a.querySelector("p.callout-label")?.textContent])).toEqual([
      ["callout callout-works", "note", "Works when"],
      ["callout callout-fails", "note", "Fails when"],
      ["callout callout-caution", "note", "Caution"],
    ]);
    expect(asides[0]?.querySelector("p:not(.callout-label)")?.textContent).toBe("even screen");
  });

  test("still from our own store", () => {
    const img = q("figure.still > img");
    expect(img?.getAttribute("src")).toBe(`/api/stills/${STILL_ID}/preview`);
    expect(img?.getAttribute("alt")).toBe("Marker on green screen");
    expect(img?.getAttribute("loading")).toBe("lazy");
    expect(q("figure.still > figcaption")?.textContent).toBe("Before");
  });

  test("exact markup of a small document", () => {
    expect(
      renderDocumentToHtml({
        type: "doc",
        content: [
          {
            type: "paragraph",
            content: [
              { type: "text", text: "a ", marks: [{ type: "link", attrs: { href: "/x" } }] },
              { type: "text", text: "b", marks: [{ type: "link", attrs: { href: "/x" } }, { type: "bold" }] },
              { type: "text", text: " & c" },
            ],
          },
          { type: "still", attrs: { stillId: STILL_ID, alt: "", caption: "" } },
        ],
      }),
    ).toBe(
      '<p><a href="/x" rel="noopener noreferrer nofollow">a <strong>b</strong></a> &amp; c</p>' +
        `<figure class="still"><img src="/api/stills/${STILL_ID}/preview" alt="" loading="lazy"></figure>`,
    );
  });
});
