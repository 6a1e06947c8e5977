import { describe, expect, it } from "vitest";
import { hasChromium, signIn } from "@/tests/e2e/harness";
import { useAppAndBrowser } from "@/tests/e2e/running-app";

/** Response headers every page type must carry (issue 9; OWASP Secure Headers project, from memory). */
function expectSecurityHeaders(h: Headers, kind: "page" | "api") {
  expect(h.get("x-content-type-options")).toBe("nosniff");
  expect(h.get("referrer-policy")).toBe("strict-origin-when-cross-origin");
  expect(h.get("permissions-policy")).toContain("camera=()");
  const csp = h.get("content-security-policy") ?? "";
  // W3C CSP Level 3: frame-ancestors 'none' forbids framing (clickjacking); no 'unsafe-eval' in production.
  expect(csp).toContain("frame-ancestors 'none'");
  expect(csp).not.toContain("unsafe-eval");
  if (kind === "page") expect(csp).toMatch(/script-src 'self' 'nonce-[A-Za-z0-9+/=]+' 'strict-dynamic'/);
}

describe.skipIf(!hasChromium())("security headers on every page type", () => {
  const running = useAppAndBrowser();

  it("sign-in page, API JSON and API errors", async () => {
    // RFC 9110 §15.5.6: a wrong method on a real route is 405 with Allow, in the API's error shape.
    const wrong = await fetch(`${running.app.baseUrl}/api/health`, { method: "DELETE" });
    expect(wrong.status).toBe(405);
    expect(wrong.headers.get("allow")).toBe("GET, HEAD, OPTIONS");
    expect((await wrong.json()).error.code).toBe("method_not_allowed");
    expectSecurityHeaders(wrong.headers, "api");
    const login = await fetch(`${running.app.baseUrl}/login`);
    expectSecurityHeaders(login.headers, "page");
    const health = await fetch(`${running.app.baseUrl}/api/health`);
    expectSecurityHeaders(health.headers, "api");
    const refused = await fetch(`${running.app.baseUrl}/api/me`);
    expect(refused.status).toBe(401);
    expectSecurityHeaders(refused.headers, "api");
    expect(refused.headers.get("cache-control")).toContain("no-store");
  });

  it("signed-in pages: fresh nonce per request, and no CSP violations while they run", async () => {
    const { context, page } = await signIn(running.browser, running.app.baseUrl, "senior@kestrel.test");
    const violations: string[] = [];
    page.on("console", (msg) => {
      if (msg.type() === "error" && /Content Security Policy/i.test(msg.text())) violations.push(msg.text());
    });
    const nonces = new Set<string>();
    for (const path of ["/", "/techniques", "/techniques/marker-channel-cleanup", "/techniques/marker-channel-cleanup/history", "/problems/tracking-markers", "/shows", "/settings", "/no-such-page"]) {
      const res = await page.goto(path);
      expect(res).not.toBeNull();
      expectSecurityHeaders(new Headers(res!.headers()), "page");
      nonces.add(/nonce-([^']+)/.exec(res!.headers()["content-security-policy"] ?? "")?.[1] ?? "");
      await page.waitForLoadState("load");
    }
    expect(nonces.size).toBe(8);
    expect(violations).toEqual([]);
    await context.close();
  });

  it("refuses a cross-site write even with a valid session cookie", async () => {
    const { context, page } = await signIn(running.browser, running.app.baseUrl, "senior@kestrel.test");
    const res = await page.request.post("/api/tokens", { data: { name: "x" }, headers: { Origin: "https://elsewhere.example" } });
    expect(res.status()).toBe(403);
    const same = await page.request.post("/api/tokens", { data: { name: "same-site" }, headers: { Origin: running.app.baseUrl } });
    expect(same.status()).toBe(201);
    // RFC 6454: the same host and port over another scheme is another origin (this used to pass).
    const otherScheme = running.app.baseUrl.replace(/^http:/, "https:");
    expect((await page.request.post("/api/tokens", { data: { name: "x" }, headers: { Origin: otherScheme } })).status()).toBe(403);
    // W3C Fetch Metadata: a page on another site, even when no Origin header is sent.
    expect((await page.request.post("/api/tokens", { data: { name: "x" }, headers: { "Sec-Fetch-Site": "cross-site" } })).status()).toBe(403);
    // A server action posted to a page with the cookie from another origin: the same rule, in proxy.ts.
    const action = await page.request.post("/settings", { data: "[]", headers: { Origin: otherScheme, "Next-Action": "00" } });
    expect(action.status()).toBe(403);
    await context.close();
  });

  it("answers an oversized JSON body with 413 in the error shape over real HTTP (RFC 9110 §15.5.14)", async () => {
    const { context, page } = await signIn(running.browser, running.app.baseUrl, "senior@kestrel.test");
    const res = await page.request.post("/api/tokens", { data: JSON.stringify({ name: "x", pad: "x".repeat(2 * 1024 * 1024) }), headers: { "Content-Type": "application/json", Origin: running.app.baseUrl } });
    expect(res.status()).toBe(413);
    expect((await res.json()).error.code).toBe("too_large");
    await context.close();
  });
});
