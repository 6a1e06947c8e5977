import fs from "node:fs";
import path from "node:path";
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { hasChromium, launchBrowser, screenshot, signIn, startApp, type RunningApp } from "@/tests/e2e/harness";
import { halfPattern, rawExr, tempDir } from "@/tests/exr/reference";

/*
 * OpenEXR in Chromium (issue 17): a senior views the demo's scene-linear pair at 100 % (one
 * image pixel per screen pixel, from the full-size display image) and 200 % (nearest
 * neighbour), full screen and back with Escape, lowers the exposure and shows the values above
 * 1, reads float values and their space in the probe; uploads an OpenEXR with two layers and
 * picks the second; tries a recipe on an OpenEXR of their own in the lab and downloads the
 * result as OpenEXR.
 */

const SENIOR = "senior@kestrel.test";
const EXR_PAIR_TECHNIQUE = "wire-removal-by-offset-strip";
const LAB_TECHNIQUE = "marker-channel-cleanup";

let app: RunningApp;
let browser: Browser;
let page: Page;
let tmp: ReturnType<typeof tempDir>;

/** A two-layer OpenEXR (default RGB and "spare") with values outside 0..1. */
function twoLayerExr(w = 48, h = 32): Buffer {
  const n = w * h;
  const names = ["B", "G", "R", "spare.B", "spare.G", "spare.R"];
  return rawExr({ channels: names.map((name, k) => ({ name, type: "half", samples: halfPattern(n, 200 + k) })), dataWindow: [0, 0, w - 1, h - 1] });
}

const figureOf = (p: Page) => p.locator("figure").filter({ hasText: "Scene-linear plate" }).first();

describe.skipIf(!hasChromium())("OpenEXR plates in the browser", () => {
  beforeAll(async () => {
    tmp = tempDir();
    app = await startApp();
    browser = await launchBrowser();
    ({ page } = await signIn(browser, app.baseUrl, SENIOR));
  }, 900_000);

  afterAll(async () => {
    await browser?.close();
    await app?.stop();
    tmp?.remove();
  });

  it("views the linear pair at 100 % and 200 %, full screen, with exposure and the out-of-range view, and probes float values", async () => {
    await page.goto(`/techniques/${EXR_PAIR_TECHNIQUE}`);
    const figure = figureOf(page);
    await figure.scrollIntoViewIfNeeded();
    await expect.poll(() => figure.textContent()).toContain("ACEScg (linear, AP1)");
    // The compare view is not squeezed beside the sidebar: it spans the page's content width.
    const main = await page.locator("main").boundingBox();
    const fig = await figure.boundingBox();
    expect(fig!.width).toBeGreaterThan(main!.width - 100);

    await figure.getByRole("button", { name: "100 %" }).click();
    const img = figure.locator("img").first();
    await expect.poll(() => img.evaluate((i: HTMLImageElement) => i.complete && i.naturalWidth)).toBe(1280);
    expect(await img.getAttribute("src")).toMatch(/\/display$/);
    const dpr = await page.evaluate(() => window.devicePixelRatio);
    // 100 %: one image pixel per device pixel.
    expect(await img.evaluate((i: HTMLImageElement) => i.getBoundingClientRect().width)).toBeCloseTo(1280 / dpr, 0);
    await figure.getByRole("button", { name: "200 %" }).click();
    expect(await img.evaluate((i: HTMLImageElement) => [getComputedStyle(i).imageRendering, i.getBoundingClientRect().width])).toEqual(["pixelated", (2 * 1280) / dpr]);
    await screenshot(page, "exr-200");

    await figure.getByRole("button", { name: "Fit" }).click();
    await figure.getByRole("button", { name: "Full screen" }).click();
    await expect.poll(() => page.evaluate(() => document.fullscreenElement?.tagName ?? null)).toBe("FIGURE");
    await screenshot(page, "exr-fullscreen");
    await figure.getByRole("button", { name: "Leave full screen" }).focus();
    await page.keyboard.press("Escape");
    await expect.poll(() => page.evaluate(() => document.fullscreenElement)).toBeNull();

    const down = figure.getByRole("button", { name: "Exposure down 0.5 stop" });
    for (let i = 0; i < 6; i++) await down.click();
    await figure.getByRole("button", { name: "Values outside 0–1" }).click();
    await expect.poll(() => img.getAttribute("src"), { timeout: 10_000 }).toContain("exposure=-3&view=range");
    await expect.poll(() => img.evaluate((i: HTMLImageElement) => i.complete && i.naturalWidth > 0), { timeout: 60_000 }).toBe(true);
    // The lamp (about 14 in ACEScg) is still above 1 at −3 stops: painted in the "above 1" colour.
    const lampColour = await img.evaluate((i: HTMLImageElement) => {
      const c = document.createElement("canvas");
      c.width = i.naturalWidth;
      c.height = i.naturalHeight;
      const ctx = c.getContext("2d")!;
      ctx.drawImage(i, 0, 0);
      return Array.from(ctx.getImageData(Math.round(0.74 * c.width), Math.round(0.62 * c.height), 1, 1).data.slice(0, 3));
    });
    expect(lampColour[0]).toBeGreaterThan(200);
    expect(lampColour[2]).toBeLessThan(80);
    await screenshot(page, "exr-range");

    const box = (await img.boundingBox())!;
    await page.mouse.move(box.x + box.width * 0.74, box.y + box.height * 0.62);
    const probe = page.getByRole("region", { name: "Pixel probe" }).first();
    await expect.poll(() => probe.textContent(), { timeout: 60_000 }).toMatch(/Before \(half float, ACEScg\).*R \d+\.\d+/);
    const red = Number(/Before[^]*?R (\d+\.\d+)/.exec((await probe.textContent()) ?? "")?.[1]);
    expect(red).toBeGreaterThan(1);
  });

  it("uploads an OpenEXR with two layers, picking the second, and sees its facts", async () => {
    const file = tmp.file("two-layers.exr");
    fs.writeFileSync(file, twoLayerExr());
    await page.goto(`/techniques/${EXR_PAIR_TECHNIQUE}`);
    await page.getByText("Add stills and pair them").click();
    await page.getByLabel("Choose still files").setInputFiles(file);
    const row = page.getByRole("listitem", { name: `Upload of ${path.basename(file)}` });
    await expect.poll(() => row.getByLabel(/Layer shown/).locator("option").allTextContents()).toEqual(["default layer (RGB)", "layer spare (RGB)"]);
    await row.getByLabel(/Layer shown/).selectOption("0/layer:spare");
    await row.getByLabel("Colour space").selectOption("acescg");
    await row.getByLabel(/Alt text/).fill("Two-layer test plate, spare layer");
    await screenshot(page, "exr-upload-row");
    const created = page.waitForResponse((r) => r.url().endsWith("/api/stills") && r.request().method() === "POST");
    await row.getByRole("button", { name: "Upload" }).click();
    const body = (await (await created).json()) as { format: string; colourSpace: string; exr: { layer: string } };
    expect(body).toMatchObject({ format: "exr", colourSpace: "acescg", exr: { layer: "0/layer:spare" } });
    await row.getByText("Uploaded.").waitFor({ timeout: 30_000 });
  });

  it("runs a recipe on an OpenEXR trial still in the lab and downloads the result as OpenEXR", async () => {
    // The technique's recipe regrains from its 1280 × 720 denoised plate: the trial must be that size.
    const file = tmp.file("trial.exr");
    fs.writeFileSync(file, twoLayerExr(1280, 720));
    await page.goto(`/techniques/${LAB_TECHNIQUE}`);
    const lab = page.getByRole("region", { name: "Still lab" });
    await lab.scrollIntoViewIfNeeded();
    await lab.getByRole("button", { name: "Try on my still" }).click();
    await lab.getByLabel(/^File/).setInputFiles(file);
    await lab.getByLabel("Describe it (alt text)").fill("My linear trial plate");
    await lab.getByRole("button", { name: "Upload and use" }).click();
    await lab.getByText(/^Uploaded\./).waitFor({ timeout: 30_000 });
    await expect.poll(() => lab.getByLabel("Work in").locator("option").allTextContents()).toContain("Linear light, converted to ACEScg");
    await lab.getByLabel("Work in").selectOption("linear:acescg");
    await lab.getByRole("button", { name: /Render exact/ }).click();
    await lab.getByText("Download the 16-bit PNG").waitFor({ timeout: 120_000 });
    await lab.getByLabel("OpenEXR samples").selectOption("float");
    await screenshot(page, "exr-lab");
    const download = page.waitForEvent("download");
    await lab.getByRole("button", { name: "Download OpenEXR" }).click();
    const saved = tmp.file("lab.exr");
    await (await download).saveAs(saved);
    const bytes = fs.readFileSync(saved);
    // OpenEXR magic number 20000630, version 2 (OpenEXR File Layout).
    expect(bytes.readUInt32LE(0)).toBe(20000630);
    expect(bytes.readUInt32LE(4) & 0xff).toBe(2);
    expect(bytes.includes(Buffer.from("chromaticities\0chromaticities\0", "latin1"))).toBe(true);
  });
});
