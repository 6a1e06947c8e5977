import { and, eq } from "drizzle-orm";
import { afterEach, describe, expect, it } from "vitest";
import { currentPglite, getDb } from "@/db/client";
import { oneTimeTokens, outbox, passwordResetRequests, users } from "@/db/schema";
import { AppError } from "@/lib/api/errors";
import { getOutboxItem } from "@/lib/mail/queries";
import { setPasswordWithToken } from "@/lib/people/mutations";
import { requestPasswordReset, RESET_PER_ACCOUNT, RESET_PER_ADDRESS, type Later } from "@/lib/people/password-reset";
import { POST as resetPost } from "@/app/api/password-resets/route";
import { createPerson } from "@/tests/factories";

/*
 * OWASP Forgot Password Cheat Sheet: "Return a consistent message for both existent and
 * non-existent accounts", "Ensure that responses return in a consistent amount of time" (the
 * same logic for both, the account's work done asynchronously), "Implement protections against
 * excessive automated submissions such as rate-limiting on a per-account basis", and tokens
 * that are single use. Timing itself is measured in the bench (bench/auth.ts), never here.
 * Addresses are documentation ranges (RFC 5737).
 */

const PEER_HEADER = "x-test-peer";
(globalThis as { __plateroomPeerHeader?: string }).__plateroomPeerHeader = PEER_HEADER;

let nextAddress = 1;
const freshAddress = () => `192.0.2.${nextAddress++}`;

/** Collects the work handed to `later` so a test decides when (and whether) it runs. */
function deferred(): { later: Later; jobs: (() => Promise<void>)[]; runAll: () => Promise<void> } {
  const jobs: (() => Promise<void>)[] = [];
  return { later: (work) => void jobs.push(work), jobs, runAll: async () => void (await Promise.all(jobs.splice(0).map((j) => j()))) };
}

const resetsQueuedFor = async (email: string) => getDb().select().from(outbox).where(and(eq(outbox.toEmail, email), eq(outbox.kind, "reset")));
const tokenIn = (text: string) => decodeURIComponent(/token=([^\s"&<]+)/.exec(text)?.[1] ?? "");

function apiReset(email: string, address: string): Promise<Response> {
  return resetPost(
    new Request("http://localhost/api/password-resets", { method: "POST", headers: { "content-type": "application/json", [PEER_HEADER]: address }, body: JSON.stringify({ email }) }),
    { params: Promise.resolve({}) },
  );
}

afterEach(async () => {
  await getDb().delete(passwordResetRequests);
});

describe("password reset requests (OWASP Forgot Password Cheat Sheet)", () => {
  it("fifteen requests for one colleague queue at most the per-account limit of mails, and only the newest link works", async () => {
    const colleague = await createPerson("artist");
    const d = deferred();
    const answers = [];
    for (let i = 0; i < 15; i++) {
      answers.push(await requestPasswordReset(colleague.email, freshAddress(), d.later));
      await d.runAll();
    }
    expect(answers.filter((a) => a.ok)).toHaveLength(RESET_PER_ACCOUNT);
    for (const refused of answers.slice(RESET_PER_ACCOUNT)) expect(refused).toMatchObject({ ok: false, reason: "account" });
    const mails = await resetsQueuedFor(colleague.email);
    expect(mails).toHaveLength(RESET_PER_ACCOUNT);
    const live = await getDb().select().from(oneTimeTokens).where(and(eq(oneTimeTokens.userId, colleague.id), eq(oneTimeTokens.purpose, "reset")));
    expect(live).toHaveLength(1);

    const tokens = mails.sort((a, b) => a.id - b.id).map((m) => tokenIn(m.text));
    for (const old of tokens.slice(0, -1)) await expect(setPasswordWithToken(old, "a brand new password")).rejects.toBeInstanceOf(AppError);
    await expect(setPasswordWithToken(tokens.at(-1)!, "a brand new password")).resolves.toEqual({ email: colleague.email });
  });

  it("limits requests per client address, whatever e-mails they name, and says when to try again", async () => {
    const address = freshAddress();
    for (let i = 0; i < RESET_PER_ADDRESS; i++) expect((await apiReset(`someone-${i}@kestrel.test`, address)).status).toBe(202);
    const refused = await apiReset("one-more@kestrel.test", address);
    expect(refused.status).toBe(429);
    const retryAfter = Number(refused.headers.get("retry-after"));
    expect(retryAfter).toBeGreaterThan(0);
    expect(retryAfter).toBeLessThanOrEqual(15 * 60);
    expect(((await refused.json()) as { error: { message: string } }).error.message).toMatch(/Try again in/);
    expect((await apiReset("one-more@kestrel.test", freshAddress())).status).toBe(202);
  });

  it("answers a known and an unknown address with the same status, body and database statements; the account's work comes after", async () => {
    const pglite = currentPglite();
    const known = await createPerson("senior");
    const unknown = "no-such-painter@kestrel.test";
    /** The answer path's statements as PGlite receives them (wrapped, called through, restored). */
    const run = async (email: string) => {
      const statements: string[] = [];
      const originals = pglite ? { query: pglite.query, exec: pglite.exec } : null;
      if (pglite && originals) {
        pglite.query = function (this: unknown, q: string, ...rest: unknown[]) {
          statements.push(q);
          return (originals.query as (...a: unknown[]) => unknown).call(pglite, q, ...rest);
        } as typeof pglite.query;
        pglite.exec = function (this: unknown, q: string, ...rest: unknown[]) {
          statements.push(q);
          return (originals.exec as (...a: unknown[]) => unknown).call(pglite, q, ...rest);
        } as typeof pglite.exec;
      }
      const d = deferred();
      try {
        const answer = await requestPasswordReset(email, freshAddress(), d.later);
        return { answer, statements, jobs: d.jobs.length, runAll: d.runAll };
      } finally {
        if (pglite && originals) Object.assign(pglite, originals);
      }
    };
    const a = await run(known.email);
    const b = await run(unknown);
    expect(a.answer).toEqual({ ok: true });
    expect(b.answer).toEqual(a.answer);
    expect(a.jobs).toBe(1);
    expect(b.jobs).toBe(1);
    if (pglite) {
      expect(a.statements.length).toBeGreaterThan(0);
      expect(b.statements).toEqual(a.statements);
    }
    // Nothing about the account happened before the answer; afterwards only the known one gets mail.
    expect(await resetsQueuedFor(known.email)).toHaveLength(0);
    await a.runAll();
    await b.runAll();
    expect(await resetsQueuedFor(known.email)).toHaveLength(1);
    expect(await resetsQueuedFor(unknown)).toHaveLength(0);

    const apiKnown = await apiReset(known.email, freshAddress());
    const apiUnknown = await apiReset(unknown, freshAddress());
    expect([apiKnown.status, apiUnknown.status]).toEqual([202, 202]);
    expect(await apiUnknown.json()).toEqual(await apiKnown.json());
  });

  it("sends nothing to a disabled account, and hides reset tokens from admins reading the outbox", async () => {
    const disabled = await createPerson("artist");
    await getDb().update(users).set({ disabledAt: new Date() }).where(eq(users.id, disabled.id));
    const person = await createPerson("artist");
    const d = deferred();
    await requestPasswordReset(disabled.email, freshAddress(), d.later);
    await requestPasswordReset(person.email, freshAddress(), d.later);
    await d.runAll();
    expect(await resetsQueuedFor(disabled.email)).toHaveLength(0);
    const [mail] = await resetsQueuedFor(person.email);
    expect(tokenIn(mail!.text)).toMatch(/^rst_/);
    const admin = await createPerson("admin");
    const seen = await getOutboxItem(admin, mail!.id);
    expect(seen!.text).not.toContain(tokenIn(mail!.text));
    expect(seen!.html).not.toContain(tokenIn(mail!.text));
    expect(seen!.text).toContain("token=(hidden)");
  });
});
