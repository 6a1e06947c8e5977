import { describe, expect, it } from "vitest";
import { channelLabels, pixelAt, pointOf, valuesFromRgba } from "@/lib/stills/probe";

describe("pixel probe helpers", () => {
  it("maps a relative position to the pixel it falls in, clamped to the image", () => {
    // A 4-wide image: [0, 0.25) is pixel 0, [0.75, 1) is pixel 3 (common practice, no published source).
    expect(pixelAt({ u: 0, v: 0 }, 4, 2)).toEqual({ x: 0, y: 0 });
    expect(pixelAt({ u: 0.2499, v: 0.5 }, 4, 2)).toEqual({ x: 0, y: 1 });
    expect(pixelAt({ u: 0.25, v: 0.49 }, 4, 2)).toEqual({ x: 1, y: 0 });
    expect(pixelAt({ u: 1, v: 1 }, 4, 2)).toEqual({ x: 3, y: 1 });
    expect(pixelAt({ u: -0.1, v: 2 }, 4, 2)).toEqual({ x: 0, y: 1 });
  });

  it("typed coordinates round-trip through the pixel centre", () => {
    for (const [x, y] of [
      [0, 0],
      [3, 1],
      [2, 0],
    ] as const) {
      expect(pixelAt(pointOf(x, y, 4, 2), 4, 2)).toEqual({ x, y });
    }
  });

  it("keeps only the still's own channels from canvas RGBA (HTML canvas ImageData is RGBA order)", () => {
    const rgba = [10, 20, 30, 40, 50, 60, 70, 80];
    expect(valuesFromRgba(rgba, 4, 1)).toEqual([50]);
    expect(valuesFromRgba(rgba, 4, 2)).toEqual([50, 80]);
    expect(valuesFromRgba(rgba, 4, 3)).toEqual([50, 60, 70]);
    expect(valuesFromRgba(rgba, 0, 4)).toEqual([10, 20, 30, 40]);
    expect(channelLabels(2)).toEqual(["Grey", "A"]);
  });
});
