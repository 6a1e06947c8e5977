import type { BrowserContext, Page } from "playwright-core";
import { describe, expect, it } from "vitest";
import { hasChromium, isShown, screenshot, signIn, whenHydrated } from "@/tests/e2e/harness";
import { useAppAndBrowser } from "@/tests/e2e/running-app";
import { networkQuiet, seriousViolations, watchRequests } from "@/tests/e2e/axe";

/*
 * Issue 13, item 9: every page, for every role, checked in Chromium with axe-core (Deque's engine
 * of the WCAG 2.1 rules, an outside checker): no serious or critical violation. Also the quick
 * finder hands focus to the page it opens.
 */

const MARKER = "marker-channel-cleanup";
const PENDING_EDIT = "boom-shadow-lift-by-gain-matching";
const EVERYONE = [
  "/",
  "/techniques",
  "/problems",
  "/problems/tracking-markers",
  "/search?q=marker",
  "/search?q=zzzz+nothing+like+this",
  // Partial matches (the request after the results) and notes naming where a related word came from.
  "/search?q=someone+walking+in+the+back+of+the+shot",
  "/shows",
  "/shows/SLM",
  "/shots/SLM_040_0120",
  "/settings",
  "/check",
  `/techniques/${MARKER}`,
  `/techniques/${MARKER}/history`,
  "/no/such/page",
];
const WRITERS = ["/techniques/new", `/techniques/${MARKER}/edit`, `/techniques/${PENDING_EDIT}`];
const LEADS = ["/review", `/techniques/${PENDING_EDIT}/review`];
const ADMINS = ["/people", "/mail", "/mail?tab=delivered", "/audit"];

const ROLES: Record<string, string[]> = {
  "artist@kestrel.test": [...EVERYONE, "/review"],
  "senior@kestrel.test": [...EVERYONE, ...WRITERS],
  "lead@kestrel.test": [...EVERYONE, ...WRITERS, ...LEADS],
  "admin@kestrel.test": [...EVERYONE, ...ADMINS],
};

/** Pages checked at once per person: their waits for the server and the network overlap. */
const TABS = 3;

/** Waits for client rendering to settle: lists that load after paint, then the editor's toolbar. */
async function settle(page: Page): Promise<void> {
  await networkQuiet(page);
  if (/\/edit$|\/new$/.test(new URL(page.url()).pathname)) await page.getByRole("toolbar", { name: "Formatting" }).waitFor();
}

/**
 * Opens each address in one of a few tabs of the signed-in context and runs axe-core on it once
 * it has settled; the violations, each prefixed with the address (and `label`).
 */
async function sweep(context: BrowserContext, urls: string[], label = ""): Promise<string[]> {
  const queue = [...urls];
  const found: string[] = [];
  await Promise.all(
    Array.from({ length: Math.min(TABS, queue.length) }, async () => {
      const page = await context.newPage();
      watchRequests(page);
      for (let url = queue.shift(); url !== undefined; url = queue.shift()) {
        await page.goto(url);
        await settle(page);
        for (const v of await seriousViolations(page)) found.push(`${url}${label}: ${v}`);
      }
      await page.close();
    }),
  );
  return found;
}

describe.skipIf(!hasChromium())("accessibility of every page for every role (axe-core)", () => {
  const running = useAppAndBrowser();

  for (const [email, paths] of Object.entries(ROLES)) {
    it(`${email.split("@")[0]}: no serious or critical violations, in both themes on the technique page`, async () => {
      const { context } = await signIn(running.browser, running.app.baseUrl, email);
      const found = await sweep(context, paths);
      // The light theme has its own colours: check the densest page in it too.
      await context.addCookies([{ name: "plateroom-theme", value: "light", url: running.app.baseUrl }]);
      found.push(...(await sweep(context, [`/techniques/${MARKER}`], " (light)")));
      expect(found, found.join("\n")).toEqual([]);
      await context.close();
    });
  }

  it("the trade thesaurus (read by an artist, edited by a lead) and a still's own page pass too", async () => {
    const found: string[] = [];
    for (const email of ["artist@kestrel.test", "lead@kestrel.test"]) {
      const { context, page } = await signIn(running.browser, running.app.baseUrl, email);
      watchRequests(page);
      await page.goto("/thesaurus");
      await settle(page);
      for (const v of await seriousViolations(page)) found.push(`${email} /thesaurus: ${v}`);
      // A still's page (the plate check of a demo still), reached from the technique's evidence.
      await page.goto(`/techniques/${MARKER}`);
      const still = await page.locator('a[href^="/stills/"]').first().getAttribute("href");
      expect(still).toMatch(/^\/stills\/[0-9a-f-]{36}$/);
      await page.goto(still!);
      await settle(page);
      for (const v of await seriousViolations(page)) found.push(`${email} ${still}: ${v}`);
      await context.close();
    }
    expect(found, found.join("\n")).toEqual([]);
  });

  it("signed out: the sign-in pages", async () => {
    const context = await running.browser.newContext({ baseURL: running.app.baseUrl });
    const found = await sweep(context, ["/login", "/forgot-password", "/set-password?token=nothing", "/unsubscribe?token=nothing"]);
    expect(found, found.join("\n")).toEqual([]);
    await context.close();
  });

  it("open dialogs pass too: the quick finder with results, the still dialog, the approve dialog", async () => {
    const { context, page } = await signIn(running.browser, running.app.baseUrl, "lead@kestrel.test");
    const found: string[] = [];
    await page.goto("/techniques");
    await page.getByTestId("quick-finder-button").click();
    await page.getByRole("combobox", { name: "Find a technique" }).fill("marker");
    await page.getByRole("option").first().waitFor();
    for (const v of await seriousViolations(page)) found.push(`finder: ${v}`);
    await page.keyboard.press("Escape");

    watchRequests(page);
    await page.goto(`/techniques/${MARKER}/edit`);
    await settle(page);
    await page.getByRole("toolbar", { name: "Formatting" }).getByRole("button", { name: "Add a still" }).click();
    await page.getByRole("dialog", { name: "Add a still" }).waitFor();
    for (const v of await seriousViolations(page)) found.push(`still dialog: ${v}`);
    await page.keyboard.press("Escape");

    await page.goto(`/techniques/${PENDING_EDIT}`);
    await page.getByRole("button", { name: /^Approve revision/ }).click();
    await page.getByRole("dialog").waitFor();
    for (const v of await seriousViolations(page)) found.push(`approve dialog: ${v}`);
    expect(found, found.join("\n")).toEqual([]);
    await context.close();
  });

  it("the quick finder moves focus to the page it opens", async () => {
    const { context, page } = await signIn(running.browser, running.app.baseUrl, "artist@kestrel.test");
    await page.goto("/problems");
    // The shortcut is a client listener: before hydration the key press goes nowhere.
    await whenHydrated(page);
    await page.keyboard.press("Control+k");
    const box = page.getByRole("combobox", { name: "Find a technique" });
    await box.fill("marker channel");
    await page.getByRole("option", { name: /Marker channel cleanup/ }).waitFor();
    await page.keyboard.press("ArrowDown");
    await page.keyboard.press("Enter");
    await page.waitForURL(new RegExp(`/techniques/${MARKER}$`));
    await page.getByRole("heading", { level: 1, name: "Marker channel cleanup" }).waitFor();
    await expect.poll(() => page.evaluate(() => document.activeElement?.id ?? document.activeElement?.tagName)).toBe("main");
    // The next Tab goes into the page content, not back into the header.
    await page.keyboard.press("Tab");
    expect(await page.evaluate(() => Boolean(document.activeElement?.closest("main")))).toBe(true);
    expect(await isShown(page.getByRole("dialog", { name: "Find a technique" }), 500)).toBe(false);
    await screenshot(page, "finder-focus-main");
    await context.close();
  });
});
