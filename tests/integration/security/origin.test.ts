import { NextRequest } from "next/server";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { GET as listTokens, POST as createToken } from "@/app/api/tokens/route";
import { PUT as setMailMode } from "@/app/api/subscriptions/mode/route";
import { POST as unsubscribeOneClick } from "@/app/api/unsubscribe/route";
import { crossOriginWriteReason } from "@/lib/api/origin";
import { env } from "@/lib/env";
import { createUnsubscribeToken } from "@/lib/mail/unsubscribe";
import { createPerson, params, sessionCookie, type TestPerson } from "@/tests/factories";
import { expectErrorShape } from "./world";

/*
 * Cookie-authenticated writes come only from the app's own origin (issue 19 item 6).
 * Sources: RFC 6454 "The Web Origin Concept" §4 (an origin is scheme, host and port; default
 * ports are implied) and §5 (two origins are the same only when all three match); W3C Fetch
 * Metadata Request Headers (`Sec-Fetch-Site: cross-site` marks a request a page on another site
 * made); OWASP Cross-Site Request Forgery Prevention Cheat Sheet, "Verifying Origin With Standard
 * Headers" and "Fetch Metadata headers" — section names from memory.
 */

const APP = "https://plateroom.kestrel.test";
let savedBaseUrl: string | undefined;
let person: TestPerson;
let cookie: string;

beforeAll(async () => {
  savedBaseUrl = env.PLATEROOM_BASE_URL;
  // The app is published at https://plateroom.kestrel.test (default port 443).
  env.PLATEROOM_BASE_URL = APP;
  person = await createPerson("senior");
  cookie = await sessionCookie(person);
});

afterAll(() => {
  env.PLATEROOM_BASE_URL = savedBaseUrl;
});

/** A browser's POST /api/tokens with the session cookie, from the page at `origin` (or no Origin at all). */
function cookieWrite(headers: Record<string, string>, url = `${APP}/api/tokens`): Request {
  return new Request(url, { method: "POST", headers: { Cookie: cookie, "Content-Type": "application/json", ...headers }, body: JSON.stringify({ name: "from a page" }) });
}

async function expectRefused(res: Response, label: string): Promise<void> {
  expect(res.status, label).toBe(403);
  const error = await expectErrorShape(res, label);
  expect(error.code, label).toBe("forbidden");
  expect(error.message, label).toContain(APP);
}

describe("RFC 6454: the origin is scheme, host and port, compared whole", () => {
  it("accepts the app's own origin, with the default port written or left out and the host in any case", async () => {
    for (const origin of [APP, `${APP}:443`, "https://PLATEROOM.Kestrel.TEST"]) {
      expect((await createToken(cookieWrite({ Origin: origin }), params({}))).status, origin).toBe(201);
    }
  });

  it("refuses the same host over another scheme (the check used to compare hosts only)", async () => {
    // Sent to the app's own host, so a Host-header comparison sees no difference.
    await expectRefused(await createToken(cookieWrite({ Origin: "http://plateroom.kestrel.test", Host: "plateroom.kestrel.test" }), params({})), "http origin");
    await expectRefused(await createToken(cookieWrite({ Origin: "http://plateroom.kestrel.test:443" }), params({})), "http on 443");
  });

  it("refuses the same host on another port, another host, a sibling subdomain and the opaque origin", async () => {
    for (const origin of [`${APP}:8443`, "https://elsewhere.example", "https://wiki.kestrel.test", "null", "file://", "not a url"]) {
      await expectRefused(await createToken(cookieWrite({ Origin: origin }), params({})), origin);
    }
  });

  it("does not take the reference from the request's Host header, which the caller controls", async () => {
    const forged = cookieWrite({ Origin: "https://elsewhere.example", Host: "elsewhere.example", "X-Forwarded-Host": "elsewhere.example" }, "https://elsewhere.example/api/tokens");
    await expectRefused(await createToken(forged, params({})), "forged host");
  });
});

describe("W3C Fetch Metadata: Sec-Fetch-Site cross-site is refused even without Origin", () => {
  it("refuses a cookie write that says cross-site, with no Origin header", async () => {
    await expectRefused(await createToken(cookieWrite({ "Sec-Fetch-Site": "cross-site" }), params({})), "cross-site, no Origin");
    const put = new Request(`${APP}/api/subscriptions/mode`, { method: "PUT", headers: { Cookie: cookie, "Sec-Fetch-Site": "cross-site", "Content-Type": "application/json" }, body: JSON.stringify({ mode: "daily" }) });
    await expectRefused(await setMailMode(put, params({})), "PUT cross-site");
  });

  it("refuses cross-site even when the Origin header names the app", async () => {
    await expectRefused(await createToken(cookieWrite({ Origin: APP, "Sec-Fetch-Site": "cross-site" }), params({})), "cross-site with our Origin");
  });

  it("accepts same-origin writes and cookie writes from clients that send neither header", async () => {
    expect((await createToken(cookieWrite({ Origin: APP, "Sec-Fetch-Site": "same-origin" }), params({}))).status).toBe(201);
    // A command-line client with a copied cookie: not a request a page elsewhere can make.
    expect((await createToken(cookieWrite({}), params({}))).status).toBe(201);
  });

  it("lets reads through from anywhere: they change nothing and their answers are not readable cross-origin", async () => {
    const read = new Request(`${APP}/api/tokens`, { headers: { Cookie: cookie, Origin: "https://elsewhere.example", "Sec-Fetch-Site": "cross-site" } });
    expect((await listTokens(read, params({}))).status).toBe(200);
  });
});

describe("scripts with a token, and the one-click unsubscribe, are not cookie writes", () => {
  it("accepts a Bearer-token write whatever Origin or Fetch Metadata say (a page cannot add Authorization without CORS)", async () => {
    const req = new Request(`${APP}/api/tokens`, {
      method: "POST",
      headers: { Authorization: `Bearer ${person.token}`, Origin: "https://elsewhere.example", "Sec-Fetch-Site": "cross-site", "Content-Type": "application/json" },
      body: JSON.stringify({ name: "pipeline" }),
    });
    expect((await createToken(req, params({}))).status).toBe(201);
  });

  it("accepts the RFC 8058 one-click POST from another site: the signed token decides", async () => {
    const token = createUnsubscribeToken({ userId: person.id, kind: "all", key: "" });
    const req = new Request(`${APP}/api/unsubscribe?token=${encodeURIComponent(token)}`, {
      method: "POST",
      headers: { Origin: "https://webmail.example.net", "Sec-Fetch-Site": "cross-site", "Content-Type": "application/x-www-form-urlencoded" },
      body: "List-Unsubscribe=One-Click",
    });
    expect((await unsubscribeOneClick(req, params({}))).status).toBe(200);
  });
});

describe("one rule for route handlers and server actions", () => {
  it("is one function, refusing the same cases for any unsafe method", () => {
    for (const method of ["POST", "PUT", "PATCH", "DELETE"]) {
      expect(crossOriginWriteReason(method, new Headers({ Origin: "http://plateroom.kestrel.test" }))).toContain(APP);
      expect(crossOriginWriteReason(method, new Headers({ "Sec-Fetch-Site": "cross-site" }))).toContain(APP);
      expect(crossOriginWriteReason(method, new Headers({ Origin: APP }))).toBeNull();
    }
    for (const method of ["GET", "HEAD", "OPTIONS"]) expect(crossOriginWriteReason(method, new Headers({ Origin: "https://elsewhere.example" }))).toBeNull();
  });

  it("refuses a server action posted to a page with the session cookie from another origin (proxy.ts)", async () => {
    const { proxy } = await import("@/proxy");
    const action = (origin: string) =>
      new NextRequest(`${APP}/settings`, { method: "POST", headers: { Cookie: cookie, Origin: origin, "Next-Action": "0123abcd", "Content-Type": "text/plain" }, body: "[]" });
    const refused = await proxy(action("http://plateroom.kestrel.test"));
    expect(refused.status).toBe(403);
    expect(await refused.text()).toContain(APP);
    const crossSite = await proxy(new NextRequest(`${APP}/settings`, { method: "POST", headers: { Cookie: cookie, "Sec-Fetch-Site": "cross-site" }, body: "[]" }));
    expect(crossSite.status).toBe(403);
    // The app's own origin passes on to the page (the proxy answers with its pass-through, not 403).
    expect((await proxy(action(APP))).status).not.toBe(403);
  });
});
