import fs from "node:fs";
import net from "node:net";
import os from "node:os";
import path from "node:path";
import { eq, gte, sql } from "drizzle-orm";
import { afterEach, beforeEach, describe, expect, it } from "vitest";
import { getDb } from "@/db/client";
import { digestItems, outbox, subscriptions, users } from "@/db/schema";
import { AppError } from "@/lib/api/errors";
import { env } from "@/lib/env";
import { notifyPerson, notifyTechniqueEvent } from "@/lib/mail/events";
import { readInbox } from "@/lib/mail/inbox";
import { startFakeSmtp } from "@/scripts/fake-smtp/server";
import { enqueueMail } from "@/lib/mail/outbox";
import { listOutbox } from "@/lib/mail/queries";
import type { InboxMessage } from "@/lib/mail/schemas";
import { composeDigests, flushOutbox, flushUntilIdle, MAX_ATTEMPTS_PERMANENT, retryFailed } from "@/lib/mail/sender";
import { applyUnsubscribe } from "@/lib/mail/unsubscribe";
import { invitePerson } from "@/lib/people/mutations";
import { requestPasswordReset } from "@/lib/people/password-reset";
import { follow, makeShow, makeTag, makeTechnique, makeUse, makeUser } from "./factories";
import { MAIL_BASE as BASE, setUpFakeMail } from "./fake-mail";

const mail = setUpFakeMail();
beforeEach(async () => {
  await getDb().delete(subscriptions).where(sql`true`);
});

let received = 0;
afterEach(() => {
  received = mail.smtp.messages().length;
});

/** Messages received by the shared server during the current test. */
const inbox = (): InboxMessage[] => mail.smtp.messages().slice(received);

/** Flushes the outbox to the shared server and returns just the messages that run delivered. */
async function deliver(expected: number): Promise<InboxMessage[]> {
  const { sent, messages } = await mail.deliver();
  expect(sent).toBe(expected);
  expect(messages).toHaveLength(expected);
  return messages;
}

async function freePort(): Promise<number> {
  const server = net.createServer();
  await new Promise<void>((resolve) => server.listen(0, "127.0.0.1", resolve));
  const port = (server.address() as net.AddressInfo).port;
  await new Promise<void>((resolve) => server.close(() => resolve()));
  return port;
}

async function outboxCount(): Promise<number> {
  const [row] = await getDb().select({ n: sql<number>`count(*)`.mapWith(Number) }).from(outbox);
  return row!.n;
}

function unsubscribeToken(m: InboxMessage): string {
  const link = /^<([^>]+)>$/.exec(m.headers["list-unsubscribe"] ?? "")?.[1];
  expect(link).toBeDefined();
  return new URL(link!).searchParams.get("token")!;
}

describe("outbox in the caller's transaction", () => {
  it("a rolled-back change queues nothing", async () => {
    const person = await makeUser();
    await expect(
      getDb().transaction(async (tx) => {
        await enqueueMail(tx, { to: person, kind: "test", subject: "Never", html: "<p>never</p>", text: "never" });
        throw new Error("change failed");
      }),
    ).rejects.toThrow("change failed");
    expect(await outboxCount()).toBe(0);

    await getDb().transaction(async (tx) => {
      await enqueueMail(tx, { to: person, kind: "test", subject: "Once", html: "<p>once</p>", text: "once" });
    });
    expect(await outboxCount()).toBe(1);
  });
});

describe("a revision approval", () => {
  it("mails each subscriber exactly once (technique, tag and show de-duplicated), never the actor, with standard headers", async () => {
    const lead = await makeUser({ role: "lead", name: "Rhea Lead" });
    const viaTechnique = await makeUser({ name: "Tomas Technique" });
    const viaTag = await makeUser({ name: "Tara Tag" });
    const viaShow = await makeUser({ name: "Sven Show" });
    const viaAll = await makeUser({ name: "Alma All" });
    const bystander = await makeUser();
    const disabled = await makeUser({ disabled: true });
    const tag = await makeTag({ slug: "tracking-markers", name: "Tracking markers" });
    const title = "Tracking-Marker entfernen – grünes Tuch";
    const technique = await makeTechnique({ slug: "marker-removal-green", title, tagIds: [tag.id] });
    const show = await makeShow({ code: "SLM", name: "Saltmarsh" });
    await makeUse({ techniqueId: technique.id, showId: show.id, shotCode: "SLM_040_0120" });

    await follow(viaTechnique.id, "technique", technique.slug);
    await follow(viaTag.id, "tag", tag.slug);
    await follow(viaShow.id, "show", "SLM");
    for (const kind of ["technique", "tag", "show"] as const) await follow(viaAll.id, kind, kind === "technique" ? technique.slug : kind === "tag" ? tag.slug : "SLM");
    await follow(lead.id, "technique", technique.slug);
    await follow(disabled.id, "technique", technique.slug);
    void bystander;

    const changeNote = "Use a 3 px erode on the matte before the <b>patch</b> & regrain.";
    await getDb().transaction(async (tx) => {
      await notifyTechniqueEvent(tx, {
        kind: "revision-approved",
        actorId: lead.id,
        technique: { slug: technique.slug, title, tagSlugs: [tag.slug] },
        revisionNumber: 3,
        previousApprovedNumber: 2,
        changeNote,
      });
    });

    const messages = await deliver(4);
    const recipients = messages.flatMap((m) => m.envelope.to).sort();
    expect(recipients).toEqual([viaTechnique.email, viaTag.email, viaShow.email, viaAll.email].sort());
    expect(recipients).not.toContain(lead.email);

    const rows = await getDb().select().from(outbox);
    expect(rows.every((r) => r.state === "sent" && r.attempts === 1)).toBe(true);

    for (const m of messages) {
      const h = m.headers;
      // RFC 5322 §3.6 (from memory: §3.6.1 Date, §3.6.2 From, §3.6.3 To, §3.6.4 Message-ID): present.
      expect(h.date).toBeDefined();
      expect(h.from).toBeDefined();
      expect(h.to).toBeDefined();
      expect(h["message-id"]).toBeDefined();
      // RFC 5322 §3.3 date-time, e.g. "Tue, 1 Jul 2003 10:52:37 +0200" (the RFC's own example form, from memory).
      expect(h.date).toMatch(/^(Mon|Tue|Wed|Thu|Fri|Sat|Sun), \d{1,2} (Jan|Feb|Mar|Apr|May|Jun|Jul|Aug|Sep|Oct|Nov|Dec) \d{4} \d{2}:\d{2}:\d{2} [+-]\d{4}$/);
      // RFC 5322 §3.6.4: msg-id = "<" id-left "@" id-right ">"; and it is the id fixed in the outbox row.
      expect(h["message-id"]).toMatch(/^<[^<>@\s]+@[^<>@\s]+>$/);
      expect(rows.map((r) => r.messageId)).toContain(h["message-id"]);
      expect(h.from).toContain("plateroom@kestrel.test");
      expect(m.envelope.to).toHaveLength(1);
      expect(h.to).toContain(m.envelope.to[0]);

      // RFC 2047 §2 (from memory): a non-ASCII subject travels as encoded-words =?charset?B|Q?text?=, the header itself 7-bit ASCII.
      expect(h.subject).toMatch(/=\?utf-8\?[BQ]\?[^?\s]+\?=/i);
      expect(h.subject).toMatch(/^[\x20-\x7e]+$/);
      // Decoded by mailparser (libmime), an implementation we did not write.
      expect(m.subject).toBe(`Updated: ${title} (revision 3)`);

      // RFC 2369 §3.2: List-Unsubscribe is a URL in angle brackets. RFC 8058 §3.1: it carries one HTTPS URI
      // and the message has "List-Unsubscribe-Post: List-Unsubscribe=One-Click".
      expect(h["list-unsubscribe"]).toMatch(/^<https:\/\/[^>\s]+>$/);
      expect(h["list-unsubscribe"]).toContain(`${BASE}/api/unsubscribe?token=`);
      expect(h["list-unsubscribe-post"]).toBe("List-Unsubscribe=One-Click");

      // One template, both parts: the change note and the diff link in text and (escaped) in HTML.
      const diff = `${BASE}/techniques/${technique.slug}/history?from=2&to=3`;
      expect(m.text).toContain(changeNote);
      expect(m.text).toContain(diff);
      expect(m.html).toContain("&lt;b&gt;patch&lt;/b&gt; &amp; regrain");
      expect(m.html).not.toContain("<b>patch</b>");
      expect(m.html).toContain(diff.replace("&", "&amp;"));
      // The body carries the same one-click link as the header.
      expect(m.text).toContain(/^<([^>]+)>$/.exec(h["list-unsubscribe"]!)![1]!);
    }

    // The most specific subscription explains the mail: Alma follows the technique itself.
    const alma = messages.find((m) => m.envelope.to[0] === viaAll.email)!;
    expect(alma.text).toContain(`you follow the technique "${title}"`);
    const sven = messages.find((m) => m.envelope.to[0] === viaShow.email)!;
    expect(sven.text).toContain("you follow the show SLM (Saltmarsh)");

    // The admin mail view reads the same messages from the store folder.
    const stored = await readInbox(mail.storeDir);
    expect(stored.map((s) => s.messageId)).toEqual(expect.arrayContaining(messages.map((m) => m.messageId)));
  });

  it("nobody is mailed about their own action", async () => {
    const author = await makeUser({ role: "lead" });
    const technique = await makeTechnique();
    await follow(author.id, "technique", technique.slug);
    await getDb().transaction(async (tx) => {
      await notifyTechniqueEvent(tx, {
        kind: "technique-retired",
        actorId: author.id,
        technique: { slug: technique.slug, title: technique.title, tagSlugs: [] },
        supersededBy: null,
        note: null,
      });
      await notifyPerson(tx, { kind: "question-answered", actorId: author.id, toUserId: author.id, title: technique.title, link: `${BASE}/x`, summary: "" });
    });
    expect(await outboxCount()).toBe(0);
  });
});

describe("one-click unsubscribe", () => {
  it("the link in the message works without sign-in, is harmless the second time, and a tampered or expired one is refused", async () => {
    const lead = await makeUser({ role: "lead" });
    const artist = await makeUser();
    const tag = await makeTag();
    const technique = await makeTechnique({ tagIds: [tag.id] });
    const replacement = await makeTechnique();
    await follow(artist.id, "tag", tag.slug);
    await getDb().transaction((tx) =>
      notifyTechniqueEvent(tx, {
        kind: "technique-retired",
        actorId: lead.id,
        technique: { slug: technique.slug, title: technique.title, tagSlugs: [tag.slug] },
        supersededBy: { slug: replacement.slug, title: replacement.title },
        note: "Replaced by the grain-matched version.",
      }),
    );
    const [message] = await deliver(1);
    expect(message!.text).toContain(`${BASE}/techniques/${replacement.slug}`);
    const token = unsubscribeToken(message!);

    const tampered = [
      token.slice(0, 5) + (token[5] === "A" ? "B" : "A") + token.slice(6), // payload changed
      token.slice(0, -2) + (token.at(-2) === "A" ? "B" : "A") + token.at(-1), // signature changed
      token.split(".")[0]!, // signature missing
      `${token}x`,
    ];
    for (const bad of tampered) await expect(applyUnsubscribe(bad)).rejects.toMatchObject({ code: "bad_request" });
    // 90 days of validity (our choice); one day past it the same token is refused.
    await expect(applyUnsubscribe(token, new Date(Date.now() + 91 * 24 * 3600 * 1000))).rejects.toBeInstanceOf(AppError);
    expect(await getDb().select().from(subscriptions).where(eq(subscriptions.userId, artist.id))).toHaveLength(1);

    expect(await applyUnsubscribe(token)).toEqual({ removed: 1, target: { kind: "tag", key: tag.slug } });
    expect(await getDb().select().from(subscriptions).where(eq(subscriptions.userId, artist.id))).toHaveLength(0);
    expect((await applyUnsubscribe(token)).removed).toBe(0);
  });
});

describe("delivery across a mail server outage", () => {
  it("100 approvals while the server is down queue 100 messages, lose none, and arrive exactly once after it starts", async () => {
    const lead = await makeUser({ role: "lead" });
    const follower = await makeUser();
    const technique = await makeTechnique();
    await follow(follower.id, "technique", technique.slug);
    for (let n = 2; n <= 101; n++) {
      await getDb().transaction((tx) =>
        notifyTechniqueEvent(tx, {
          kind: "revision-approved",
          actorId: lead.id,
          technique: { slug: technique.slug, title: technique.title, tagSlugs: [] },
          revisionNumber: n,
          previousApprovedNumber: n - 1,
          changeNote: `Change ${n}`,
        }),
      );
    }
    expect(await outboxCount()).toBe(100);

    const port = await freePort();
    const downUrl = `smtp://127.0.0.1:${port}`;
    let now = Date.now();
    // A long outage: many sender runs, none may drop or fail a message.
    for (let run = 0; run < 12; run++) {
      const r = await flushOutbox({ smtpUrl: downUrl, now: new Date(now), limit: 200 });
      expect(r.sent).toBe(0);
      expect(r.failed).toBe(0);
      now += 10 * 60_000;
    }
    const waiting = await getDb().select().from(outbox);
    expect(waiting).toHaveLength(100);
    expect(waiting.every((r) => r.state === "queued" && r.attempts === 0)).toBe(true);
    expect(waiting[0]!.lastError).toMatch(/unreachable/i);

    const restarted = await startFakeSmtp({ port, storeDir: fs.mkdtempSync(path.join(os.tmpdir(), "plateroom-mail-")), quiet: true });
    try {
      const r = await flushUntilIdle({ smtpUrl: restarted.url, now: new Date(now) });
      expect(r.sent).toBe(100);
      const again = await flushUntilIdle({ smtpUrl: restarted.url, now: new Date(now + 3_600_000) });
      expect(again.claimed).toBe(0);
      const got = restarted.messages();
      expect(got).toHaveLength(100);
      const ids = new Set(got.map((m) => m.messageId));
      expect(ids.size).toBe(100);
      expect([...ids].sort()).toEqual(waiting.map((w) => w.messageId).sort());
      expect(got.map((m) => m.subject).sort()).toEqual(
        Array.from({ length: 100 }, (_, i) => `Updated: ${technique.title} (revision ${i + 2})`).sort(),
      );
    } finally {
      await restarted.stop();
      fs.rmSync(restarted.storeDir, { recursive: true, force: true });
    }
  }, 120_000);

  it("senders running at the same time never take the same message (FOR UPDATE SKIP LOCKED claim)", async () => {
    const person = await makeUser();
    await getDb().transaction(async (tx) => {
      for (let i = 0; i < 30; i++) await enqueueMail(tx, { to: person, kind: "test", subject: `Parallel ${i}`, html: "<p>x</p>", text: "x" });
    });
    const before = mail.smtp.messages().length;
    const runs = await Promise.all([1, 2, 3].map(() => flushUntilIdle({ smtpUrl: mail.smtp.url, batch: 4 })));
    expect(runs.reduce((n, r) => n + r.sent, 0)).toBe(30);
    const got = mail.smtp.messages().slice(before);
    expect(got).toHaveLength(30);
    expect(new Set(got.map((m) => m.messageId)).size).toBe(30);
  });

  it("a row left in 'sending' by a crashed sender is sent again with the same Message-ID", async () => {
    const person = await makeUser();
    await getDb().transaction((tx) => enqueueMail(tx, { to: person, kind: "test", subject: "Crash test", html: "<p>x</p>", text: "x" }));
    const [row] = await getDb()
      .update(outbox)
      .set({ state: "sending", attempts: 1, nextAttemptAt: new Date(Date.now() - 1000) })
      .where(gte(outbox.id, 0))
      .returning();
    const r = await flushOutbox({ smtpUrl: mail.smtp.url });
    expect(r.recovered).toBe(1);
    expect(r.sent).toBe(1);
    expect(inbox().map((m) => m.messageId)).toEqual([row!.messageId]);
  });

  it("a refused recipient is retried with backoff, marked failed with the reason, and an admin can retry it", async () => {
    const refusing = await startFakeSmtp({
      storeDir: fs.mkdtempSync(path.join(os.tmpdir(), "plateroom-mail-")),
      quiet: true,
      refuseRecipient: (a) => (a.startsWith("person-") ? 550 : null),
    });
    try {
      const person = await makeUser();
      const admin = await makeUser({ role: "admin" });
      const artist = await makeUser();
      await getDb().transaction((tx) => enqueueMail(tx, { to: person, kind: "test", subject: "Refused", html: "<p>x</p>", text: "x" }));
      let now = Date.now();
      const waits: number[] = [];
      // A slow connection on a loaded machine counts as an outage (not an attempt), so flush until
      // the refusals have used up the attempts, with a bound; only counted attempts record a wait.
      for (let i = 0; i < MAX_ATTEMPTS_PERMANENT + 6 && waits.length < MAX_ATTEMPTS_PERMANENT; i++) {
        const before = (await getDb().select().from(outbox))[0]!.attempts;
        await flushOutbox({ smtpUrl: refusing.url, now: new Date(now) });
        const [row] = await getDb().select().from(outbox);
        if (row!.attempts > before) waits.push(row!.nextAttemptAt.getTime() - now);
        now += 3_600_000;
      }
      const [failed] = await getDb().select().from(outbox);
      expect(failed!.state).toBe("failed");
      expect(failed!.attempts).toBe(MAX_ATTEMPTS_PERMANENT);
      expect(failed!.lastError).toContain("550");
      // Backoff grows between attempts (our schedule: 5 s, 30 s).
      expect(waits[1]!).toBeGreaterThan(waits[0]!);

      const listed = await listOutbox(admin, { state: "failed", limit: 10, offset: 0 });
      expect(listed.items.map((i) => i.id)).toEqual([failed!.id]);
      expect(listed.counts.failed).toBe(1);
      await expect(listOutbox(artist, { limit: 10, offset: 0 })).rejects.toMatchObject({ code: "forbidden" });
      await expect(retryFailed(artist, failed!.id)).rejects.toMatchObject({ code: "forbidden" });

      const retried = await retryFailed(admin, failed!.id);
      expect(retried.state).toBe("queued");
      const r = await flushOutbox({ smtpUrl: mail.smtp.url });
      expect(r.sent).toBe(1);
      expect(inbox().map((m) => m.messageId)).toEqual([failed!.messageId]);
      await expect(retryFailed(admin, failed!.id)).rejects.toMatchObject({ code: "conflict" });
    } finally {
      await refusing.stop();
      fs.rmSync(refusing.storeDir, { recursive: true, force: true });
    }
  });
});

describe("daily digest", () => {
  it("groups a day's events into one message per person; a second run the same day sends nothing more", async () => {
    const lead = await makeUser({ role: "lead" });
    const daily = await makeUser({ mailMode: "daily", name: "Dana Daily" });
    const immediate = await makeUser();
    const tag = await makeTag({ name: "Rig removal" });
    const a = await makeTechnique({ title: "Rig removal with a clean plate", tagIds: [tag.id] });
    const b = await makeTechnique({ title: "Wire paint-out on sky", tagIds: [tag.id] });
    await follow(daily.id, "tag", tag.slug, "daily");
    await follow(immediate.id, "tag", tag.slug, "immediate");

    const approve = (t: { slug: string; title: string }, n: number, note: string) =>
      getDb().transaction((tx) =>
        notifyTechniqueEvent(tx, {
          kind: "revision-approved",
          actorId: lead.id,
          technique: { slug: t.slug, title: t.title, tagSlugs: [tag.slug] },
          revisionNumber: n,
          previousApprovedNumber: n - 1,
          changeNote: note,
        }),
      );
    await approve(a, 2, "Morning change");
    await approve(b, 5, "Evening change");
    // Spread the two events across one (server-local) day.
    const day = new Date(2031, 2, 4);
    const items = await getDb().select().from(digestItems).orderBy(digestItems.id);
    expect(items).toHaveLength(2);
    await getDb().update(digestItems).set({ createdAt: new Date(2031, 2, 4, 9, 15) }).where(eq(digestItems.id, items[0]!.id));
    await getDb().update(digestItems).set({ createdAt: new Date(2031, 2, 4, 17, 40) }).where(eq(digestItems.id, items[1]!.id));

    // Before the digest runs, only the immediate follower has mail.
    const first = await deliver(2);
    expect(first.every((m) => m.envelope.to[0] === immediate.email)).toBe(true);

    const morning = new Date(day.getFullYear(), day.getMonth(), day.getDate() + 1, env.PLATEROOM_DIGEST_HOUR, 0);
    expect(await composeDigests(morning)).toEqual({ digests: 1, items: 2 });
    const [digest] = await deliver(1);
    expect(digest!.envelope.to).toEqual([daily.email]);
    expect(digest!.subject).toContain("2 changes");
    expect(digest!.text).toContain("Rig removal with a clean plate: revision 2 approved");
    expect(digest!.text).toContain("Wire paint-out on sky: revision 5 approved");
    expect(digest!.text).toContain("Evening change");
    expect(digest!.headers["list-unsubscribe-post"]).toBe("List-Unsubscribe=One-Click");

    // A later event the same day waits for tomorrow's digest: one digest per person per day.
    await approve(a, 3, "Late change");
    const later = new Date(morning.getTime() + 3 * 3_600_000);
    expect(await composeDigests(later)).toEqual({ digests: 0, items: 0 });
    const tomorrow = new Date(morning.getTime() + 24 * 3_600_000);
    expect(await composeDigests(tomorrow)).toEqual({ digests: 1, items: 1 });

    // The digest's one-click link stops everything that feeds it.
    expect((await applyUnsubscribe(unsubscribeToken(digest!))).removed).toBe(1);
    expect(await getDb().select().from(subscriptions).where(eq(subscriptions.userId, daily.id))).toHaveLength(0);
  });
});

describe("account mail", () => {
  it("an invitation arrives with its set-password link and no unsubscribe headers", async () => {
    const admin = await makeUser({ role: "admin", name: "Ada Admin" });
    const invited = await invitePerson(admin, { email: "new.painter@kestrel.test", name: "Niko Painter", role: "artist" });
    const [message] = await deliver(1);
    expect(message!.envelope.to).toEqual(["new.painter@kestrel.test"]);
    expect(message!.subject).toBe("You are invited to Plateroom");
    expect(message!.text).toContain(invited.setPasswordUrl);
    expect(message!.html).toContain(invited.setPasswordUrl.replace(/&/g, "&amp;"));
    expect(message!.text).toContain("Ada Admin");
    // RFC 8058 applies to list mail; account mail is not one and carries no List-Unsubscribe.
    expect(message!.headers["list-unsubscribe"]).toBeUndefined();
    expect(message!.headers["list-unsubscribe-post"]).toBeUndefined();
  });

  it("a password reset goes only to existing, enabled people", async () => {
    const person = await makeUser();
    const later: Promise<void>[] = [];
    await requestPasswordReset(person.email, "192.0.2.10", (work) => later.push(work()));
    await requestPasswordReset("nobody@kestrel.test", "192.0.2.10", (work) => later.push(work()));
    await Promise.all(later);
    const [message] = await deliver(1);
    expect(message!.envelope.to).toEqual([person.email]);
    expect(message!.text).toMatch(new RegExp(`${BASE}/set-password\\?token=\\S+`));
  });

  it("personal notices follow the person's mail mode", async () => {
    const answerer = await makeUser({ role: "lead" });
    const asker = await makeUser();
    const dailyAsker = await makeUser({ mailMode: "daily" });
    await getDb().transaction(async (tx) => {
      for (const p of [asker, dailyAsker]) {
        await notifyPerson(tx, { kind: "question-answered", actorId: answerer.id, toUserId: p.id, title: "Grain match", link: `${BASE}/techniques/grain#q`, summary: "Sample the grain from a flat area." });
      }
    });
    const [message] = await deliver(1);
    expect(message!.envelope.to).toEqual([asker.email]);
    expect(message!.text).toContain("Sample the grain from a flat area.");
    expect(await getDb().select().from(digestItems).where(eq(digestItems.userId, dailyAsker.id))).toHaveLength(1);
    const [u] = await getDb().select().from(users).where(eq(users.id, dailyAsker.id));
    expect(u!.mailMode).toBe("daily");
  });
});
