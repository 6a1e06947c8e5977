import type { Browser, Page } from "playwright-core";
import sharp from "sharp";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { hasChromium, isShown, launchBrowser, screenshot, signIn, startApp, type RunningApp } from "@/tests/e2e/harness";

/*
 * Issue 7 in Chromium: a lead imports a shot list with two bad rows, reads the dry-run preview and
 * commits; an artist logs a use of a technique on one of the new shots with an after still; the
 * technique's shot table, its outcome counts and the shot page show it; the retire dialog lists
 * the shots to follow up. The tests run in order and build on each other's data.
 */

const SHOW = "SLM";
const TECHNIQUE = "marker-channel-cleanup";
const TECHNIQUE_TITLE = "Marker channel cleanup"; // scripts/seed/data/techniques.ts
const NEW_CODES = ["SLM_160_0010", "SLM_160_0020", "SLM_160_0030", "SLM_170_0010"];
const USED_SHOT = "SLM_160_0030";
const BAD_PATTERN_CODE = "SLM_16_0040"; // two-digit sequence: breaks SHOW_SEQ_SHOT (common practice, no published source)
const QUOTED_DESCRIPTION = "Heron lifts off the reeds, wide; tracking crosses on the bank";

/*
 * Column names no guess recognises, so the lead has to map every one of them in the interface.
 * RFC 4180 §2: records end in CRLF, and a field holding a comma is enclosed in double quotes.
 * The Unicode Standard (§23.8, "Byte Order Mark") and RFC 3629 §6: spreadsheets save UTF-8 with
 * EF BB BF in front, which a reader must not take as part of the first header.
 */
const HEADERS = { code: "Plate ID", sequence: "Reel/Seq", description: "Paint brief", frameStart: "Head", frameEnd: "Tail" } as const;
const CSV_LINES = [
  `${HEADERS.code},${HEADERS.sequence},${HEADERS.description},${HEADERS.frameStart},${HEADERS.frameEnd}`,
  `SLM_160_0010,160,"${QUOTED_DESCRIPTION}",1001,1096`, // row 1
  "SLM_160_0020,160,Reeds foreground; boom shadow across the water,1001,1140", // row 2
  `${BAD_PATTERN_CODE},160,Marsh wide with survey pole,1001,1050`, // row 3: pattern error
  "SLM_160_0030,160,Close on the boat; pink crosses on the hull,1001,1210", // row 4
  "SLM_160_0020,160,Same code again with another brief,1001,1150", // row 5: repeats row 2
  "SLM_170_0010,170,Night channel; rig light in frame,1001,1075", // row 6
];
const CSV_BYTES = Buffer.concat([Buffer.from([0xef, 0xbb, 0xbf]), Buffer.from(CSV_LINES.join("\r\n") + "\r\n", "utf8")]);

/** A flat 16:9 frame, as an artist's after still; the colour is what the thumbnail must keep. */
const STILL = { width: 640, height: 360, colour: { r: 60, g: 140, b: 90 } };

async function outcomeCount(page: Page, key: "clean" | "touch-up" | "failed"): Promise<number> {
  const cell = page.getByTestId(`outcome-${key}`);
  await cell.waitFor();
  return Number((await cell.textContent())?.trim());
}

describe.skipIf(!hasChromium())("shows and shots in Chromium", () => {
  let app: RunningApp;
  let browser: Browser;
  let stillPng: Buffer;
  let touchUpBefore = -1;

  beforeAll(async () => {
    app = await startApp();
    browser = await launchBrowser();
    stillPng = await sharp({ create: { width: STILL.width, height: STILL.height, channels: 3, background: STILL.colour } })
      .png()
      .toBuffer();
  }, 600_000);

  afterAll(async () => {
    await browser?.close();
    await app?.stop();
  });

  it("a lead imports a shot list with two bad rows: maps the columns, reads the preview, commits", async () => {
    const { context, page } = await signIn(browser, app.baseUrl, "lead@kestrel.test");
    await page.goto(`/shows/${SHOW}`);
    const shotsTitle = page.locator("#shots-title");
    await shotsTitle.waitFor();
    // scripts/seed/data/shows.ts seeds twelve shots on SLM.
    expect(await shotsTitle.textContent()).toContain("(12)");
    const table = page.getByTestId("show-shots");
    for (const code of NEW_CODES) expect(await table.getByRole("link", { name: code, exact: true }).count()).toBe(0);

    const importer = page.getByRole("region", { name: `Import shots into ${SHOW}` });
    await importer.getByLabel("Shot list file").setInputFiles({ name: "saltmarsh-160.csv", mimeType: "text/csv", buffer: CSV_BYTES });

    // No header names a known field, so nothing is mapped yet and the code column is asked for.
    await importer.getByRole("table", { name: "Map columns" }).waitFor();
    expect(await isShown(importer.getByRole("alert").filter({ hasText: "No column for the shot code" }))).toBe(true);
    // The first header arrives without the BOM: the select is labelled with the clean name.
    for (const [field, header] of Object.entries(HEADERS)) await importer.getByLabel(`Field for column ${header}`, { exact: true }).selectOption(field);
    expect(await importer.getByRole("alert").filter({ hasText: "No column for the shot code" }).count()).toBe(0);
    // The quoted field is one cell (RFC 4180 §2.6), shown whole as the first description value.
    expect(await isShown(importer.getByRole("cell", { name: QUOTED_DESCRIPTION, exact: true }))).toBe(true);
    // Six data records under the header; the trailing CRLF does not make a seventh (RFC 4180 §2.2).
    expect(await isShown(importer.getByText("6 rows read."))).toBe(true);
    await screenshot(page, "shots-import-mapped");

    await importer.getByRole("button", { name: "Preview import" }).click();
    const errorsTab = importer.getByRole("tab", { name: /^Errors/ });
    await errorsTab.waitFor();
    expect((await importer.getByRole("tab", { name: /^New/ }).textContent())?.replace(/\s+/g, " ")).toBe("New 4");
    expect((await errorsTab.textContent())?.replace(/\s+/g, " ")).toBe("Errors 2");
    expect((await importer.getByRole("tab", { name: /^Changed/ }).textContent())?.replace(/\s+/g, " ")).toBe("Changed 0");
    // With errors present the preview opens on them, each with its row and reason.
    expect(await errorsTab.getAttribute("aria-selected")).toBe("true");
    const panel = importer.getByRole("tabpanel");
    const patternRow = panel.getByRole("row").filter({ hasText: BAD_PATTERN_CODE });
    expect(await isShown(patternRow)).toBe(true);
    expect(await patternRow.textContent()).toMatch(/^3.*is not a shot code of SLM: they look like SLM_040_0120/);
    const duplicateRow = panel.getByRole("row").filter({ hasText: "appears more than once" });
    expect(await isShown(duplicateRow)).toBe(true);
    expect(await duplicateRow.textContent()).toMatch(/^5SLM_160_0020.*first on row 2/);
    await screenshot(page, "shots-import-preview-errors");

    await importer.getByRole("tab", { name: /^New/ }).click();
    for (const code of NEW_CODES) expect(await isShown(panel.getByRole("row").filter({ hasText: code }))).toBe(true);
    // The comma stayed inside the description instead of splitting the row (RFC 4180 §2.6).
    expect(await panel.getByRole("row").filter({ hasText: "SLM_160_0010" }).textContent()).toContain(`${QUOTED_DESCRIPTION} · 1001–1096`);
    // A dry run writes nothing: the table still lacks the new codes.
    expect(await table.getByRole("link", { name: NEW_CODES[0], exact: true }).count()).toBe(0);

    await importer.getByRole("button", { name: "Import 4 new and 0 changed shots" }).click();
    const done = importer.getByRole("status");
    await done.waitFor();
    expect((await done.textContent())?.replace(/\s+/g, " ")).toContain("Imported: 4 new, 0 changed, 0 unchanged. 2 rows were not imported:");
    for (const code of NEW_CODES) expect(await isShown(table.getByRole("link", { name: code, exact: true }))).toBe(true);
    expect(await table.getByRole("link", { name: BAD_PATTERN_CODE, exact: true }).count()).toBe(0);
    // 12 seeded + 4 imported.
    expect(await isShown(shotsTitle.filter({ hasText: "(16)" }))).toBe(true);
    const importedRow = table.getByRole("row").filter({ hasText: "SLM_160_0010" });
    expect(await importedRow.textContent()).toContain(QUOTED_DESCRIPTION);
    await screenshot(page, "shots-import-done");
    await context.close();
  });

  it("an artist logs a use of the technique on a new shot, outcome needed touch-up, with an after still", async () => {
    const { context, page } = await signIn(browser, app.baseUrl, "artist@kestrel.test");
    await page.goto(`/techniques/${TECHNIQUE}`);
    touchUpBefore = await outcomeCount(page, "touch-up");
    // scripts/seed/data/techniques.ts logs one touch-up among the five seeded uses of this technique.
    expect(touchUpBefore).toBe(1);
    const uses = page.getByTestId("uses-table");
    expect(await uses.getByRole("link", { name: USED_SHOT, exact: true }).count()).toBe(0);

    await page.getByText("Log that you used this on a shot").click();
    const shotField = page.locator("#use-shot");
    await shotField.waitFor();
    await shotField.fill("SLM_160_00");
    const option = page.getByRole("option").filter({ hasText: USED_SHOT });
    await option.waitFor();
    await option.click();
    expect(await shotField.inputValue()).toBe(USED_SHOT);
    await page.getByRole("radio", { name: "Needed touch-up" }).check();
    await page.locator("#use-note").fill("Matte took the hull's pink crosses cleanly; the wake edge needed six frames of paint.");
    await page.getByLabel("After still (optional)").setInputFiles({ name: "slm_160_0030-after.png", mimeType: "image/png", buffer: stillPng });
    await page.getByRole("button", { name: "Log use" }).click();
    const logged = page.getByRole("status").filter({ hasText: "Logged." });
    expect(await isShown(logged, 30_000)).toBe(true);

    // The shot table now lists the shot with its outcome, and touch-ups went up by exactly one.
    const row = uses.getByRole("row").filter({ has: page.getByRole("link", { name: USED_SHOT, exact: true }) });
    expect(await isShown(row)).toBe(true);
    expect(await row.textContent()).toContain("needed touch-up");
    await page.getByTestId("outcome-touch-up").filter({ hasText: String(touchUpBefore + 1) }).waitFor();
    expect(await outcomeCount(page, "touch-up")).toBe(touchUpBefore + 1);
    // Filtering the table by outcome keeps the new row (TanStack Table column filter).
    await page.getByRole("combobox", { name: "Outcome" }).selectOption("touch-up");
    expect(await isShown(row)).toBe(true);
    await page.getByRole("combobox", { name: "Outcome" }).selectOption("");
    await screenshot(page, "shots-technique-uses");
    await context.close();
  });

  it("the shot page lists the technique with its outcome and the after still's thumbnail", async () => {
    const { context, page } = await signIn(browser, app.baseUrl, "artist@kestrel.test");
    await page.goto(`/shots/${USED_SHOT}`);
    const item = page.getByTestId("shot-use").filter({ has: page.getByRole("link", { name: TECHNIQUE_TITLE, exact: true }) });
    expect(await isShown(item)).toBe(true);
    expect(await item.textContent()).toContain("Needed touch-up");
    const thumb = item.getByRole("img", { name: `After cleanup on ${USED_SHOT}` });
    await thumb.waitFor();
    await thumb.scrollIntoViewIfNeeded();
    await page.waitForFunction((el) => el instanceof HTMLImageElement && el.complete && el.naturalWidth > 0, await thumb.elementHandle(), { timeout: 15_000 });

    // The thumbnail is the uploaded frame: sharp decodes it, the 16:9 shape is kept, and a flat
    // field keeps its colour through resizing and lossy coding (within 3 of 255, from memory).
    const src = await thumb.getAttribute("src");
    expect(src).toMatch(/^\/api\/stills\/[^/]+\/thumb$/);
    const res = await page.request.get(src!);
    expect(res.status()).toBe(200);
    const bytes = await res.body();
    const meta = await sharp(bytes).metadata();
    expect(meta.width! / meta.height!).toBeCloseTo(STILL.width / STILL.height, 1);
    expect(Math.max(meta.width!, meta.height!)).toBeLessThanOrEqual(STILL.width);
    const stats = await sharp(bytes).stats();
    const [r, g, b] = stats.channels.map((c) => c.mean);
    expect(Math.abs(r! - STILL.colour.r)).toBeLessThanOrEqual(3);
    expect(Math.abs(g! - STILL.colour.g)).toBeLessThanOrEqual(3);
    expect(Math.abs(b! - STILL.colour.b)).toBeLessThanOrEqual(3);
    await screenshot(page, "shots-shot-page");
    await context.close();
  });

  it("a lead opening Retire… sees the shots that used the technique, without retiring it", async () => {
    const { context, page } = await signIn(browser, app.baseUrl, "lead@kestrel.test");
    await page.goto(`/techniques/${TECHNIQUE}`);
    await page.getByRole("button", { name: "Retire…" }).click();
    const dialog = page.getByRole("dialog");
    await dialog.waitFor();
    // The seeded uses (scripts/seed/data/techniques.ts: SLM_040_0120, SLM_040_0130, SLM_070_0010,
    // LTH_104_0030, LTH_101_0020) and the one logged above, each shot once.
    const expected = ["LTH_101_0020", "LTH_104_0030", "SLM_040_0120", "SLM_040_0130", "SLM_070_0010", USED_SHOT];
    const heading = dialog.getByText(/^Shots that used it \(\d+\)$/);
    await heading.filter({ hasText: `(${expected.length})` }).waitFor();
    const list = dialog.getByTestId("follow-up-shots");
    await list.waitFor();
    const listed = (await list.getByRole("listitem").allTextContents()).map((t) => t.trim().split(/\s/)[0]);
    expect([...listed].sort()).toEqual(expected);
    await screenshot(page, "shots-retire-dialog");

    await dialog.getByRole("button", { name: "Cancel" }).click();
    await dialog.waitFor({ state: "hidden" });
    // Not confirmed, so nothing changed: the technique is still approved and can still be retired.
    const res = await page.request.get(`/api/techniques/${TECHNIQUE}`);
    expect((await res.json()).status).toBe("approved");
    expect(await isShown(page.getByRole("button", { name: "Retire…" }))).toBe(true);
    await context.close();
  });
});
