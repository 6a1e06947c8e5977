import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import type { Browser, Locator, Page } from "playwright-core";
import sharp from "sharp";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { hasChromium, isShown, launchBrowser, screenshot, signIn, startApp, type RunningApp } from "@/tests/e2e/harness";

/*
 * Stills in Chromium (issue 4): a senior drops two PNGs, uploads them with alt text, pairs them
 * as before/after and gets the compare view; an artist drags the divider, moves it with the
 * keyboard, and reads pixels in the probe, checked against the server's own decode.
 */

const SENIOR = "senior@kestrel.test";
const ARTIST = "artist@kestrel.test";
const DEMO_WITH_PAIR = "marker-channel-cleanup";

const W = 64;
const H = 48;

/** RGB bytes, row-major: the value of every pixel is known, so the probe can be checked against it. */
function pattern(kind: "before" | "after"): Buffer {
  const px = Buffer.alloc(W * H * 3);
  for (let y = 0; y < H; y++)
    for (let x = 0; x < W; x++) {
      const i = (y * W + x) * 3;
      // A green ramp; "before" carries a magenta block (a stand-in for a marker) that "after" lacks.
      const marker = kind === "before" && x >= 20 && x < 30 && y >= 10 && y < 20;
      px[i] = marker ? 220 : x * 2;
      px[i + 1] = marker ? 30 : 120 + y;
      px[i + 2] = marker ? 200 : 40;
    }
  return px;
}

type ProbeValue = { channel: string; code: number; float: number };

/** "R 220 / 0.8627   G 30 / 0.1176 …" from one probe row → channel, code value, 0..1 float. */
async function readProbeRow(probe: Locator, label: "Before" | "After"): Promise<{ at: string; values: ProbeValue[] }> {
  const row = probe.getByRole("row", { name: new RegExp(`^${label}`) });
  const cells = row.getByRole("cell");
  // Wait until the row has its reading (it says "reading…" while the pixel loads).
  await expect.poll(async () => (await cells.nth(1).textContent()) ?? "", { timeout: 15_000 }).toMatch(/\d+ \/ /);
  const at = ((await cells.nth(0).textContent()) ?? "").trim();
  const text = (await cells.nth(1).textContent()) ?? "";
  const values = [...text.matchAll(/(Grey|R|G|B|A) (\d+(?:\.\d+)?) \/ (\d+\.\d+)/g)].map((m) => ({ channel: m[1]!, code: Number(m[2]), float: Number(m[3]) }));
  return { at, values };
}

/** The still id behind a compare-view image (its src is /api/stills/{id}/{variant}). */
async function stillIdOf(img: Locator): Promise<string> {
  const src = (await img.getAttribute("src")) ?? "";
  const id = /\/api\/stills\/([^/]+)\//.exec(src)?.[1];
  expect(id, `still id in ${src}`).toBeTruthy();
  return decodeURIComponent(id!);
}

type StillInfo = { id: string; width: number; height: number; bitDepth: number };
type ServerPixel = { x: number; y: number; max: number; bitDepth: number; values: number[] };

async function serverPixel(page: Page, id: string, x: number, y: number): Promise<ServerPixel> {
  const res = await page.request.get(`/api/stills/${id}/pixel?x=${x}&y=${y}`);
  expect(res.status()).toBe(200);
  return (await res.json()) as ServerPixel;
}

/** Code values are whole numbers within the still's range; floats lie in 0..1 and equal code / max to the digits shown. */
function expectConsistent(values: ProbeValue[], max: number): void {
  expect(values.length).toBeGreaterThan(0);
  for (const v of values) {
    expect(Number.isInteger(v.code)).toBe(true);
    expect(v.code).toBeGreaterThanOrEqual(0);
    expect(v.code).toBeLessThanOrEqual(max);
    expect(v.float).toBeGreaterThanOrEqual(0);
    expect(v.float).toBeLessThanOrEqual(1);
    // Shown with 4 decimals for 8-bit, 6 for 16-bit (lib/stills/probe.ts formatFloat): half a unit in the last place.
    expect(Math.abs(v.float - v.code / max)).toBeLessThanOrEqual(max > 255 ? 5e-7 : 5e-5);
  }
}

describe.skipIf(!hasChromium())("stills in Chromium", () => {
  let app: RunningApp;
  let browser: Browser;
  let tmp: string;
  const files = { before: "", after: "" };

  beforeAll(async () => {
    tmp = fs.mkdtempSync(path.join(os.tmpdir(), "plateroom-stills-e2e-"));
    for (const kind of ["before", "after"] as const) {
      files[kind] = path.join(tmp, `wire-${kind}.png`);
      await sharp(pattern(kind), { raw: { width: W, height: H, channels: 3 } }).png().toFile(files[kind]);
    }
    app = await startApp();
    browser = await launchBrowser();
  }, 600_000);

  afterAll(async () => {
    await browser?.close();
    await app?.stop();
    if (tmp) fs.rmSync(tmp, { recursive: true, force: true });
  });

  it("a senior uploads two PNGs with alt text, pairs them as before/after and sees the compare view", async () => {
    const { context, page } = await signIn(browser, app.baseUrl, SENIOR);
    const created = await page.request.post("/api/techniques", {
      data: { title: "Marker block test plate", summary: "A draft to hold uploaded stills.", tags: ["tracking-markers"] },
    });
    expect(created.status()).toBe(201);
    const { slug } = (await created.json()) as { slug: string };

    await page.goto(`/techniques/${slug}`);
    const evidence = page.getByRole("region", { name: "Before and after" });
    expect(await isShown(evidence.getByText("No before/after stills yet."))).toBe(true);
    // Made without a body: the page says so instead of showing an empty card.
    expect(await isShown(page.getByText("No write-up yet."))).toBe(true);
    await page.getByText("Add stills and pair them").click();
    const uploader = page.getByRole("region", { name: "Upload stills" });
    expect(await isShown(uploader)).toBe(true);
    await uploader.locator('input[type="file"]').setInputFiles([files.before, files.after]);

    const alts = { before: "Ramp with a magenta marker block, before", after: "Ramp with the marker block painted out, after" };
    for (const kind of ["before", "after"] as const) {
      const row = uploader.getByRole("listitem", { name: `Upload of wire-${kind}.png` });
      expect(await isShown(row)).toBe(true);
      await row.getByLabel(/Alt text/).fill(alts[kind]);
    }
    await uploader.getByRole("button", { name: "Upload 2 stills" }).click();
    for (const kind of ["before", "after"] as const) {
      const row = uploader.getByRole("listitem", { name: `Upload of wire-${kind}.png` });
      expect(await isShown(row.getByRole("status").filter({ hasText: "Uploaded." }), 30_000)).toBe(true);
      const bar = row.getByRole("progressbar", { name: `Upload progress of wire-${kind}.png` });
      expect(await bar.evaluate((el) => (el as HTMLProgressElement).value)).toBe(1);
      expect(await isShown(row.getByText("100 %"))).toBe(true);
    }
    await screenshot(page, "stills-uploaded");

    const pairEditor = page.getByRole("region", { name: "Make a before/after pair" });
    expect(await isShown(pairEditor, 30_000)).toBe(true);
    await pairEditor.getByRole("group", { name: "Before" }).locator("label", { hasText: alts.before }).click();
    await pairEditor.getByRole("group", { name: "After" }).locator("label", { hasText: alts.after }).click();
    await pairEditor.getByRole("button", { name: "Save pair" }).click();
    expect(await isShown(pairEditor.getByRole("status").filter({ hasText: "Pair saved in revision 1." }), 30_000)).toBe(true);

    const slider = evidence.getByRole("slider", { name: "Divider between before and after" });
    expect(await isShown(slider, 30_000)).toBe(true);
    expect(await isShown(evidence.getByRole("img", { name: `Before: ${alts.before}` }))).toBe(true);
    expect(await isShown(evidence.getByRole("img", { name: `After: ${alts.after}` }))).toBe(true);
    expect(await evidence.getByText("No before/after stills yet.").count()).toBe(0);

    // Typed coordinates inside the marker block: the probe shows the bytes this test wrote.
    const probe = evidence.getByRole("region", { name: "Pixel probe" });
    await probe.getByLabel("x", { exact: true }).fill("25");
    await probe.getByLabel("y", { exact: true }).fill("15");
    const before = await readProbeRow(probe, "Before");
    const after = await readProbeRow(probe, "After");
    expect(before.at).toBe("25, 15");
    const raw = { before: pattern("before"), after: pattern("after") };
    const i = (15 * W + 25) * 3;
    expect(before.values.map((v) => v.code)).toEqual([...raw.before.subarray(i, i + 3)]);
    expect(after.values.map((v) => v.code)).toEqual([...raw.after.subarray(i, i + 3)]);
    expectConsistent(before.values, 255);
    expectConsistent(after.values, 255);
    // The server's decode (sharp) of the stored originals agrees with the browser's canvas and the bytes written.
    const ids = { before: await stillIdOf(evidence.getByRole("img", { name: `Before: ${alts.before}` })), after: await stillIdOf(evidence.getByRole("img", { name: `After: ${alts.after}` })) };
    for (const kind of ["before", "after"] as const) {
      const stored = await serverPixel(page, ids[kind], 25, 15);
      expect(stored).toMatchObject({ bitDepth: 8, max: 255, values: [...raw[kind].subarray(i, i + 3)] });
    }
    await screenshot(page, "stills-paired");
    await context.close();
  });

  it("an artist drags the divider, moves it with arrow keys and reads pixels that match the stored still", async () => {
    const { context, page } = await signIn(browser, app.baseUrl, ARTIST);
    await page.goto(`/techniques/${DEMO_WITH_PAIR}`);
    const evidence = page.getByRole("region", { name: "Before and after" });
    const slider = evidence.getByRole("slider", { name: "Divider between before and after" }).first();
    expect(await isShown(slider, 30_000)).toBe(true);
    const beforeImg = evidence.getByRole("img", { name: /^Before: / }).first();
    const afterImg = evidence.getByRole("img", { name: /^After: / }).first();
    await beforeImg.waitFor();
    // Mouse coordinates are the viewport's: bring the still into view first.
    await beforeImg.scrollIntoViewIfNeeded();
    const box = (await beforeImg.boundingBox())!;
    expect(box.width).toBeGreaterThan(100);

    // Drag the divider handle to a quarter of the width.
    const start = Number(await slider.getAttribute("aria-valuenow"));
    const handle = (await slider.boundingBox())!;
    await page.mouse.move(handle.x + handle.width / 2, handle.y + handle.height / 2);
    await page.mouse.down();
    await page.mouse.move(box.x + box.width * 0.25, box.y + box.height / 2, { steps: 8 });
    await page.mouse.up();
    const dragged = Number(await slider.getAttribute("aria-valuenow"));
    expect(dragged).not.toBe(start);
    expect(Math.abs(dragged - 25)).toBeLessThanOrEqual(1);

    // Keyboard: WAI-ARIA Authoring Practices slider pattern (arrows step, Home/End to the ends).
    await slider.focus();
    await page.keyboard.press("ArrowRight");
    await page.keyboard.press("ArrowRight");
    expect(Number(await slider.getAttribute("aria-valuenow"))).toBeCloseTo(dragged + 2, 5);
    await page.keyboard.press("ArrowLeft");
    expect(Number(await slider.getAttribute("aria-valuenow"))).toBeCloseTo(dragged + 1, 5);
    await page.keyboard.press("End");
    expect(await slider.getAttribute("aria-valuenow")).toBe("100");
    await page.keyboard.press("Home");
    expect(await slider.getAttribute("aria-valuenow")).toBe("0");

    // Hover over the still: the probe reads the pixel under the pointer.
    const pairs = await page.request.get(`/api/stills/pairs?technique=${DEMO_WITH_PAIR}`);
    expect(pairs.status()).toBe(200);
    const pair = ((await pairs.json()) as { items: Array<{ before: StillInfo; after: StillInfo }> }).items[0]!;
    expect(await stillIdOf(beforeImg)).toBe(pair.before.id);
    expect(await stillIdOf(afterImg)).toBe(pair.after.id);
    const probe = evidence.getByRole("region", { name: "Pixel probe" }).first();
    const xInput = probe.getByLabel("x", { exact: true });
    const yInput = probe.getByLabel("y", { exact: true });
    await page.mouse.move(box.x + box.width * 0.37, box.y + box.height * 0.41);
    // The pixel under the pointer, give or take one for sub-pixel layout.
    await expect.poll(async () => Math.abs(Number(await xInput.inputValue()) - 0.37 * pair.before.width), { timeout: 10_000 }).toBeLessThanOrEqual(1);
    await expect.poll(async () => Math.abs(Number(await yInput.inputValue()) - 0.41 * pair.before.height), { timeout: 10_000 }).toBeLessThanOrEqual(1);
    let x = Number(await xInput.inputValue());
    let y = Number(await yInput.inputValue());
    for (const [label, still] of [["Before", pair.before], ["After", pair.after]] as const) {
      const shown = await readProbeRow(probe, label);
      const stored = await serverPixel(page, still.id, x, y);
      expect(shown.at).toBe(`${x}, ${y}`);
      expect(stored.bitDepth).toBe(still.bitDepth);
      expectConsistent(shown.values, stored.max);
      expect(shown.values.map((v) => v.code)).toEqual(stored.values);
    }
    await screenshot(page, "stills-artist-probe");

    // Typed coordinates move the probe too (keyboard access).
    await xInput.fill("640");
    await yInput.fill("360");
    x = Number(await xInput.inputValue());
    y = Number(await yInput.inputValue());
    expect([x, y]).toEqual([640, 360]);
    for (const [label, still] of [["Before", pair.before], ["After", pair.after]] as const) {
      const shown = await readProbeRow(probe, label);
      expect(shown.at).toBe("640, 360");
      const stored = await serverPixel(page, still.id, 640, 360);
      expectConsistent(shown.values, stored.max);
      expect(shown.values.map((v) => v.code)).toEqual(stored.values);
    }
    await context.close();
  });
});
