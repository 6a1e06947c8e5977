import { eq } from "drizzle-orm";
import { afterEach, beforeAll, describe, expect, it } from "vitest";
import { getDb } from "@/db/client";
import { signInFailures, users } from "@/db/schema";
import { env } from "@/lib/env";
import { hashPassword } from "@/lib/auth/password";
import {
  accountDelayMs,
  ADDRESS_FLOOD_LIMIT,
  checkCredentials,
  FIRST_DELAY_MS,
  FREE_FAILURES,
  MAX_DELAY_MS,
  signInWait,
} from "@/lib/people/sign-in";
import { POST as authPost } from "@/app/api/auth/[...nextauth]/route";
import { NextRequest } from "next/server";

/*
 * OWASP Authentication Cheat Sheet, "Protect Against Automated Attacks" / "Account Lockout":
 * count failures per account, not per source address (an attacker has many addresses, and many
 * honest people share one); prefer delays that grow with each failure over a hard lockout; do
 * not take the client's address from headers a client can write. Addresses are documentation
 * ranges (RFC 5737).
 */

const PASSWORD = "correct horse battery";
const PEER_HEADER = "x-test-peer";
const office = "198.51.100.20";

/** As lib/auth/client-address.ts records the connection's address in a running server. */
(globalThis as { __plateroomPeerHeader?: string }).__plateroomPeerHeader = PEER_HEADER;
const headersFrom = (peer: string, forwardedFor?: string) => new Headers({ [PEER_HEADER]: peer, ...(forwardedFor ? { "x-forwarded-for": forwardedFor } : {}) });

let passwordHash = "";
let counter = 0;
async function person(): Promise<string> {
  const email = `painter-${++counter}@kestrel.test`;
  await getDb().insert(users).values({ email, name: `Painter ${counter}`, role: "artist", passwordHash });
  return email;
}

/** The script sign-in endpoint's own check, before Auth.js (app/api/auth/[...nextauth]/route.ts). */
function scriptSignIn(email: string, peer: string, forwardedFor?: string): Promise<Response> {
  const headers = headersFrom(peer, forwardedFor);
  headers.set("content-type", "application/x-www-form-urlencoded");
  return authPost(new NextRequest("http://localhost/api/auth/callback/credentials", { method: "POST", headers, body: new URLSearchParams({ email, password: "wrong", csrfToken: "x" }) }));
}

async function failuresFor(email: string, n: number, address: string): Promise<void> {
  await getDb().insert(signInFailures).values(Array.from({ length: n }, () => ({ email, address })));
}

beforeAll(async () => {
  passwordHash = await hashPassword(PASSWORD);
});

afterEach(async () => {
  env.PLATEROOM_TRUSTED_PROXIES = [];
  await getDb().delete(signInFailures);
});

describe("sign-in throttling per account, with growing delays (OWASP Authentication Cheat Sheet)", () => {
  it("lets the first failures through, then waits a delay that doubles with every failure, up to a cap", () => {
    for (let f = 0; f <= FREE_FAILURES; f++) expect(accountDelayMs(f)).toBe(0);
    expect(accountDelayMs(FREE_FAILURES + 1)).toBe(FIRST_DELAY_MS);
    for (let f = FREE_FAILURES + 2; f < FREE_FAILURES + 12; f++) {
      expect(accountDelayMs(f)).toBe(Math.min(MAX_DELAY_MS, 2 * accountDelayMs(f - 1)));
    }
    expect(accountDelayMs(1000)).toBe(MAX_DELAY_MS);
  });

  it("holds a throttled account whatever address the tries come from, and lets the right password in once the wait is over", async () => {
    const email = await person();
    for (let i = 0; i < FREE_FAILURES + 1; i++) expect((await checkCredentials(email, `typo ${i}`, office)).ok).toBe(false);
    const held = await checkCredentials(email, PASSWORD, "203.0.113.99");
    expect(held).toMatchObject({ ok: false, wait: { reason: "account" } });
    const wait = !held.ok && held.wait ? held.wait.retryAfterMs : 0;
    expect(wait).toBeGreaterThan(0);
    expect(wait).toBeLessThanOrEqual(FIRST_DELAY_MS);
    await new Promise((r) => setTimeout(r, wait + 50));
    const after = await checkCredentials(email, PASSWORD, office);
    expect(after.ok).toBe(true);
    // A correct password ends the account's delays.
    expect(await getDb().select().from(signInFailures).where(eq(signInFailures.email, email))).toEqual([]);
  });

  it("checks only the first of tries sent in parallel once the free ones are used", async () => {
    const email = await person();
    await failuresFor(email, FREE_FAILURES, office);
    const results = await Promise.all(Array.from({ length: 8 }, (_, i) => checkCredentials(email, `parallel ${i}`, office)));
    const checked = results.filter((r) => !r.ok && r.wait === null);
    expect(checked).toHaveLength(1);
    expect(results.filter((r) => !r.ok && r.wait?.reason === "account")).toHaveLength(7);
    expect(await getDb().select().from(signInFailures).where(eq(signInFailures.email, email))).toHaveLength(FREE_FAILURES + 1);
  });

  it("treats unknown e-mail addresses exactly like known ones, so a throttle reveals nothing", async () => {
    const known = await person();
    const unknown = "nobody-here@kestrel.test";
    for (const email of [known, unknown]) await failuresFor(email, FREE_FAILURES + 3, office);
    const [a, b] = [await signInWait(known, office), await signInWait(unknown, office)];
    expect(a?.reason).toBe("account");
    expect(b?.reason).toBe("account");
    expect(Math.abs(a!.retryAfterMs - b!.retryAfterMs)).toBeLessThan(1000);
  });
});

describe("one office behind one address (OWASP Authentication Cheat Sheet: per account, not per address)", () => {
  it("fifteen colleagues with two typos each from one address all sign in afterwards", async () => {
    const people = await Promise.all(Array.from({ length: 15 }, () => person()));
    for (const email of people) for (const typo of ["typo one", "typo two"]) expect((await checkCredentials(email, typo, office)).ok).toBe(false);
    for (const email of people) expect((await checkCredentials(email, PASSWORD, office)).ok, email).toBe(true);
  });

  it("the sign-in endpoint answers nobody from the office 429 for the office's typos", async () => {
    const people = await Promise.all(Array.from({ length: 12 }, () => person()));
    for (const email of people) await failuresFor(email, 2, office);
    for (const email of people) expect((await scriptSignIn(email, office, office)).status, email).not.toBe(429);
  });

  it("keeps only a flood guard per address, far above what typos reach, and says when to try again", async () => {
    await failuresFor("many-accounts@kestrel.test", ADDRESS_FLOOD_LIMIT, office);
    const flooded = await scriptSignIn(await person(), office);
    expect(flooded.status).toBe(429);
    const retryAfter = Number(flooded.headers.get("retry-after"));
    expect(retryAfter).toBeGreaterThan(0);
    expect(retryAfter).toBeLessThanOrEqual(15 * 60);
    const body = (await flooded.json()) as { error: { code: string; message: string } };
    expect(body.error.code).toBe("rate_limited");
    expect(body.error.message).toMatch(/Try again in/);
  });
});

describe("no client-written address counts (OWASP Authentication Cheat Sheet)", () => {
  it("a flooding client cannot escape by naming a fresh address in X-Forwarded-For", async () => {
    await failuresFor("flood@kestrel.test", ADDRESS_FLOOD_LIMIT, office);
    expect((await scriptSignIn(await person(), office, "203.0.113.1")).status).toBe(429);
    expect((await scriptSignIn(await person(), office, "203.0.113.2, 203.0.113.3")).status).toBe(429);
  });

  it("nobody can get another address refused by naming it in X-Forwarded-For", async () => {
    const attacker = "203.0.113.50";
    for (let i = 0; i < 40; i++) await checkCredentials(`guess-${i}@kestrel.test`, "wrong", attacker);
    await failuresFor("spoofer@kestrel.test", ADDRESS_FLOOD_LIMIT, attacker);
    // The attacker named the office in every request; the office's own sign-ins are untouched.
    expect((await scriptSignIn(await person(), attacker, office)).status).toBe(429);
    expect((await scriptSignIn(await person(), office)).status).not.toBe(429);
  });

  it("behind a trusted proxy (PLATEROOM_TRUSTED_PROXIES) the hop that proxy appended is the client", async () => {
    env.PLATEROOM_TRUSTED_PROXIES = ["10.0.0.0/8"];
    await failuresFor("proxied@kestrel.test", ADDRESS_FLOOD_LIMIT, office);
    expect((await scriptSignIn(await person(), "10.0.0.5", `203.0.113.9, ${office}`)).status).toBe(429);
    expect((await scriptSignIn(await person(), "10.0.0.5", `${office}, 203.0.113.9`)).status).not.toBe(429);
  });
});
