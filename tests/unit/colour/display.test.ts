import { describe, expect, it } from "vitest";
import { displayCodes, displayQuery, RANGE_COLOURS } from "@/lib/colour/display";
import { conversionMatrix } from "@/lib/colour/spaces";

/*
 * The display transform: exposure, linear → sRGB encode (IEC 61966-2-1:1999 §5.2: V = 12.92 L
 * for L ≤ 0.0031308, else 1.055 L^(1/2.4) − 0.055), clipping only here, the range view.
 * Check values from shared/REFERENCES.md: linear 0.18 → encoded 0.461356 → code round(117.65) = 118.
 */

const rgb = (...v: number[]) => Float32Array.from(v);

describe("display transform", () => {
  it("sRGB encode of linear Rec.709: 0.18 → code 118, 0 → 0, 1 → 255, 0.0031308 → round(0.04045 × 255) = 10", () => {
    expect(Array.from(displayCodes(rgb(0.18, 0, 1), 3, 1, "lin-rec709", { exposure: 0, view: "image" }))).toEqual([118, 0, 255]);
    expect(displayCodes(rgb(0.0031308, 0.0031308, 0.0031308), 3, 1, "lin-rec709", { exposure: 0, view: "image" })[0]).toBe(10);
  });

  it("exposure in stops scales linear light by 2^stops before encoding: 0.09 at +1 shows as 0.18", () => {
    expect(Array.from(displayCodes(rgb(0.09, 0.09, 0.09), 3, 1, "lin-rec709", { exposure: 1, view: "image" }))).toEqual([118, 118, 118]);
    expect(Array.from(displayCodes(rgb(0.72, 0.72, 0.72), 3, 1, "lin-rec709", { exposure: -2, view: "image" }))).toEqual([118, 118, 118]);
  });

  it("values above 1 and below 0 clip in the picture only", () => {
    const src = rgb(7.5, -0.25, 1);
    expect(Array.from(displayCodes(src, 3, 1, "lin-rec709", { exposure: 0, view: "image" }))).toEqual([255, 0, 255]);
    expect(Array.from(src)).toEqual([7.5, -0.25, 1]);
  });

  it("ACEScg is converted to Rec.709 before encoding: its white stays white, its pure green is out of Rec.709 gamut", () => {
    expect(Array.from(displayCodes(rgb(0.18, 0.18, 0.18), 3, 1, "acescg", { exposure: 0, view: "image" }))).toEqual([118, 118, 118]);
    const m = conversionMatrix("acescg", "lin-rec709");
    // AP1 green in Rec.709 has a negative red (the AP1 gamut is wider): it clips to 0.
    expect(m[0][1]).toBeLessThan(0);
    expect(displayCodes(rgb(0, 0.5, 0), 3, 1, "acescg", { exposure: 0, view: "image" })[0]).toBe(0);
  });

  it("data stills show stored values without a transfer function", () => {
    expect(Array.from(displayCodes(rgb(0.5, 0.25, 1), 3, 1, "data", { exposure: 0, view: "image" }))).toEqual([128, 64, 255]);
  });

  it("range view: flat colours where a channel is above 1 or below 0 after exposure, muted grey elsewhere", () => {
    const src = rgb(1.5, 0.2, 0.2, 0.2, -0.01, 0.2, 2, -1, 0.5, 0.4, 0.4, 0.4);
    const out = displayCodes(src, 3, 4, "lin-rec709", { exposure: 0, view: "range" });
    expect(Array.from(out.subarray(0, 3))).toEqual([...RANGE_COLOURS.above]);
    expect(Array.from(out.subarray(3, 6))).toEqual([...RANGE_COLOURS.below]);
    expect(Array.from(out.subarray(6, 9))).toEqual([...RANGE_COLOURS.both]);
    expect(out[9]).toBe(out[10]);
    // At −1 stop the 1.5 is 0.75: in range.
    expect(Array.from(displayCodes(rgb(1.5, 0.2, 0.2), 3, 1, "lin-rec709", { exposure: -1, view: "range" })).every((v, _, a) => v === a[0])).toBe(true);
  });

  it("grey stills and alpha: one channel repeats, the fourth is not shown", () => {
    expect(Array.from(displayCodes(rgb(0.18, 0.5), 2, 1, "lin-rec709", { exposure: 0, view: "image" }))).toEqual([118, 118, 118]);
    expect(Array.from(displayCodes(rgb(0.18, 0.18, 0.18, 0), 4, 1, "lin-rec709", { exposure: 0, view: "image" }))).toEqual([118, 118, 118]);
  });

  it("query strings name only what differs from the default", () => {
    expect(displayQuery({ exposure: 0, view: "image" })).toBe("");
    expect(displayQuery({ exposure: -1.5, view: "range" })).toBe("?exposure=-1.5&view=range");
  });
});
