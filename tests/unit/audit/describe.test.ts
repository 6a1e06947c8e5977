import { describe, expect, test } from "vitest";
import { AUDIT_ACTIONS, describeAuditEntry, sentenceText, type AuditNames } from "@/lib/audit/describe";

/* Issue 13, item 8: the audit log reads as sentences with names and links, not codes and JSON. */

const lead: AuditNames = { actor: { name: "Ines Varrow" } };
const technique = { title: "Marker channel cleanup", slug: "marker-channel-cleanup" };

describe("audit sentences", () => {
  test("an approval names the lead, the revision and links the technique", () => {
    const parts = describeAuditEntry({ action: "technique.approve", detail: { revision: 3 } }, { ...lead, technique });
    expect(sentenceText(parts)).toBe("Ines Varrow approved revision 3 of Marker channel cleanup.");
    expect(parts).toContainEqual({ text: "Marker channel cleanup", href: "/techniques/marker-channel-cleanup" });
  });

  test("a department method change names both methods with links", () => {
    const parts = describeAuditEntry(
      {
        action: "tag.house-method.set",
        detail: { tag: "Dust and scratches", technique: "grain-restore-after-denoise", title: "Grain restore after denoise", replaced: { slug: "dust-busting", title: "Dust busting" } },
      },
      { ...lead, tag: { name: "Dust and scratches", slug: "dust-and-scratches", kind: "problem" } },
    );
    expect(sentenceText(parts)).toBe("Ines Varrow made Grain restore after denoise the department method for Dust and scratches, in place of Dust busting.");
    expect(parts).toContainEqual({ text: "Dust busting", href: "/techniques/dust-busting" });
    expect(parts).toContainEqual({ text: "Dust and scratches", href: "/problems/dust-and-scratches" });
  });

  test("send-back quotes the note; an import counts rows in words; a role change says from and to", () => {
    expect(sentenceText(describeAuditEntry({ action: "technique.return", detail: { revision: 2, note: "Crop the still." } }, { ...lead, technique }))).toBe(
      "Ines Varrow sent revision 2 of Marker channel cleanup back: “Crop the still.”",
    );
    const show = { code: "SLM", name: "Saltmarsh" };
    expect(sentenceText(describeAuditEntry({ action: "shots.import", detail: { created: 1, updated: 0, unchanged: 4, errors: 1 } }, { ...lead, show }))).toBe(
      "Ines Varrow imported a shot list into SLM · Saltmarsh: 1 shot added, 0 updated, 1 row left out with problems.",
    );
    const admin: AuditNames = { actor: { name: "Rob Tillard" }, person: { name: "Tamsin Orrey" } };
    expect(sentenceText(describeAuditEntry({ action: "person.update", detail: { from: { role: "artist", disabled: false }, to: { role: "senior", disabled: false } } }, admin))).toBe(
      "Rob Tillard changed Tamsin Orrey: role artist → senior.",
    );
  });

  test("what is gone or unknown still reads as a sentence, never as a raw id or JSON", () => {
    const gone = sentenceText(describeAuditEntry({ action: "technique.approve", detail: { revision: 1 } }, { actor: null }));
    expect(gone).toBe("The system approved revision 1 of a removed technique.");
    for (const action of Object.keys(AUDIT_ACTIONS)) {
      const text = sentenceText(describeAuditEntry({ action, detail: { techniqueId: "0b0c4d2e-1111-4111-8111-111111111111", revision: 1 } }, lead));
      expect(text, action).toMatch(/^Ines Varrow [a-z].*[.”)]$/);
      expect(text, action).not.toMatch(/[{}]|[0-9a-f]{8}-[0-9a-f]{4}/);
      expect(text, action).not.toContain(action);
    }
  });
});
