import { describe, expect, it } from "vitest";
import { hasChromium, isShown, screenshot, signIn } from "@/tests/e2e/harness";
import { useAppAndBrowser } from "@/tests/e2e/running-app";

const NAV: Record<string, { sees: string[]; doesNotSee: string[] }> = {
  "artist@kestrel.test": { sees: ["Techniques", "Search", "Shows", "Settings"], doesNotSee: ["People", "Review", "Mail"] },
  "senior@kestrel.test": { sees: ["Techniques", "Search", "Shows", "Settings"], doesNotSee: ["People", "Review", "Mail"] },
  "lead@kestrel.test": { sees: ["Techniques", "Review", "Shows"], doesNotSee: ["People", "Mail"] },
  "admin@kestrel.test": { sees: ["People", "Mail", "Audit", "Techniques"], doesNotSee: ["Review"] },
};

describe.skipIf(!hasChromium())("sign-in and roles in Chromium", () => {
  const running = useAppAndBrowser();

  for (const [email, nav] of Object.entries(NAV)) {
    it(`${email} signs in and sees their own navigation`, async () => {
      const { context, page } = await signIn(running.browser, running.app.baseUrl, email);
      const main = page.getByRole("navigation", { name: "Main" });
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
  async function scriptSignIn(email: string, password: string, forwardedFor?: string): Promise<{ status: number; cookie: string }> {
    const csrfRes = await fetch(`${running.app.baseUrl}/api/auth/csrf`);
    const { csrfToken } = (await csrfRes.json()) as { csrfToken: string };
    const jar = csrfRes.headers.getSetCookie().map((c) => c.split(";")[0]).join("; ");
    const res = await fetch(`${running.app.baseUrl}/api/auth/callback/credentials`, {
      method: "POST",
      headers: { "Content-Type": "application/x-www-form-urlencoded", cookie: jar, ...(forwardedFor ? { "X-Forwarded-For": forwardedFor } : {}) },
      body: new URLSearchParams({ csrfToken, email, password }),
      redirect: "manual",
    });
    const cookie = [jar, ...res.headers.getSetCookie().map((c) => c.split(";")[0])].join("; ");
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

  it("answers 429 after 10 failed sign-ins for one e-mail within 15 minutes", async () => {
    // Earlier tests in this file already failed sign-ins from this address; a client address of its
    // own (a documentation address, RFC 5737; only a header value) leaves the e-mail's count to decide.
    const address = "203.0.113.7";
    const statuses: number[] = [];
    for (let i = 0; i < 11; i++) statuses.push((await scriptSignIn("senior@kestrel.test", `wrong-${i}`, address)).status);
    // The first ten fail the ordinary way (a redirect back with an error); the eleventh is refused outright.
    expect(statuses.slice(0, 10).every((s) => s !== 429)).toBe(true);
    expect(statuses[10]).toBe(429);
    // The right password is refused too while the limit holds (OWASP Authentication Cheat Sheet, throttling).
    expect((await scriptSignIn("senior@kestrel.test", "plateroom-demo", address)).status).toBe(429);
  });
});
