import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { eq, gte, sql } from "drizzle-orm";
import { afterAll, beforeAll, beforeEach, describe, expect, it } from "vitest";
import { getDb } from "@/db/client";
import { outbox, subscriptions } from "@/db/schema";
import { env } from "@/lib/env";
import { notifyTechniqueEvent } from "@/lib/mail/events";
import { startFakeSmtp, type FakeSmtp } from "@/scripts/fake-smtp/server";
import { enqueueMail } from "@/lib/mail/outbox";
import type { InboxMessage, OutboxItemResponse, OutboxListResponse } from "@/lib/mail/schemas";
import { flushUntilIdle } from "@/lib/mail/sender";
import { GET as listOutboxRoute } from "@/app/api/admin/outbox/route";
import { GET as outboxItemRoute } from "@/app/api/admin/outbox/[id]/route";
import { POST as retryRoute } from "@/app/api/admin/outbox/[id]/retry/route";
import { GET as inboxRoute } from "@/app/api/admin/inbox/route";
import { GET as inboxRawRoute } from "@/app/api/admin/inbox/[id]/route";
import { GET as unsubscribeGet, POST as unsubscribePost } from "@/app/api/unsubscribe/route";
import { apiRequest, createPerson, params, type TestPerson } from "@/tests/factories";
import { follow, makeTechnique } from "./factories";

const BASE = "https://plateroom.kestrel.test";
const none = params({});
let saved: { base?: string; data: string };
let dataDir: string;
let smtp: FakeSmtp;
let admin: TestPerson;
let artist: TestPerson;
let lead: TestPerson;

beforeAll(async () => {
  saved = { base: env.PLATEROOM_BASE_URL, data: env.PLATEROOM_DATA_DIR };
  dataDir = fs.mkdtempSync(path.join(os.tmpdir(), "plateroom-mail-routes-"));
  env.PLATEROOM_BASE_URL = BASE;
  // The inbox route reads PLATEROOM_DATA_DIR/mail-inbox, where this server stores what it gets.
  env.PLATEROOM_DATA_DIR = dataDir;
  smtp = await startFakeSmtp({ storeDir: path.join(dataDir, "mail-inbox"), quiet: true });
  admin = await createPerson("admin");
  artist = await createPerson("artist");
  lead = await createPerson("lead");
});

afterAll(async () => {
  env.PLATEROOM_BASE_URL = saved.base;
  env.PLATEROOM_DATA_DIR = saved.data;
  await smtp.stop();
  fs.rmSync(dataDir, { recursive: true, force: true });
});

beforeEach(async () => {
  await getDb().delete(outbox).where(gte(outbox.id, 0));
  await getDb().delete(subscriptions).where(sql`true`);
});

/** The error shape of shared/API.md: `{ error: { code, message } }`. */
async function expectError(res: Response, status: number, code: string): Promise<void> {
  expect(res.status).toBe(status);
  expect(res.headers.get("content-type")).toContain("application/json");
  const body = (await res.json()) as { error: { code: string; message: string } };
  expect(body.error.code).toBe(code);
  expect(typeof body.error.message).toBe("string");
  expect(body.error.message.length).toBeGreaterThan(0);
}

async function queue(subject: string, to = artist): Promise<number> {
  await getDb().transaction((tx) => enqueueMail(tx, { to, kind: "test", subject, html: `<p>${subject}</p>`, text: subject }));
  const [row] = await getDb().select({ id: outbox.id }).from(outbox).where(eq(outbox.subject, subject));
  return row!.id;
}

/** An approval that mails the artist (who follows the technique); returns the List-Unsubscribe URL of that message. */
async function approvalMailToArtist(): Promise<{ url: URL; techniqueSlug: string }> {
  const technique = await makeTechnique({ title: "Marker removal on a green cloth" });
  await follow(artist.id, "technique", technique.slug);
  await getDb().transaction((tx) =>
    notifyTechniqueEvent(tx, {
      kind: "revision-approved",
      actorId: lead.id,
      technique: { slug: technique.slug, title: technique.title, tagSlugs: [] },
      revisionNumber: 2,
      previousApprovedNumber: 1,
      changeNote: "Erode the matte by 2 px before the patch.",
    }),
  );
  const [row] = await getDb().select().from(outbox).where(eq(outbox.toEmail, artist.email));
  // RFC 2369 §3.2 (from memory): the header value is the URL in angle brackets.
  const link = /^<([^>]+)>$/.exec(row!.headers["List-Unsubscribe"] ?? "")?.[1];
  expect(link).toBeDefined();
  return { url: new URL(link!), techniqueSlug: technique.slug };
}

async function following(slug: string): Promise<boolean> {
  const rows = await getDb().select().from(subscriptions).where(eq(subscriptions.userId, artist.id));
  return rows.some((r) => r.kind === "technique" && r.key === slug);
}

/** The one-click POST as a mail receiver sends it: RFC 8058 §3.2 (from memory) — form-encoded "List-Unsubscribe=One-Click", no cookies or credentials. */
function oneClick(pathAndQuery: string, headers: Record<string, string> = {}): Request {
  return new Request(`http://localhost${pathAndQuery}`, {
    method: "POST",
    headers: { "Content-Type": "application/x-www-form-urlencoded", ...headers },
    body: "List-Unsubscribe=One-Click",
  });
}

describe("GET /api/admin/outbox", () => {
  it("is refused to the signed-out (401) and to non-admins (403), in the API error shape", async () => {
    await expectError(await listOutboxRoute(apiRequest("GET", "/api/admin/outbox", null), none), 401, "unauthorized");
    await expectError(await listOutboxRoute(apiRequest("GET", "/api/admin/outbox", artist), none), 403, "forbidden");
    await expectError(await listOutboxRoute(apiRequest("GET", "/api/admin/outbox", lead), none), 403, "forbidden");
  });

  it("gives admins { items, total, counts }, newest first, filtered by state and paged", async () => {
    const first = await queue("First message");
    const second = await queue("Second message");
    const third = await queue("Third message");
    await getDb().update(outbox).set({ state: "failed", lastError: "550 refused", attempts: 3 }).where(eq(outbox.id, first));

    const res = await listOutboxRoute(apiRequest("GET", "/api/admin/outbox", admin), none);
    expect(res.status).toBe(200);
    expect(res.headers.get("cache-control")).toContain("no-store");
    const body = (await res.json()) as OutboxListResponse;
    expect(Object.keys(body).sort()).toEqual(["counts", "items", "total"]);
    expect(body.total).toBe(3);
    expect(body.counts).toEqual({ queued: 2, sending: 0, sent: 0, failed: 1 });
    expect(body.items.map((i) => i.id)).toEqual([third, second, first]);
    const failed = body.items.find((i) => i.id === first)!;
    expect(failed).toMatchObject({ to: artist.email, subject: "First message", state: "failed", attempts: 3, lastError: "550 refused", sentAt: null });
    // Times are ISO 8601 UTC (shared/API.md).
    expect(failed.createdAt).toMatch(/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}\.\d{3}Z$/);

    const onlyFailed = (await (await listOutboxRoute(apiRequest("GET", "/api/admin/outbox?state=failed", admin), none)).json()) as OutboxListResponse;
    expect(onlyFailed.items.map((i) => i.id)).toEqual([first]);
    expect(onlyFailed.total).toBe(1);
    // Counts stay those of the whole outbox, so the tabs can show every state at once.
    expect(onlyFailed.counts.queued).toBe(2);

    const paged = (await (await listOutboxRoute(apiRequest("GET", "/api/admin/outbox?limit=1&offset=1", admin), none)).json()) as OutboxListResponse;
    expect(paged.items.map((i) => i.id)).toEqual([second]);
    expect(paged.total).toBe(3);

    await expectError(await listOutboxRoute(apiRequest("GET", "/api/admin/outbox?state=lost", admin), none), 400, "validation_failed");
    await expectError(await listOutboxRoute(apiRequest("GET", "/api/admin/outbox?limit=0", admin), none), 400, "validation_failed");
  });
});

describe("GET /api/admin/outbox/{id} and POST …/retry", () => {
  it("shows one message to admins; 404 for an unknown id, 400 for a malformed one", async () => {
    const id = await queue("One message");
    const res = await outboxItemRoute(apiRequest("GET", `/api/admin/outbox/${id}`, admin), params({ id: String(id) }));
    expect(res.status).toBe(200);
    const item = (await res.json()) as OutboxItemResponse;
    expect(item).toMatchObject({ id, subject: "One message", text: "One message", html: "<p>One message</p>", state: "queued" });
    // RFC 5322 §3.6.4 (from memory): msg-id is "<" id-left "@" id-right ">", fixed when queued.
    expect(item.messageId).toMatch(/^<[^<>@\s]+@[^<>@\s]+>$/);

    await expectError(await outboxItemRoute(apiRequest("GET", `/api/admin/outbox/${id + 1000}`, admin), params({ id: String(id + 1000) })), 404, "not_found");
    await expectError(await outboxItemRoute(apiRequest("GET", "/api/admin/outbox/abc", admin), params({ id: "abc" })), 400, "validation_failed");
    await expectError(await outboxItemRoute(apiRequest("GET", `/api/admin/outbox/${id}`, artist), params({ id: String(id) })), 403, "forbidden");
    await expectError(await outboxItemRoute(apiRequest("GET", `/api/admin/outbox/${id}`, null), params({ id: String(id) })), 401, "unauthorized");
  });

  it("queues a failed message again for admins only, and then delivers it; a sent one cannot be retried (409)", async () => {
    const id = await queue("Refused once");
    await getDb().update(outbox).set({ state: "failed", attempts: 3, lastError: "550 5.1.1 mailbox unavailable" }).where(eq(outbox.id, id));

    await expectError(await retryRoute(apiRequest("POST", `/api/admin/outbox/${id}/retry`, null), params({ id: String(id) })), 401, "unauthorized");
    await expectError(await retryRoute(apiRequest("POST", `/api/admin/outbox/${id}/retry`, artist), params({ id: String(id) })), 403, "forbidden");
    const [untouched] = await getDb().select().from(outbox).where(eq(outbox.id, id));
    expect(untouched!.state).toBe("failed");

    const res = await retryRoute(apiRequest("POST", `/api/admin/outbox/${id}/retry`, admin), params({ id: String(id) }));
    expect(res.status).toBe(200);
    expect(await res.json()).toMatchObject({ id, state: "queued", attempts: 0 });

    const before = smtp.messages().length;
    const flushed = await flushUntilIdle({ smtpUrl: smtp.url });
    expect(flushed.sent).toBe(1);
    expect(smtp.messages().slice(before).map((m) => m.subject)).toEqual(["Refused once"]);

    await expectError(await retryRoute(apiRequest("POST", `/api/admin/outbox/${id}/retry`, admin), params({ id: String(id) })), 409, "conflict");
    await expectError(await retryRoute(apiRequest("POST", "/api/admin/outbox/999999/retry", admin), params({ id: "999999" })), 404, "not_found");
  });
});

describe("GET /api/admin/inbox", () => {
  it("lists what the fake SMTP server received, with the headers as sent; admins only", async () => {
    const { url } = await approvalMailToArtist();
    const before = smtp.messages().length;
    expect((await flushUntilIdle({ smtpUrl: smtp.url })).sent).toBe(1);
    const [delivered] = smtp.messages().slice(before);

    await expectError(await inboxRoute(apiRequest("GET", "/api/admin/inbox", null), none), 401, "unauthorized");
    await expectError(await inboxRoute(apiRequest("GET", "/api/admin/inbox", artist), none), 403, "forbidden");
    const res = await inboxRoute(apiRequest("GET", "/api/admin/inbox", admin), none);
    expect(res.status).toBe(200);
    const { items } = (await res.json()) as { items: InboxMessage[] };
    const shown = items.find((m) => m.messageId === delivered!.messageId)!;
    expect(shown).toBeDefined();
    expect(items[0]!.id).toBe(shown.id); // newest first
    expect(shown.envelope.to).toEqual([artist.email]);
    expect(shown.subject).toBe("Updated: Marker removal on a green cloth (revision 2)");
    // RFC 2369 §3.2 and RFC 8058 §3.1 (from memory): the two headers arrive as written in the outbox.
    expect(shown.headers["list-unsubscribe"]).toBe(`<${url.href}>`);
    expect(shown.headers["list-unsubscribe-post"]).toBe("List-Unsubscribe=One-Click");
    expect(shown.html).toContain("Erode the matte by 2 px before the patch.");
    expect(shown.text).toContain("Erode the matte by 2 px before the patch.");

    const raw = await inboxRawRoute(apiRequest("GET", `/api/admin/inbox/${shown.id}`, admin), params({ id: shown.id }));
    expect(raw.status).toBe(200);
    // RFC 2046 §5.2.1 (from memory): a whole message travels as message/rfc822.
    expect(raw.headers.get("content-type")).toBe("message/rfc822");
    expect(await raw.text()).toMatch(/^List-Unsubscribe-Post: List-Unsubscribe=One-Click\r?$/m);
    await expectError(await inboxRawRoute(apiRequest("GET", "/api/admin/inbox/../../etc/passwd", admin), params({ id: "../../etc/passwd" })), 404, "not_found");
    await expectError(await inboxRawRoute(apiRequest("GET", `/api/admin/inbox/${shown.id}`, artist), params({ id: shown.id })), 403, "forbidden");
  });
});

describe("/api/unsubscribe (RFC 8058 one-click, RFC 2369 List-Unsubscribe)", () => {
  it("GET never unsubscribes: it sends the person to the confirmation page (303)", async () => {
    const { url, techniqueSlug } = await approvalMailToArtist();
    // RFC 8058 §3.1 (from memory) requires the List-Unsubscribe URI to be HTTPS; ours follows PLATEROOM_BASE_URL.
    expect(url.protocol).toBe("https:");
    expect(url.pathname).toBe("/api/unsubscribe");
    const token = url.searchParams.get("token")!;

    // A link scanner or a person's click: RFC 8058 §1 (from memory) — anti-spam software fetches links in mail, so a GET must not unsubscribe.
    const res = await unsubscribeGet(new Request(`http://localhost${url.pathname}${url.search}`), none);
    // RFC 9110 §15.4.4 (from memory): 303 See Other, the follow-up request is a GET of Location.
    expect(res.status).toBe(303);
    const location = new URL(res.headers.get("location")!, "http://localhost");
    expect(location.pathname).toBe("/unsubscribe");
    expect(location.searchParams.get("token")).toBe(token);
    expect(await following(techniqueSlug)).toBe(true);
  });

  it("the one-click POST works once without a session, is harmless a second time, and a tampered token is a 400", async () => {
    const { url, techniqueSlug } = await approvalMailToArtist();
    const token = url.searchParams.get("token")!;
    const tampered = token.slice(0, 8) + (token[8] === "A" ? "B" : "A") + token.slice(9);
    for (const bad of [tampered, `${token}x`, token.split(".")[0]!]) {
      await expectError(await unsubscribePost(oneClick(`/api/unsubscribe?token=${encodeURIComponent(bad)}`)), 400, "bad_request");
    }
    await expectError(await unsubscribePost(oneClick("/api/unsubscribe")), 400, "validation_failed");
    // RFC 8058 §3.1/§3.2 (from memory): the POST body is "List-Unsubscribe=One-Click"; anything else is not a one-click request.
    const wrongBody = new Request(`http://localhost${url.pathname}${url.search}`, {
      method: "POST",
      headers: { "Content-Type": "application/x-www-form-urlencoded" },
      body: "List-Unsubscribe=Later",
    });
    await expectError(await unsubscribePost(wrongBody), 400, "bad_request");
    expect(await following(techniqueSlug)).toBe(true);

    // No Authorization header and no cookie: the signed token is the only authority.
    // A webmail page elsewhere may make the POST itself: its Origin is not ours, and that is fine here.
    const first = await unsubscribePost(oneClick(`${url.pathname}${url.search}`, { Origin: "https://webmail.example.net" }));
    expect(first.status).toBe(200);
    expect(await first.json()).toEqual({ unsubscribed: true, removed: 1, target: { kind: "technique", key: techniqueSlug } });
    expect(await following(techniqueSlug)).toBe(false);

    // RFC 8058 §3.2 (from memory) forbids answering the POST with a redirect: both answers are plain 200s.
    // Mail systems may retry the POST; the second one succeeds and changes nothing.
    const second = await unsubscribePost(oneClick(`${url.pathname}${url.search}`));
    expect(second.status).toBe(200);
    expect(await second.json()).toMatchObject({ unsubscribed: true, removed: 0 });
  });

  it("a tampered token in the GET link still only redirects; the page then explains it is not valid", async () => {
    const res = await unsubscribeGet(new Request("http://localhost/api/unsubscribe?token=not-a-token"), none);
    expect(res.status).toBe(303);
    expect(res.headers.get("location")).toBe("/unsubscribe?token=not-a-token");
  });
});
