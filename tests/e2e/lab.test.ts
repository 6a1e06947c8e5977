import type { Browser, Locator, Page, Response } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import fs from "node:fs";
import path from "node:path";
import { hasChromium, isShown, launchBrowser, SCREENSHOT_DIR, signIn, startApp, type RunningApp } from "@/tests/e2e/harness";
import { generateSyntheticPlate, type Box, type SyntheticPlate } from "@/lib/lab/synthetic";
import type { LabSolveResponse, RecipeStep } from "@/lib/lab/recipe";
import type { LabAnalyseResponse, LabSampleResponse } from "@/lib/lab/analysis-schemas";

/*
 * Issue 5, "Browser (Chromium)": a senior solves a colour-matrix row from samples picked on the
 * demo still, applies it, renders exact, and sees the line profile flatten across a marker.
 * The seed (scripts/seed/techniques.ts) stores generateSyntheticPlate({ 1280×720, seed 7, green }) as
 * the marker-cleanup technique's plate; regenerating it here tells us where its markers are.
 */

const SOURCE_SLUG = "marker-channel-cleanup";
const W = 1280, H = 720;

/** Still pixels → viewport pixels through the stage SVG's own transform (it letterboxes and scales). */
async function toClient(svg: Locator, x: number, y: number): Promise<{ x: number; y: number }> {
  return svg.evaluate(
    (el, [px, py]) => {
      const p = new DOMPoint(px, py).matrixTransform((el as SVGSVGElement).getScreenCTM()!);
      return { x: p.x, y: p.y };
    },
    [x, y] as [number, number],
  );
}

async function drag(page: Page, svg: Locator, from: { x: number; y: number }, to: { x: number; y: number }): Promise<void> {
  await svg.scrollIntoViewIfNeeded();
  const a = await toClient(svg, from.x, from.y), b = await toClient(svg, to.x, to.y);
  await page.mouse.move(a.x, a.y);
  await page.mouse.down();
  await page.mouse.move((a.x + b.x) / 2, (a.y + b.y) / 2, { steps: 3 });
  await page.mouse.move(b.x, b.y, { steps: 3 });
  await page.mouse.up();
}

/**
 * A viewport screenshot centred on `target`. Not the harness's full-page one: on this page, after
 * "Apply to recipe" refreshes it, a full-page capture (the viewport stretched to ~6000 px, so every
 * 70vh still stage grows with it) left headless Chromium unresponsive to input.
 */
async function snap(page: Page, name: string, target: Locator): Promise<void> {
  await target.first().evaluate((el) => el.scrollIntoView({ block: "center" }));
  fs.mkdirSync(SCREENSHOT_DIR, { recursive: true });
  await page.screenshot({ path: path.join(SCREENSHOT_DIR, `${name}.png`) });
}

const isPost = (path: string) => (r: Response) => new URL(r.url()).pathname === path && r.request().method() === "POST";
const dot = (a: readonly number[], b: readonly number[]) => a[0]! * b[0]! + a[1]! * b[1]! + a[2]! * b[2]!;
const mean = (v: number[]) => v.reduce((s, x) => s + x, 0) / v.length;

describe.skipIf(!hasChromium())("the still lab in Chromium", () => {
  let app: RunningApp;
  let browser: Browser;
  let plate: SyntheticPlate;

  beforeAll(async () => {
    [app, plate] = await Promise.all([startApp(), generateSyntheticPlate({ width: W, height: H, seed: 7, screen: "green" })]);
    browser = await launchBrowser();
  }, 900_000);

  afterAll(async () => {
    await browser?.close();
    await app?.stop();
  });

  it("a senior solves a matrix from picked samples, applies it, renders exact and sees the profile flatten", async () => {
    const { context, page } = await signIn(browser, app.baseUrl, "senior@kestrel.test");
    // A draft copy of the demo technique with the same plate and recipe, so applying a matrix makes
    // a revision of the senior's own draft and leaves the approved demo technique as it is.
    const demo = (await (await page.request.get(`/api/techniques/${SOURCE_SLUG}`)).json()) as { title: string; summary: string; body: unknown; recipe: RecipeStep[] };
    const created = await page.request.post("/api/techniques", {
      data: { title: `${demo.title} (lab trial)`, summary: demo.summary, body: demo.body, recipe: demo.recipe },
    });
    expect(created.status()).toBe(201);
    const SLUG = ((await created.json()) as { slug: string }).slug;
    const upload = await page.request.post("/api/stills", {
      multipart: {
        file: { name: "plate.png", mimeType: "image/png", buffer: plate.plate },
        alt: "Synthetic green backing screen with tracking markers and a foreground shape",
        technique: SLUG,
        role: "before",
      },
    });
    expect(upload.status()).toBe(201);
    await page.goto(`/techniques/${SLUG}`);
    const lab = page.getByRole("region", { name: "Still lab" });
    expect(await isShown(lab, 30_000)).toBe(true);
    // The plate (not its denoised twin) is the still to work on.
    const plateOption = (await lab.locator("option", { hasText: "Synthetic green backing screen" }).first().textContent()) ?? "";
    await lab.getByLabel("Still", { exact: true }).selectOption({ label: plateOption });

    // --- The live preview: a matrix number changes the SVG feColorMatrix at once, without a server call.
    const fe = lab.locator("filter feColorMatrix").first();
    expect(await isShown(lab.getByRole("spinbutton", { name: "G out from R in" }))).toBe(true);
    const apiCalls: string[] = [];
    const onRequest = (r: { url(): string }) => {
      if (new URL(r.url()).pathname.startsWith("/api/")) apiCalls.push(r.url());
    };
    page.on("request", onRequest);
    await lab.getByRole("spinbutton", { name: "G out from R in" }).fill("0.25");
    // W3C Filter Effects Module Level 1, feColorMatrix: `values` is the 4×5 matrix row-major, so
    // the green row's red coefficient is the 6th number (index 5).
    await expect.poll(async () => (await fe.getAttribute("values"))?.trim().split(/\s+/).map(Number)[5]).toBe(0.25);
    expect((await fe.getAttribute("values"))!.trim().split(/\s+/)).toHaveLength(20);
    page.off("request", onRequest);
    expect(apiCalls).toEqual([]);
    // Back to the technique's own recipe before solving.
    await lab.getByRole("button", { name: "Back to the technique's recipe" }).click();
    await expect.poll(async () => (await fe.getAttribute("values"))?.trim().split(/\s+/).map(Number)[5]).not.toBe(0.25);

    // --- The solver: drag marker boxes and screen boxes on the still.
    await lab.getByRole("tab", { name: "Matrix solver" }).click();
    const pickStage = lab.getByRole("img", { name: /Drag to add a (marker|screen) sample box/ });
    expect(await isShown(pickStage)).toBe(true);
    const picked = lab.getByRole("list", { name: "Picked samples" }).getByRole("listitem");
    const pick = async (kind: "marker" | "screen", boxes: Box[]) => {
      await lab.getByLabel("Next box samples", { exact: true }).selectOption(kind);
      for (const b of boxes) {
        const before = await picked.count();
        await drag(page, pickStage, { x: b.x + 0.2, y: b.y + 0.2 }, { x: b.x + b.w - 0.2, y: b.y + b.h - 0.2 });
        await expect.poll(() => picked.count()).toBe(before + 1);
      }
    };
    // The seed's sample pair: one dot of each marker hue near the light's centre, and screen boxes around them.
    await pick("marker", plate.markerBoxes);
    await pick("screen", plate.screenBoxes);
    expect(await picked.count()).toBe(plate.markerBoxes.length + plate.screenBoxes.length);
    await lab.getByLabel("Goal", { exact: true }).selectOption("hide");
    await lab.getByLabel("Channel", { exact: true }).selectOption("g");
    await snap(page, "lab-solver-picked", pickStage);

    const sampled = page.waitForResponse(isPost("/api/lab/sample"));
    const solvedRes = page.waitForResponse(isPost("/api/lab/solve"));
    await lab.getByRole("button", { name: "Solve" }).click();
    const samples = ((await (await sampled).json()) as LabSampleResponse).samples;
    const solved = (await (await solvedRes).json()) as LabSolveResponse;
    const table = lab.getByRole("table", { name: /Solved matrix/ });
    expect(await isShown(table)).toBe(true);
    // The drawn boxes landed where they were meant to: the demo's markers (pink and yellow) are far
    // redder than its green screen, so every marker sample's R is above every screen sample's R.
    const markerR = samples.slice(0, plate.markerBoxes.length).map((v) => v[0]);
    const screenR = samples.slice(plate.markerBoxes.length).map((v) => v[0]);
    expect(Math.min(...markerR)).toBeGreaterThan(2 * Math.max(...screenR));
    // The "hide" goal's definition (issue 5, "The solver"): r·m_i = r·s for every marker and r·s = s_c.
    const s = [0, 1, 2].map((c) => mean(samples.slice(plate.markerBoxes.length).map((v) => v[c]!)));
    for (const m of samples.slice(0, plate.markerBoxes.length)) expect(Math.abs(dot(solved.row, m) - dot(solved.row, s))).toBeLessThan(1e-9);
    expect(Math.abs(dot(solved.row, s) - s[1]!)).toBeLessThan(1e-9);
    // Residual contrast below 0.01 in linear light: under the ~1 % Weber fraction for luminance
    // differences (from memory), so what is left of a marker is not visible. Two marker shades and
    // one screen give three equations in three unknowns, so the server's solve should be near exact.
    expect(solved.residual).toBeLessThan(0.01);
    const shownResidual = lab.getByText("Residual contrast").locator("xpath=following-sibling::dd[1]");
    expect((await shownResidual.textContent())?.trim()).toBe(solved.residual.toExponential(2));
    // The green row is the one shown as changed, with the solved numbers.
    const gRow = table.getByRole("row", { name: /G out/ });
    expect((await gRow.getByRole("cell").allTextContents()).map(Number)).toEqual(solved.matrix[1].map((v) => Number(v.toFixed(5))));
    await snap(page, "lab-solver-solved", table);

    // --- Apply it to the recipe: saved as a new revision, and the preview's matrix holds the solved numbers.
    const before = (await (await page.request.get(`/api/techniques/${SLUG}`)).json()) as { recipe: RecipeStep[]; latestRevision: number };
    const saved = page.waitForResponse((r) => new URL(r.url()).pathname === `/api/techniques/${SLUG}` && r.request().method() === "PUT");
    await lab.getByRole("button", { name: "Apply to recipe" }).click();
    expect((await saved).status()).toBe(200);
    expect(await isShown(page.getByText(`Saved into the recipe as revision ${before.latestRevision + 1}`))).toBe(true);
    const after = (await (await page.request.get(`/api/techniques/${SLUG}`)).json()) as { recipe: RecipeStep[]; latestRevision: number };
    expect(after.latestRevision).toBe(before.latestRevision + 1);
    // Only the first matrix step changed; every other step is kept as it was.
    const mi = before.recipe.findIndex((st) => st.op === "matrix");
    expect(after.recipe).toEqual(before.recipe.map((st, i) => (i === mi ? { op: "matrix", m: solved.matrix } : st)));
    const gFromR = lab.getByRole("spinbutton", { name: "G out from R in" });
    expect(await isShown(gFromR)).toBe(true);
    expect(Number(await gFromR.inputValue())).toBe(solved.matrix[1][0]);
    await expect.poll(async () => (await fe.getAttribute("values"))?.trim().split(/\s+/).map(Number).slice(5, 8)).toEqual(solved.matrix[1]);

    await snap(page, "lab-applied", lab.getByRole("button", { name: /^Render exact/ }));
    // --- Render exact: hold the server's answer until the progress has been seen, then let it through.
    let release!: () => void;
    const held = new Promise<void>((r) => (release = r));
    await page.route("**/api/lab/run", async (route) => {
      const res = await route.fetch();
      await held;
      await route.fulfill({ response: res });
    });
    const runRes = page.waitForResponse(isPost("/api/lab/run"));
    // The click is not awaited first: Playwright may hold the click's completion while the routed request is held.
    const clicked = lab.getByRole("button", { name: /^Render exact/ }).click();
    const progressShown = await isShown(lab.getByText(/Rendering .* in floating point/), 20_000);
    if (progressShown) await snap(page, "lab-rendering", lab.getByText(/Rendering .* in floating point/));
    release();
    await clicked;
    expect(progressShown).toBe(true);
    const run = await runRes;
    expect(run.status()).toBe(200);
    expect(run.headers()["x-lab-width"]).toBe(String(W));
    await page.unroute("**/api/lab/run");
    expect(await isShown(lab.getByText(/exact render in .* s/), 60_000)).toBe(true);
    expect(await lab.getByText(/Rendering .* in floating point/).count()).toBe(0);
    const compare = lab.getByRole("img", { name: /plate on the left, lab result on the right/ });
    expect(await isShown(compare)).toBe(true);
    // The result image is the blob the server sent, decoded by the browser at the still's size.
    const decoded = await compare.locator("image").nth(1).evaluate(async (el) => {
      const img = new Image();
      img.src = (el as SVGImageElement).href.baseVal;
      await img.decode();
      return [img.naturalWidth, img.naturalHeight];
    });
    expect(decoded).toEqual([W, H]);
    await snap(page, "lab-rendered", compare);

    // --- Line profile across a pink marker dot (the sample pair's left dot), before vs after.
    await lab.getByRole("tab", { name: "Line profile" }).click();
    const lineStage = lab.getByRole("img", { name: /Drag a line across a marker/ });
    expect(await isShown(lineStage)).toBe(true);
    const marker = plate.markers.find((m) => m.kind === "dot" && m.hue === 0 && Math.abs(m.x - 0.45 * W) < 40 && Math.abs(m.y - 0.35 * H) < 5)!;
    expect(marker).toBeDefined();
    const y = Math.round(marker.y);
    const analysed = page.waitForResponse(isPost("/api/lab/analyse"));
    await drag(page, lineStage, { x: marker.x - 20, y }, { x: marker.x + 20, y });
    const profileRes = await analysed;
    expect(profileRes.status()).toBe(200);
    const data = (await profileRes.json()) as LabAnalyseResponse;
    expect(await isShown(lab.getByRole("figure", { name: /Line profile/ }))).toBe(true);
    const plateLine = data.before.profile!, resultLine = data.after!.profile!;
    expect(plateLine.g.length).toBeGreaterThan(20);
    // Inside the dot (well within its radius) vs the screen beside it (clear of its anti-aliased
    // edge and of the recipe's matte growth and softening).
    const inside = plateLine.x.map((x, i) => (Math.abs(x - marker.x) < marker.size - 1.5 ? i : -1)).filter((i) => i >= 0);
    const outside = plateLine.x.map((x, i) => (Math.abs(x - marker.x) > marker.size + 6 ? i : -1)).filter((i) => i >= 0);
    expect(inside.length).toBeGreaterThan(3);
    expect(outside.length).toBeGreaterThan(6);
    const contrast = (g: number[]) => Math.abs(mean(inside.map((i) => g[i]!)) - mean(outside.map((i) => g[i]!)));
    const beforeContrast = contrast(plateLine.g), afterContrast = contrast(resultLine.g);
    // Before: a pink marker on a green screen is a deep dip in G.
    expect(beforeContrast).toBeGreaterThan(0.1);
    // After: the marker's dip is gone down to a tenth of it (what is left is grain, which the recipe
    // restores on purpose: common practice, no published source).
    expect(afterContrast).toBeLessThan(beforeContrast / 10);
    // The line the person drew is the one profiled, in full-resolution pixels.
    expect(Math.abs(plateLine.x[0]! - (marker.x - 20))).toBeLessThan(1.5);
    expect(Math.abs(plateLine.x.at(-1)! - (marker.x + 20))).toBeLessThan(1.5);
    await snap(page, "lab-line-profile", lab.getByRole("figure", { name: /Line profile/ }));
    await context.close();
  }, 300_000);
});
