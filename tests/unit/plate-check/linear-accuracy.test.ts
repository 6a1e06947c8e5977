import fs from "node:fs";
import { afterAll, expect, it } from "vitest";
import { decodeExr } from "@/lib/exr/decode";
import { encodeExr } from "@/lib/exr/encode";
import { checkFrame } from "@/lib/plate-check/check";
import { frameFromLinear } from "@/lib/plate-check/frame";
import { describeWithExrTools, refHeader, tempDir } from "@/tests/exr/reference";
import { linearSpec } from "@/tests/plate-check/families";
import { scoreFindings } from "@/tests/plate-check/score";
import { expectIssueTargets } from "@/tests/plate-check/targets";
import { generatePlate } from "@/tests/plate-check/synthetic-plates";

/*
 * Accuracy of the plate check on linear-light plates stored as OpenEXR (issue 18: the screen's
 * mean "in the still's linear space"). Each generated plate is written as a half-float, ZIP
 * OpenEXR by three's EXRExporter (lib/exr/encode.ts), the file is confirmed by the OpenEXR
 * reference tools (/usr/bin/exrheader: R, G, B half channels, ZIP, the plate's size), read back
 * and checked. Sources:
 * - marker recall/precision ≥ 95 %, dead/hot recall 100 % and precision ≥ 99 %, noise within 10 %,
 *   screen hue within 2°: the issue's targets (trade expectations, no published source);
 * - noise truth: the generator's Gaussian sigma in linear values; estimator Immerkær 1996;
 * - hue truth: HSV hue of the screen's linear colour (A. R. Smith, SIGGRAPH 1978);
 * - screen mean truth: the generator's lit screen colour averaged over the pixels not covered by
 *   foreground; within 1 % per channel (own tolerance: the check leaves out the markers and dust
 *   on the screen, which sit under slightly different light, and half floats round to 2⁻¹¹).
 */

const tmp = tempDir();
afterAll(() => tmp.remove());

describeWithExrTools("plate check accuracy on linear OpenEXR plates", () => {
  it("linear family: 4 plates, 1280×720 half-float OpenEXR, green and blue screens, 1–4 shades, hot pixels above 1", { timeout: 300_000 }, async () => {
    const t = { mT: 0, mF: 0, mM: 0, dT: 0, dF: 0, dM: 0, dustT: 0, dustM: 0, maxHue: 0, maxNoise: 0, maxMean: 0 };
    for (let i = 1; i <= 4; i++) {
      const plate = generatePlate(linearSpec(i));
      const bytes = await encodeExr(plate.linear!, plate.width, plate.height, { pixelType: "half", compression: "zip" }, null);
      const file = tmp.file(`linear-${i}.exr`);
      fs.writeFileSync(file, bytes);
      const ref = refHeader(file);
      expect(ref.channels.filter((c) => ["R", "G", "B"].includes(c.name)).map((c) => c.type)).toEqual(["half", "half", "half"]);
      expect(ref.compression).toMatch(/zip/i);
      expect(ref.displayWindow).toEqual([0, 0, plate.width - 1, plate.height - 1]);
      const d = decodeExr(new Uint8Array(fs.readFileSync(file)), { maxPixels: 1e8 });
      const rgb = new Float32Array(d.width * d.height * 3);
      for (let p = 0; p < d.width * d.height; p++) for (let c = 0; c < 3; c++) rgb[p * 3 + c] = d.data[p * d.channels + c]!;
      const f = await checkFrame(frameFromLinear(rgb, d.width, d.height));
      expect(f.colourSpace).toBe("linear");
      expect(f.clipping.hardCeiling).toBe(false);
      const s = scoreFindings(f, plate.truth);
      t.mT += s.markers.truth; t.mF += s.markers.found; t.mM += s.markers.matched;
      t.dT += s.defects.truth; t.dF += s.defects.found; t.dM += s.defects.matched;
      t.dustT += s.dust.truth; t.dustM += s.dust.matched;
      t.maxHue = Math.max(t.maxHue, s.hueError ?? Infinity);
      t.maxNoise = Math.max(t.maxNoise, ...s.noiseRelError.map(Math.abs));
      const truthMean = plate.truth.screen!.meanLinear;
      t.maxMean = Math.max(t.maxMean, ...f.screen.meanLinear!.map((v, c) => Math.abs(v / truthMean[c]! - 1)));
    }
    const pct = (a: number, b: number) => ((100 * a) / b).toFixed(1);
    console.log(
      `[plate-check accuracy] linear OpenEXR: markers recall ${pct(t.mM, t.mT)} % precision ${pct(t.mM, t.mF)} % (${t.mM}/${t.mT}, ${t.mF} reported); ` +
        `dead/hot recall ${pct(t.dM, t.dT)} % precision ${pct(t.dM, t.dF)} %; dust ${t.dustM}/${t.dustT}; worst hue error ${t.maxHue.toFixed(2)}°, ` +
        `worst noise error ${(100 * t.maxNoise).toFixed(2)} %, worst screen mean error ${(100 * t.maxMean).toFixed(2)} %`,
    );
    expectIssueTargets(t);
    expect(t.maxMean, "screen linear mean within 1 % per channel").toBeLessThanOrEqual(0.01);
  });
});
