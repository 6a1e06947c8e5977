import { describe, expect, it } from "vitest";
import {
  ACES_WHITE,
  BRADFORD,
  apply,
  bradford,
  conversionMatrix,
  D65,
  LINEAR_SPACES,
  mul,
  PRIMARIES,
  rgbToXyz,
  spaceOfChromaticities,
  whiteXyz,
  type Mat3,
} from "@/lib/colour/spaces";

/*
 * The colour-space matrices against the published values. Each expected matrix is copied
 * from the document named beside it; the tolerance is half a unit of the last printed digit
 * (plus float64 rounding), so a different derivation or white point would fail.
 */

function expectMatrix(actual: Mat3, expected: number[][], tolerance: number): void {
  for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) {
    const d = Math.abs(actual[i]![j]! - expected[i]![j]!);
    if (d > tolerance) throw new Error(`[${i}][${j}]: ${actual[i]![j]} vs published ${expected[i]![j]} (off by ${d})`);
  }
}

describe("normalised primary matrices (RGB → CIE XYZ)", () => {
  it("linear sRGB / Rec.709: IEC 61966-2-1:1999 §5.2 eq. (5), printed to 4 decimals", () => {
    expectMatrix(rgbToXyz(PRIMARIES["lin-rec709"]), [
      [0.4124, 0.3576, 0.1805],
      [0.2126, 0.7152, 0.0722],
      [0.0193, 0.1192, 0.9505],
    ], 5e-5);
  });

  it("Rec.709 luminance row: ITU-R BT.709-6 item 3.2 (0.2126, 0.7152, 0.0722)", () => {
    expectMatrix(rgbToXyz(PRIMARIES["lin-rec709"]).map((r, i) => (i === 1 ? r : [0, 0, 0])) as Mat3, [[0, 0, 0], [0.2126, 0.7152, 0.0722], [0, 0, 0]], 5e-5);
  });

  it("ACES2065-1 (AP0): SMPTE ST 2065-1:2012 §4.1.3 NPM, 10 decimals (from memory; identical to public copies of it)", () => {
    expectMatrix(rgbToXyz(PRIMARIES["aces2065-1"]), [
      [0.9525523959, 0.0, 0.0000936786],
      [0.3439664498, 0.7281660966, -0.0721325464],
      [0.0, 0.0, 1.0088251844],
    ], 6e-11);
  });

  it("ACEScg (AP1): Academy S-2014-004 §4.3 AP1 → XYZ, 10 decimals (from memory; identical to public copies of it)", () => {
    expectMatrix(rgbToXyz(PRIMARIES.acescg), [
      [0.6624541811, 0.1340042065, 0.156187687],
      [0.2722287168, 0.6740817658, 0.0536895174],
      [-0.0055746495, 0.0040607335, 1.0103391003],
    ], 6e-11);
  });
});

describe("conversions between the linear spaces", () => {
  it("ACES2065-1 → ACEScg is TRA_1 of the ACES documents (S-2014-004 §4.3; S-2013-001 ACESproxy eq. 2)", () => {
    expectMatrix(conversionMatrix("aces2065-1", "acescg"), [
      [1.4514393161, -0.2365107469, -0.2149285693],
      [-0.0765537734, 1.1762296998, -0.0996759264],
      [0.0083161484, -0.0060324498, 0.9977163014],
    ], 6e-11);
  });

  it("ACEScg → ACES2065-1 is TRA_2 (S-2014-004 §4.3; S-2013-001 ACESproxy eq. 4)", () => {
    expectMatrix(conversionMatrix("acescg", "aces2065-1"), [
      [0.6954522414, 0.1406786965, 0.1638690622],
      [0.0447945634, 0.8596711185, 0.0955343182],
      [-0.0055258826, 0.0040252103, 1.0015006723],
    ], 6e-11);
  });

  it("linear Rec.709 → ACEScg with Bradford D65 → ACES white: the matrix of the Academy's OpenColorIO ACES config, 'Utility - Linear - sRGB' (from memory; the same 10 digits appear in public shader code)", () => {
    expectMatrix(conversionMatrix("lin-rec709", "acescg"), [
      [0.6130974024, 0.3395231462, 0.0473794514],
      [0.0701937225, 0.9163538791, 0.0134523985],
      [0.0206155929, 0.1095697729, 0.8698146342],
    ], 6e-11);
  });

  it("the ACES reference output transforms' D60 → D65 Bradford matrix (ACESlib.ODT_Common D60_2_D65_CAT, from memory, 6 significant digits)", () => {
    // CTL multiplies row vectors, so its printed matrix is the transpose of ours.
    const ours = bradford(ACES_WHITE, D65);
    const transposed = [0, 1, 2].map((i) => [0, 1, 2].map((j) => ours[j]![i]!)) as Mat3;
    expectMatrix(transposed, [
      [0.987224, -0.00759836, 0.00307257],
      [-0.00611327, 1.00186, -0.00509595],
      [0.0159533, 0.00533002, 1.08168],
    ], 5e-6);
  });

  it("the Bradford cone matrix is ICC.1:2010 Annex E.3's", () => {
    expectMatrix(BRADFORD, [
      [0.8951, 0.2664, -0.1614],
      [-0.7502, 1.7135, 0.0367],
      [0.0389, -0.0685, 1.0296],
    ], 0);
  });

  it("white round trip: each space's white (1, 1, 1) lands on the other's white, and back is the identity", () => {
    for (const a of LINEAR_SPACES) {
      for (const b of LINEAR_SPACES) {
        const white = apply(conversionMatrix(a, b), [1, 1, 1]);
        for (const v of white) expect(Math.abs(v - 1)).toBeLessThan(1e-12);
        const back = mul(conversionMatrix(b, a), conversionMatrix(a, b));
        expectMatrix(back, [[1, 0, 0], [0, 1, 0], [0, 0, 1]], 1e-12);
      }
    }
    // The adaptation moves D65's XYZ onto the ACES white's XYZ (the definition of a CAT).
    const adapted = apply(bradford(D65, ACES_WHITE), whiteXyz(D65));
    const target = whiteXyz(ACES_WHITE);
    for (let i = 0; i < 3; i++) expect(Math.abs(adapted[i]! - target[i]!)).toBeLessThan(1e-12);
  });
});

describe("chromaticities attribute of an OpenEXR file", () => {
  it("names our spaces; absent means Rec.709 with D65 (OpenEXR documentation, 'chromaticities'); others are unknown", () => {
    expect(spaceOfChromaticities(null)).toBe("lin-rec709");
    const f = (v: number) => Math.fround(v);
    expect(spaceOfChromaticities({ red: [f(0.713), f(0.293)], green: [f(0.165), f(0.83)], blue: [f(0.128), f(0.044)], white: [f(0.32168), f(0.33767)] })).toBe("acescg");
    expect(spaceOfChromaticities({ red: [0.7347, 0.2653], green: [0, 1], blue: [0.0001, -0.077], white: [0.32168, 0.33767] })).toBe("aces2065-1");
    // Rec.2020 primaries (ITU-R BT.2020-2 table 3): not one of ours.
    expect(spaceOfChromaticities({ red: [0.708, 0.292], green: [0.17, 0.797], blue: [0.131, 0.046], white: [0.3127, 0.329] })).toBeNull();
  });
});
