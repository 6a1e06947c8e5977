// @vitest-environment jsdom
import { describe, expect, it } from "vitest";
import { cleanSubject, digestMail, escapeHtml, inviteMail, renderMail, revisionApprovedMail, safeHref, type MailContent } from "@/lib/mail/templates";

/** The text a reader sees in the HTML part, as a browser DOM (jsdom) parses it, not as our code builds it. */
function visibleText(html: string): string {
  const doc = new DOMParser().parseFromString(html, "text/html");
  return doc.body.textContent ?? "";
}

const hostile = `Erode 2 px <script>alert("x")</script> & keep the 'grain'`;

describe("mail templates", () => {
  it("escapes the five HTML-special characters (OWASP XSS Prevention Cheat Sheet, rule 1, from memory)", () => {
    expect(escapeHtml(`&<>"'`)).toBe("&amp;&lt;&gt;&quot;&#39;");
  });

  it("person-written text shows literally in the HTML part and never becomes markup", () => {
    const mail = renderMail({ subject: "s", heading: hostile, blocks: [{ type: "quote", text: hostile }, { type: "paragraph", text: hostile }] });
    const doc = new DOMParser().parseFromString(mail.html, "text/html");
    expect(doc.querySelectorAll("script")).toHaveLength(0);
    expect(visibleText(mail.html).split(hostile)).toHaveLength(4);
    expect(mail.text.split(hostile).length).toBeGreaterThanOrEqual(3);
  });

  it("the HTML and text parts carry the same words and links (one template source)", () => {
    const content = revisionApprovedMail({
      name: "Jun",
      technique: { slug: "clean-plate-patch", title: "Clean-plate patch" },
      revisionNumber: 4,
      changeNote: "Track the patch before regraining.\nUse the denoised plate for the key.",
      techniqueUrl: "https://plateroom.kestrel.test/techniques/clean-plate-patch",
      diffUrl: "https://plateroom.kestrel.test/techniques/clean-plate-patch/history?from=3&to=4",
      reason: "You get this because you follow the technique.",
      unsubscribeUrl: "https://plateroom.kestrel.test/api/unsubscribe?token=abc.def",
    });
    const mail = renderMail(content);
    const seen = visibleText(mail.html);
    for (const phrase of ["Hello Jun,", "Revision 4", "Track the patch before regraining.", "Use the denoised plate for the key.", "You get this because you follow the technique."]) {
      expect(seen).toContain(phrase);
      expect(mail.text).toContain(phrase);
    }
    const doc = new DOMParser().parseFromString(mail.html, "text/html");
    const hrefs = [...doc.querySelectorAll("a")].map((a) => a.getAttribute("href"));
    expect(hrefs).toEqual([
      "https://plateroom.kestrel.test/techniques/clean-plate-patch",
      "https://plateroom.kestrel.test/techniques/clean-plate-patch/history?from=3&to=4",
      "https://plateroom.kestrel.test/api/unsubscribe?token=abc.def",
    ]);
    for (const href of hrefs) expect(mail.text).toContain(href!);
  });

  it("drops non-http links (javascript:, data:) from href", () => {
    expect(safeHref("javascript:alert(1)")).toBe("#");
    expect(safeHref("data:text/html,hi")).toBe("#");
    expect(safeHref("https://plateroom.kestrel.test/x")).toBe("https://plateroom.kestrel.test/x");
    const mail = renderMail({ subject: "s", heading: "h", blocks: [{ type: "button", label: "Go", href: "javascript:alert(1)" }] });
    expect(mail.html).not.toContain("javascript:");
  });

  it("a subject is one line, so a title cannot add header lines (RFC 5322 §2.2, header fields are single logical lines, from memory)", () => {
    expect(cleanSubject("Patch\r\nBcc: someone@example.com")).toBe("Patch Bcc: someone@example.com");
    const mail = renderMail({ subject: "a\nb", heading: "h", blocks: [] });
    expect(mail.subject).not.toMatch(/[\r\n]/);
  });

  it("account mail has no unsubscribe link; a digest groups entries by kind and counts them", () => {
    expect(renderMail(inviteMail({ name: "Mo", link: "https://plateroom.kestrel.test/set-password?token=t" })).text).not.toMatch(/unsubscribe/i);
    const at = new Date(2031, 0, 1);
    const content: MailContent = digestMail({
      name: "Mo",
      day: "Wednesday 1 January 2031",
      settingsUrl: "https://plateroom.kestrel.test/settings",
      entries: [
        { kind: "revision-approved", title: "A: revision 2 approved", summary: "", link: "https://plateroom.kestrel.test/techniques/a", createdAt: at },
        { kind: "technique-retired", title: "B retired", summary: "", link: "https://plateroom.kestrel.test/techniques/b", createdAt: at },
        { kind: "revision-approved", title: "C: revision 7 approved", summary: "", link: "https://plateroom.kestrel.test/techniques/c", createdAt: at },
      ],
    });
    expect(content.subject).toContain("3 changes");
    const itemBlocks = content.blocks.filter((b) => b.type === "items");
    expect(itemBlocks.map((b) => (b.type === "items" ? b.items.map((i) => i.title) : []))).toEqual([
      ["A: revision 2 approved", "C: revision 7 approved"],
      ["B retired"],
    ]);
  });
});
