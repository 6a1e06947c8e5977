import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { CheckDto } from "@/lib/plate-check/schemas";
import { seriousViolations } from "@/tests/e2e/axe";
import { hasChromium, launchBrowser, screenshot, signIn, startApp, type RunningApp } from "@/tests/e2e/harness";
import { scoreFindings } from "@/tests/plate-check/score";
import { generatePlate, type GeneratedPlate } from "@/tests/plate-check/synthetic-plates";

/*
 * Issue 18 in Chromium: an artist who cannot name the problem drops a generated frame on the search
 * page ("or drop a frame"), lands on the still's page, watches the check run, reads the findings
 * (compared with the frame's truth), switches an overlay with the keyboard, tries the suggested
 * methods side by side and keeps one; nobody else (another artist, a lead) can open the private
 * trial. axe-core checks the still page with its findings and tries (tests/e2e/axe.ts).
 */

describe.skipIf(!hasChromium())("the plate check in Chromium", () => {
  let app: RunningApp;
  let browser: Browser;
  let plate: GeneratedPlate;
  let file = "";

  beforeAll(async () => {
    plate = generatePlate({ width: 1280, height: 720, seed: 1818, screenHue: 124, shades: 2, unevenness: 0.3, grain: 0.008, foregroundShapes: 1, deadHotStuck: 8, dust: 4, hairs: 1 });
    file = path.join(fs.mkdtempSync(path.join(os.tmpdir(), "plateroom-e2e-")), "frame_0101.png");
    fs.writeFileSync(file, await plate.png());
    [app, browser] = await Promise.all([startApp(), launchBrowser()]);
  }, 900_000);

  afterAll(async () => {
    await browser?.close();
    await app?.stop();
    if (file) fs.rmSync(path.dirname(file), { recursive: true, force: true });
  });

  it("an artist drops a frame, reads what was measured and tries the methods side by side", { timeout: 240_000 }, async () => {
    const { context, page } = await signIn(browser, app.baseUrl, "artist@kestrel.test");
    await page.goto(`${app.baseUrl}/search`);
    await page.getByText("Can't put it into words? Or drop a frame here").waitFor();
    await page.getByLabel("Choose a frame to check").setInputFiles(file);
    await page.waitForURL(/\/stills\/[0-9a-f-]{36}$/, { timeout: 60_000 });
    const stillId = page.url().split("/").at(-1)!;

    // The check runs on arrival, with its stages as progress, then the findings.
    await page.getByRole("heading", { name: "What the plate check measured" }).waitFor();
    await page.getByRole("list", { name: "Findings" }).waitFor({ timeout: 120_000 });
    const dto = (await (await page.request.get(`/api/stills/${stillId}/check`)).json()) as CheckDto;
    const score = scoreFindings(dto.findings, plate.truth);
    expect(score.markers.matched / score.markers.truth).toBeGreaterThanOrEqual(0.95);
    expect(score.defects.matched).toBe(score.defects.truth);
    await expect.poll(() => page.getByText(`${dto.findings.markers.count} tracking markers on the screen in 2 shades`).count()).toBe(1);
    await expect.poll(() => page.getByText("Private trial").count()).toBe(1);

    // Overlays switch with the keyboard.
    const screenLayer = page.getByRole("checkbox", { name: "Clean screen" });
    await screenLayer.focus();
    await page.keyboard.press("Space");
    expect(await screenLayer.isChecked()).toBe(true);
    await screenshot(page, "plate-check-findings");
    expect(await seriousViolations(page)).toEqual([]);

    // The department's method for markers is suggested first.
    const suggested = page.getByRole("heading", { name: "Methods for what was found" }).locator("xpath=..").getByRole("listitem");
    await expect.poll(() => suggested.first().textContent()).toContain("Marker channel cleanup");

    // Side by side: each runnable method filled, rendered and measured on this frame.
    await page.getByRole("button", { name: /^Try (it|these \d) on this frame$/ }).click();
    const columns = page.locator("article");
    await columns.first().waitFor({ timeout: 120_000 });
    await expect.poll(() => page.getByText(/^Marker contrast in G$/).count(), { timeout: 60_000 }).toBeGreaterThanOrEqual(1);
    const marker = page.getByRole("article", { name: "Marker channel cleanup" });
    await marker.getByRole("img").evaluate((img: HTMLImageElement) => (img.complete ? null : new Promise((r) => img.addEventListener("load", r, { once: true }))));
    await marker.scrollIntoViewIfNeeded();
    await screenshot(page, "plate-check-side-by-side");
    expect(await seriousViolations(page)).toEqual([]);

    // Pick it and keep the filled recipe for the trial.
    await marker.getByRole("button", { name: "Pick this one" }).click();
    await marker.getByLabel(/Note/).fill("markers gone in G; check the edges");
    await marker.getByRole("button", { name: "Keep for my trial" }).click();
    await marker.getByText("Kept in your trials on this still.").waitFor();
    await page.getByRole("heading", { name: "Kept recipes on this still" }).waitFor();
    await context.close();

    // Someone else's private trial is not there for anyone else, a lead included (issue 19): 404.
    for (const email of ["dara.pellow@kestrel.test", "lead@kestrel.test"]) {
      const other = await signIn(browser, app.baseUrl, email);
      const res = await other.page.goto(`${app.baseUrl}/stills/${stillId}`);
      expect(res?.status()).toBe(404);
      await other.page.getByTestId("not-found").waitFor();
      expect(await other.page.getByRole("list", { name: "Findings" }).count()).toBe(0);
      expect((await other.page.request.get(`/api/stills/${stillId}/check`)).status()).toBe(404);
      await other.context.close();
    }
  });
});
