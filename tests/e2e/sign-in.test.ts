import { describe, expect, it } from "vitest";
import { hasChromium, isShown, screenshot, signIn } from "@/tests/e2e/harness";
import { useAppAndBrowser } from "@/tests/e2e/running-app";

const NAV: Record<string, { sees: string[]; doesNotSee: string[] }> = {
  "artist@kestrel.test": { sees: ["Techniques", "Search", "Shows", "Settings"], doesNotSee: ["People", "Review", "Mail"] },
  "senior@kestrel.test": { sees: ["Techniques", "Search", "Shows", "Settings"], doesNotSee: ["People", "Review", "Mail"] },
  "lead@kestrel.test": { sees: ["Techniques", "Review", "Shows", "Thesaurus", "Settings"], doesNotSee: ["People", "Mail"] },
  "admin@kestrel.test": { sees: ["People", "Mail", "Audit", "Settings", "Techniques"], doesNotSee: ["Review", "Thesaurus"] },
};

describe.skipIf(!hasChromium())("sign-in and roles in Chromium", () => {
  const running = useAppAndBrowser();

  for (const [email, nav] of Object.entries(NAV)) {
    it(`${email} signs in and sees their own navigation`, async () => {
      const { context, page } = await signIn(running.browser, running.app.baseUrl, email);
      const main = page.getByRole("navigation", { name: "Main" });
      // At 1400 px (signIn's viewport) the bar keeps to one row: the nav is one link tall and level with "Sign out".
      const [navBox, linkBox, signOutBox] = await Promise.all([main.boundingBox(), main.getByRole("link").first().boundingBox(), page.getByRole("button", { name: "Sign out" }).boundingBox()]);
      expect(navBox!.height).toBeLessThanOrEqual(linkBox!.height + 1);
      expect(Math.abs(navBox!.y + navBox!.height / 2 - (signOutBox!.y + signOutBox!.height / 2))).toBeLessThan(4);
      // Less-used destinations sit under one menu, opened from the keyboard.
      const menu = main.getByRole("button", { name: "Housekeeping" });
      if ((await menu.count()) > 0) {
        await menu.focus();
        await page.keyboard.press("ArrowDown");
        await expect.poll(() => page.evaluate(() => document.activeElement?.closest("ul") !== null)).toBe(true);
      }
      for (const label of nav.sees) expect(await isShown(main.getByRole("link", { name: new RegExp(`^${label}`) }))).toBe(true);
      for (const label of nav.doesNotSee) expect(await main.getByRole("link", { name: new RegExp(`^${label}`) }).count()).toBe(0);
      await screenshot(page, `home-${email.split("@")[0]}`);
      await context.close();
    });
  }

  it("refuses an artist who opens the People page, in the page and in the API", async () => {
    const { context, page } = await signIn(running.browser, running.app.baseUrl, "artist@kestrel.test");
    await page.goto("/people");
    expect(await isShown(page.getByTestId("refused"))).toBe(true);
    const res = await page.request.get("/api/people");
    expect(res.status()).toBe(403);
    expect((await res.json()).error.code).toBe("forbidden");
    await context.close();
  });

  it("shows one generic message for a wrong password and for an unknown e-mail", async () => {
    const context = await running.browser.newContext({ baseURL: running.app.baseUrl });
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

  /** A script's sign-in, the standard Auth.js way (shared/API.md, "Calling it"). */
  async function scriptSignInResponse(email: string, password: string, forwardedFor?: string): Promise<Response & { jar: string }> {
    const csrfRes = await fetch(`${running.app.baseUrl}/api/auth/csrf`);
    const { csrfToken } = (await csrfRes.json()) as { csrfToken: string };
    const jar = csrfRes.headers.getSetCookie().map((c) => c.split(";")[0]).join("; ");
    const res = await fetch(`${running.app.baseUrl}/api/auth/callback/credentials`, {
      method: "POST",
      headers: { "Content-Type": "application/x-www-form-urlencoded", cookie: jar, ...(forwardedFor ? { "X-Forwarded-For": forwardedFor } : {}) },
      body: new URLSearchParams({ csrfToken, email, password }),
      redirect: "manual",
    });
    return Object.assign(res, { jar });
  }

  async function scriptSignIn(email: string, password: string, forwardedFor?: string): Promise<{ status: number; cookie: string }> {
    const res = await scriptSignInResponse(email, password, forwardedFor);
    const cookie = [res.jar, ...res.headers.getSetCookie().map((c) => c.split(";")[0])].join("; ");
    return { status: res.status, cookie };
  }

  it("signs each demo role in through /api/auth/csrf and the credentials callback, and /api/me answers its role", async () => {
    for (const role of ["artist", "senior", "lead", "admin"]) {
      const { cookie } = await scriptSignIn(`${role}@kestrel.test`, "plateroom-demo");
      const me = await fetch(`${running.app.baseUrl}/api/me`, { headers: { cookie } });
      expect(me.status).toBe(200);
      expect(await me.json()).toMatchObject({ email: `${role}@kestrel.test`, role });
    }
    const wrong = await scriptSignIn("lead@kestrel.test", "not-the-password");
    expect((await fetch(`${running.app.baseUrl}/api/me`, { headers: { cookie: wrong.cookie } })).status).toBe(401);
  });

  it("slows one account with growing delays whatever X-Forwarded-For says, and says when to try again (OWASP Authentication Cheat Sheet)", async () => {
    // A fresh, invented address per try (RFC 5737 documentation range): without trusted proxies the
    // header is ignored, so rotating it neither escapes the account's delay nor spreads it.
    const statuses: number[] = [];
    for (let i = 0; i < 5; i++) statuses.push((await scriptSignIn("senior@kestrel.test", `wrong-${i}`, `203.0.113.${i + 1}`)).status);
    expect(statuses.every((s) => s !== 429)).toBe(true);
    const held = await scriptSignInResponse("senior@kestrel.test", "plateroom-demo", "203.0.113.77");
    expect(held.status).toBe(429);
    const retryAfter = Number(held.headers.get("retry-after"));
    expect(retryAfter).toBeGreaterThanOrEqual(1);
    expect(((await held.json()) as { error: { message: string } }).error.message).toMatch(/Try again in \d+ seconds?/);
    // Other people behind the same connection are not held up.
    const other = await scriptSignIn("lead@kestrel.test", "plateroom-demo", "203.0.113.78");
    expect((await fetch(`${running.app.baseUrl}/api/me`, { headers: { cookie: other.cookie } })).status).toBe(200);
    await new Promise((r) => setTimeout(r, retryAfter * 1000 + 200));
    const after = await scriptSignIn("senior@kestrel.test", "plateroom-demo");
    expect((await fetch(`${running.app.baseUrl}/api/me`, { headers: { cookie: after.cookie } })).status).toBe(200);
  });

  it("counts reset requests by the connection's address, not by X-Forwarded-For (OWASP Forgot Password Cheat Sheet)", async () => {
    const reset = (i: number) =>
      fetch(`${running.app.baseUrl}/api/password-resets`, {
        method: "POST",
        headers: { "content-type": "application/json", "x-forwarded-for": `198.51.100.${i}` },
        body: JSON.stringify({ email: `nobody-${i}@kestrel.test` }),
      });
    const statuses: number[] = [];
    for (let i = 1; i <= 11; i++) statuses.push((await reset(i)).status);
    expect(statuses.slice(0, 10)).toEqual(Array(10).fill(202));
    expect(statuses[10]).toBe(429);
  });
});
