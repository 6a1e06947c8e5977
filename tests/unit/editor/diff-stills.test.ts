import { describe, expect, test } from "vitest";

import { diffPairs, STILL_TOKEN, STILL_TOKEN_BASE, wordDiff } from "@/lib/techniques/diff";
import { documentToPlainText } from "@/lib/techniques/plain-text";

/* Issue 13, item 6: stills in a diffed body are single tokens (shown as thumbnails), and pair
   changes between revisions are listed. */

const A = "11111111-1111-4111-8111-111111111111";
const B = "22222222-2222-4222-8222-222222222222";
const C = "33333333-3333-4333-8333-333333333333";
const still = (stillId: string, alt: string, caption = "") => ({ type: "still", attrs: { stillId, alt, caption } });
const para = (text: string) => ({ type: "paragraph", content: [{ type: "text", text }] });
const doc = (...content: unknown[]) => ({ type: "doc", content });

describe("stills in the diffed body", () => {
  const tokenFor = new Map<string, string>();
  const token = ({ stillId, caption }: { stillId: string; caption: string }) => {
    if (!tokenFor.has(stillId)) tokenFor.set(stillId, String.fromCodePoint(STILL_TOKEN_BASE + tokenFor.size));
    return caption ? `${tokenFor.get(stillId)} ${caption}` : tokenFor.get(stillId)!;
  };

  test("search text keeps the words; the diff text has one token per still", () => {
    const body = doc(para("Sample the marker."), still(A, "Green screen with crosses", "Before the matrix"));
    expect(documentToPlainText(body)).toBe("Sample the marker.\n\n[still: Before the matrix — Green screen with crosses]");
    const text = documentToPlainText(body, { still: token });
    expect(text).toBe(`Sample the marker.\n\n${tokenFor.get(A)} Before the matrix`);
    expect(STILL_TOKEN.test(text)).toBe(true);
  });

  test("a swapped still is one removed and one added token, never a partial id", () => {
    const before = documentToPlainText(doc(para("Look:"), still(A, "a")), { still: token });
    const after = documentToPlainText(doc(para("Look:"), still(B, "b")), { still: token });
    const segments = wordDiff(before, after);
    expect(segments.filter((s) => s.kind === "removed").map((s) => s.text)).toEqual([tokenFor.get(A)]);
    expect(segments.filter((s) => s.kind === "added").map((s) => s.text)).toEqual([tokenFor.get(B)]);
  });
});

describe("diffPairs", () => {
  const s = (id: string) => ({ id, alt: `still ${id.slice(0, 1)}` });
  test("added, removed and re-captioned pairs; a pair is the same pair when it shows the same two stills", () => {
    const older = [
      { before: s(A), after: s(B), caption: "Marker gone" },
      { before: s(B), after: s(C), caption: "" },
    ];
    const newer = [
      { before: s(A), after: s(B), caption: "Marker gone, regrained" },
      { before: s(A), after: s(C), caption: "Wider shot" },
    ];
    expect(diffPairs(older, newer)).toEqual([
      { change: "captioned", before: s(A), after: s(B), caption: "Marker gone, regrained", previousCaption: "Marker gone" },
      { change: "added", before: s(A), after: s(C), caption: "Wider shot" },
      { change: "removed", before: s(B), after: s(C), caption: "" },
    ]);
    expect(diffPairs(newer, newer)).toEqual([]);
    // Swapping before and after is a different pair.
    expect(diffPairs([{ before: s(A), after: s(B), caption: "" }], [{ before: s(B), after: s(A), caption: "" }]).map((c) => c.change)).toEqual(["added", "removed"]);
  });
});
