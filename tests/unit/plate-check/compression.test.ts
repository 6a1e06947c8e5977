import sharp from "sharp";
import { describe, expect, it } from "vitest";
import { compressionFinding, webpCoding } from "@/lib/plate-check/compression";

/*
 * The file-coding finding. WebP files are written by sharp's libwebp (an outside writer): lossy
 * files carry a "VP8 " chunk, lossless ones "VP8L" (RFC 9649 §2.5 and §3); with an alpha channel a
 * lossy file is an extended one ("VP8X", then "ALPH", then "VP8 ").
 */

const frame = () => sharp({ create: { width: 64, height: 48, channels: 3, background: { r: 30, g: 160, b: 60 }, noise: { type: "gaussian", mean: 120, sigma: 6 } } });

describe("compression finding", () => {
  it("tells lossy from lossless WebP by its image chunk, simple and extended", async () => {
    expect(webpCoding(new Uint8Array(await frame().webp({ quality: 80 }).toBuffer()))).toBe("lossy");
    expect(webpCoding(new Uint8Array(await frame().webp({ lossless: true }).toBuffer()))).toBe("lossless");
    const alpha = await frame().ensureAlpha(0.5).webp({ quality: 80 }).toBuffer();
    expect(Buffer.from(alpha).subarray(12, 16).toString("latin1")).toBe("VP8X");
    expect(webpCoding(new Uint8Array(alpha))).toBe("lossy");
    expect(webpCoding(new Uint8Array(await frame().png().toBuffer()))).toBeNull();
  });

  it("says what lossy coding affects, with its confidence, and stays quiet on lossless files", async () => {
    const lossy = compressionFinding({ format: "webp", bytes: new Uint8Array(await frame().webp({ quality: 80 }).toBuffer()) });
    expect(lossy).toMatchObject({ lossy: true, confidence: 1 });
    expect(lossy.summary).toMatch(/noise σ, dead and hot pixels and dust/);
    expect(compressionFinding({ format: "jpeg" })).toMatchObject({ lossy: true, method: "JPEG" });
    expect(compressionFinding({ format: "png" }).lossy).toBe(false);
    // Unreadable chunks: treated as lossy, but as a guess.
    expect(compressionFinding({ format: "webp", bytes: new Uint8Array(8) })).toMatchObject({ lossy: true, confidence: 0.5 });
    // OpenEXR: B44/DWA are lossy; PXR24 only on 32-bit float samples; ZIP is lossless.
    expect(compressionFinding({ format: "exr", exr: { compression: "dwaa", pixelType: "half" } }).lossy).toBe(true);
    expect(compressionFinding({ format: "exr", exr: { compression: "pxr24", pixelType: "float" } }).lossy).toBe(true);
    expect(compressionFinding({ format: "exr", exr: { compression: "pxr24", pixelType: "half" } }).lossy).toBe(false);
    expect(compressionFinding({ format: "exr", exr: { compression: "zip", pixelType: "half" } }).lossy).toBe(false);
  });
});
