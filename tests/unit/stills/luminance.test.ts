import { describe, expect, it } from "vitest";
import { applyColourMatrix, BT709_LUMA, channelViewMatrix, luminance } from "@/lib/stills/luminance";

// Source: ITU-R BT.709-6 (06/2015), Part 2, item 3.2 "Derivation of luminance signal":
// E'Y = 0.2126 E'R + 0.7152 E'G + 0.0722 E'B.
describe("BT.709 luminance weights", () => {
  it("are the weights of ITU-R BT.709-6 item 3.2", () => {
    expect(BT709_LUMA).toEqual({ r: 0.2126, g: 0.7152, b: 0.0722 });
  });

  it("sum to 1, so white stays white (BT.709-6 item 3.2: E'Y = 1 for E'R = E'G = E'B = 1)", () => {
    expect(BT709_LUMA.r + BT709_LUMA.g + BT709_LUMA.b).toBeCloseTo(1, 12);
    expect(luminance(1, 1, 1)).toBeCloseTo(1, 12);
  });

  it("a pure primary gives its own weight (BT.709-6 item 3.2)", () => {
    expect(luminance(0, 1, 0)).toBeCloseTo(0.7152, 12);
    expect(luminance(1, 0, 0)).toBeCloseTo(0.2126, 12);
    expect(luminance(0, 0, 1)).toBeCloseTo(0.0722, 12);
  });
});

describe("channel view matrices (SVG feColorMatrix, W3C Filter Effects 1 §9.6: 4×5 row-major)", () => {
  it("luminance view turns pure green into grey 0.7152 and keeps alpha", () => {
    const out = applyColourMatrix(channelViewMatrix("luma"), [0, 1, 0, 0.5]);
    expect(out[0]).toBeCloseTo(0.7152, 12);
    expect(out[1]).toBeCloseTo(0.7152, 12);
    expect(out[2]).toBeCloseTo(0.7152, 12);
    expect(out[3]).toBe(0.5);
  });

  it("single-channel views show that channel as grey and drop the others", () => {
    const px = [0.1, 0.6, 0.3, 1] as const;
    expect(applyColourMatrix(channelViewMatrix("r"), px)).toEqual([0.1, 0.1, 0.1, 1]);
    expect(applyColourMatrix(channelViewMatrix("g"), px)).toEqual([0.6, 0.6, 0.6, 1]);
    expect(applyColourMatrix(channelViewMatrix("b"), px)).toEqual([0.3, 0.3, 0.3, 1]);
  });

  it("the RGB view is the identity (Filter Effects 1: the identity matrix leaves the image unchanged)", () => {
    expect(applyColourMatrix(channelViewMatrix("rgb"), [0.1, 0.6, 0.3, 0.8])).toEqual([0.1, 0.6, 0.3, 0.8]);
  });
});
