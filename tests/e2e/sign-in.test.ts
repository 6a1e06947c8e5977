import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { hasChromium, isShown, launchBrowser, screenshot, signIn, startApp, type RunningApp } from "@/tests/e2e/harness";

const NAV: Record<string, { sees: string[]; doesNotSee: string[] }> = {
  "artist@kestrel.test": { sees: ["Techniques", "Search", "Shows", "Settings"], doesNotSee: ["People", "Review", "Mail"] },
  "senior@kestrel.test": { sees: ["Techniques", "Search", "Shows", "Settings"], doesNotSee: ["People", "Review", "Mail"] },
  "lead@kestrel.test": { sees: ["Techniques", "Review", "Shows"], doesNotSee: ["People", "Mail"] },
  "admin@kestrel.test": { sees: ["People", "Mail", "Audit", "Techniques"], doesNotSee: ["Review"] },
};

describe.skipIf(!hasChromium())("sign-in and roles in Chromium", () => {
  let app: RunningApp;
  let browser: Browser;

  beforeAll(async () => {
    app = await startApp();
    browser = await launchBrowser();
  }, 600_000);

  afterAll(async () => {
    await browser?.close();
    await app?.stop();
  });

  for (const [email, nav] of Object.entries(NAV)) {
    it(`${email} signs in and sees their own navigation`, async () => {
      const { context, page } = await signIn(browser, app.baseUrl, email);
      const main = page.getByRole("navigation", { name: "Main" });
      for (const label of nav.sees) expect(await isShown(main.getByRole("link", { name: new RegExp(`^${label}`) }))).toBe(true);
      for (const label of nav.doesNotSee) expect(await main.getByRole("link", { name: new RegExp(`^${label}`) }).count()).toBe(0);
      await screenshot(page, `home-${email.split("@")[0]}`);
      await context.close();
    });
  }

  it("refuses an artist who opens the People page, in the page and in the API", async () => {
    const { context, page } = await signIn(browser, app.baseUrl, "artist@kestrel.test");
    await page.goto("/people");
    expect(await isShown(page.getByTestId("refused"))).toBe(true);
    const res = await page.request.get("/api/people");
    expect(res.status()).toBe(403);
    expect((await res.json()).error.code).toBe("forbidden");
    await context.close();
  });

  it("shows one generic message for a wrong password and for an unknown e-mail", async () => {
    const context = await browser.newContext({ baseURL: app.baseUrl });
    const page = await context.newPage();
    const messages: string[] = [];
    for (const email of ["artist@kestrel.test", "nobody@kestrel.test"]) {
      await page.goto("/login");
      await page.getByLabel("E-mail").fill(email);
      await page.getByLabel("Password").fill("wrong-password-123");
      await page.getByRole("button", { name: "Sign in" }).click();
      const alert = page.getByTestId("sign-in-error");
      await alert.waitFor();
      messages.push((await alert.textContent()) ?? "");
    }
    // OWASP Authentication Cheat Sheet: the same response for a wrong password and an unknown account.
    expect(messages[0]).toBe(messages[1]);
    expect(page.url()).toContain("/login");
    await screenshot(page, "sign-in-refused");
    await context.close();
  });
});
