import { describe, expect, it } from "vitest";
import { apiClient, createApiToken, signInCookie } from "@/bench/lib/http-client";
import { DEMO_PASSWORD, hasChromium, signIn } from "@/tests/e2e/harness";
import { useAppAndBrowser } from "@/tests/e2e/running-app";

/**
 * Technique pages are answered from lib/page-cache when nothing they show has changed (issue 9,
 * load). What must still hold: every answer has its own CSP nonce, a change by anyone shows on
 * the next load, each person gets their own copy, and a disabled person gets nothing.
 */
const PAGE = "/techniques/marker-channel-cleanup";

function noncesIn(html: string): Set<string> {
  return new Set([...html.matchAll(/nonce="([^"]+)"/g)].map((m) => m[1]!));
}

/** What a browser sends when it navigates to a page (W3C Fetch Metadata Request Headers). */
const NAVIGATION = { accept: "text/html", "sec-fetch-dest": "document", "sec-fetch-mode": "navigate" };

async function load(baseUrl: string, cookie: string) {
  const res = await fetch(`${baseUrl}${PAGE}`, { headers: { cookie, ...NAVIGATION }, redirect: "manual" });
  const html = await res.text();
  const nonce = /'nonce-([^']+)'/.exec(res.headers.get("content-security-policy") ?? "")?.[1];
  return { res, html, nonce, cache: res.headers.get("x-plateroom-page-cache") };
}

describe.skipIf(!hasChromium())("cached technique pages", () => {
  const running = useAppAndBrowser();

  it("answers a reload from the cache with a fresh nonce in the policy and in every script", async () => {
    const cookie = await signInCookie(running.app.baseUrl, "senior@kestrel.test", DEMO_PASSWORD);
    const first = await load(running.app.baseUrl, cookie);
    expect(first.res.status).toBe(200);
    const second = await load(running.app.baseUrl, cookie);
    expect(second.cache).toBe("hit");
    expect(second.nonce).toBeTruthy();
    expect(second.nonce).not.toBe(first.nonce);
    // W3C CSP Level 3 §6.7.2.3: a script runs only if its nonce equals the policy's, so the
    // cached page must carry this answer's nonce and no other.
    expect([...noncesIn(second.html)]).toEqual([second.nonce]);
    expect(second.html).not.toContain(first.nonce!);
    // Same page, apart from the nonce.
    expect(second.html.replaceAll(second.nonce!, "N")).toBe(first.html.replaceAll(first.nonce!, "N"));
    // The security headers of a rendered page, once each.
    expect(second.res.headers.get("x-content-type-options")).toBe("nosniff");
    expect(second.res.headers.get("referrer-policy")).toBe("strict-origin-when-cross-origin");
    expect(second.res.headers.get("permissions-policy")).toContain("camera=()");
    expect(second.res.headers.get("content-security-policy")).toContain("frame-ancestors 'none'");
    expect(second.res.headers.get("set-cookie")).toBeNull();
  });

  it("never answers a client navigation or refresh (RSC data) with cached HTML", async () => {
    const cookie = await signInCookie(running.app.baseUrl, "senior@kestrel.test", DEMO_PASSWORD);
    await load(running.app.baseUrl, cookie);
    expect((await load(running.app.baseUrl, cookie)).cache).toBe("hit");
    // What the App Router's fetch sends for router.refresh() and client navigations.
    const res = await fetch(`${running.app.baseUrl}${PAGE}?_rsc=1x2y3`, {
      headers: { cookie, rsc: "1", accept: "*/*", "sec-fetch-dest": "empty", "sec-fetch-mode": "cors" },
    });
    expect(res.status).toBe(200);
    expect(res.headers.get("x-plateroom-page-cache")).toBeNull();
    expect(res.headers.get("content-type")).toContain("text/x-component");
    await res.arrayBuffer();
  });

  it("shows a change made by someone else on the next load", async () => {
    const cookie = await signInCookie(running.app.baseUrl, "senior@kestrel.test", DEMO_PASSWORD);
    await load(running.app.baseUrl, cookie);
    expect((await load(running.app.baseUrl, cookie)).cache).toBe("hit");
    const lead = apiClient(running.app.baseUrl, await createApiToken(running.app.baseUrl, "lead@kestrel.test", DEMO_PASSWORD, "page cache test"));
    const renamed = await lead.json("PATCH", "/api/tags/tracking-markers", { name: "Tracker dots on screens" });
    expect(renamed.status).toBe(200);
    const after = await load(running.app.baseUrl, cookie);
    expect(after.cache).toBe("rendered");
    expect(after.html).toContain("Tracker dots on screens");
  });

  // Before the test that disables the demo artist.
  it("renders uncached with remembered reads: a write shows on the next render, and a reader still gets 404 for a draft", async () => {
    const base = running.app.baseUrl;
    const render = async (path: string, cookie: string) => {
      const res = await fetch(`${base}${path}`, { headers: { cookie, ...NAVIGATION, "x-plateroom-render": "1" }, redirect: "manual" });
      return { status: res.status, html: await res.text(), cache: res.headers.get("x-plateroom-page-cache") };
    };
    const seniorCookie = await signInCookie(base, "senior@kestrel.test", DEMO_PASSWORD);
    const artistCookie = await signInCookie(base, "artist@kestrel.test", DEMO_PASSWORD);
    const senior = apiClient(base, await createApiToken(base, "senior@kestrel.test", DEMO_PASSWORD, "render test"));
    const doc = (text: string) => ({ type: "doc", content: [{ type: "paragraph", content: [{ type: "text", text }] }] });
    const created = await senior.json<{ slug: string }>("POST", "/api/techniques", { title: "Rig shadow paint-out", summary: "First summary of the draft.", body: doc("Draft steps.") });
    expect(created.status).toBe(201);
    const path = `/techniques/${created.body.slug}`;

    for (let i = 0; i < 2; i++) {
      const page = await render(path, seniorCookie);
      expect(page.status).toBe(200);
      expect(page.cache).toBeNull();
      expect(page.html).toContain("First summary of the draft.");
    }
    // An artist reads approved techniques only (PRODUCT.md roles): the senior's remembered read is not theirs.
    const refused = await render(path, artistCookie);
    expect(refused.status).toBe(404);
    expect(refused.html).not.toContain("First summary of the draft.");

    const edited = await senior.json("PUT", `/api/techniques/${created.body.slug}`, { title: "Rig shadow paint-out", summary: "Second summary, after an edit.", body: doc("Draft steps."), baseRevision: 1, changeNote: "Clearer summary." });
    expect(edited.status).toBe(200);
    const after = await render(path, seniorCookie);
    expect(after.html).toContain("Second summary, after an edit.");
    expect(after.html).not.toContain("First summary of the draft.");
    expect((await render(path, artistCookie)).status).toBe(404);
  });

  it("keeps one copy per person, and a disabled person is sent to sign in", async () => {
    const senior = await signInCookie(running.app.baseUrl, "senior@kestrel.test", DEMO_PASSWORD);
    const artist = await signInCookie(running.app.baseUrl, "artist@kestrel.test", DEMO_PASSWORD);
    await load(running.app.baseUrl, senior);
    expect((await load(running.app.baseUrl, senior)).cache).toBe("hit");
    const artistFirst = await load(running.app.baseUrl, artist);
    expect(artistFirst.cache).toBe("rendered");
    expect((await load(running.app.baseUrl, artist)).cache).toBe("hit");

    const admin = apiClient(running.app.baseUrl, await createApiToken(running.app.baseUrl, "admin@kestrel.test", DEMO_PASSWORD, "page cache test"));
    const people = await admin.json<{ items?: { id: string; email: string }[] } | { id: string; email: string }[]>("GET", "/api/people");
    const list = Array.isArray(people.body) ? people.body : (people.body.items ?? []);
    const artistId = list.find((p) => p.email === "artist@kestrel.test")?.id;
    expect(artistId).toBeTruthy();
    expect((await admin.json("PATCH", `/api/people/${artistId}`, { disabled: true })).status).toBe(200);
    const refused = await load(running.app.baseUrl, artist);
    expect(refused.cache).toBeNull();
    expect(refused.res.status).not.toBe(200);
    expect(artistFirst.html).toContain("About this technique");
    expect(refused.html).not.toContain("About this technique");
  });

  it("a cached page runs in Chromium: no CSP violations, and its client parts load data", async () => {
    const senior = apiClient(running.app.baseUrl, await createApiToken(running.app.baseUrl, "senior@kestrel.test", DEMO_PASSWORD, "page cache test"));
    const asked = await senior.json("POST", `/api/techniques/marker-channel-cleanup/questions`, {
      body: { type: "doc", content: [{ type: "paragraph", content: [{ type: "text", text: "Does the copy step hold on a blue backing?" }] }] },
    });
    expect(asked.status).toBe(201);
    const { context, page } = await signIn(running.browser, running.app.baseUrl, "senior@kestrel.test");
    const violations: string[] = [];
    page.on("console", (msg) => {
      if (msg.type() === "error" && /Content Security Policy/i.test(msg.text())) violations.push(msg.text());
    });
    await page.goto(PAGE);
    const cached = await page.goto(PAGE);
    expect(cached?.headers()["x-plateroom-page-cache"]).toBe("hit");
    // The questions list is fetched by client code after hydration: it only appears if the page's scripts ran.
    await page.getByText("Does the copy step hold on a blue backing?").waitFor({ timeout: 15_000 });
    expect(violations).toEqual([]);
    await context.close();
  });
});
