import "server-only";
import { and, asc, eq, gte, inArray, isNull, lte, sql } from "drizzle-orm";
import nodemailer from "nodemailer";
import { getDb, type Database } from "@/db/client";
import { digestItems, outbox, users, type OutboxMessage } from "@/db/schema";
import { AppError } from "@/lib/api/errors";
import { assertCan } from "@/lib/auth/permissions";
import type { SessionUser } from "@/lib/auth/roles";
import { writeAudit } from "@/lib/audit/log";
import { baseUrl, env } from "@/lib/env";
import { enqueueMail } from "@/lib/mail/outbox";
import { toOutboxItem } from "@/lib/mail/queries";
import type { OutboxItemResponse } from "@/lib/mail/schemas";
import { digestMail } from "@/lib/mail/templates";

/** Waits after a refused message: attempt 1 → 5 s, 2 → 30 s, then 2 min, 10 min, 30 min, 1 h. */
const RETRY_DELAYS_MS = [5_000, 30_000, 120_000, 600_000, 1_800_000, 3_600_000] as const;
/** A temporary refusal (4xx) is retried this many times; a permanent one (5xx) fewer. */
const MAX_ATTEMPTS = 6;
export const MAX_ATTEMPTS_PERMANENT = 3;
/** While the server cannot be reached at all, retry every 5 s growing to at most 1 min, without limit: nothing is dropped. */
const OUTAGE_RETRY_MIN_MS = 5_000;
const OUTAGE_RETRY_MAX_MS = 60_000;
/** A row left in "sending" longer than this belongs to a crashed sender and is queued again. */
const SENDING_LEASE_MS = 5 * 60_000;
const SENDER_INTERVAL_MS = 5_000;

// Errors that mean "no server to talk to", not "the server refused this message".
const UNREACHABLE_CODES = new Set(["ECONNECTION", "ECONNREFUSED", "ECONNRESET", "ETIMEDOUT", "ESOCKET", "EDNS", "ETLS", "EAUTH", "EPROTOCOL"]);

type FlushResult = {
  /** Rows taken for sending in this run. */
  claimed: number;
  sent: number;
  /** Refused, to be tried again later. */
  retried: number;
  /** Given up on (state failed, reason recorded). */
  failed: number;
  /** Put back untouched because the server could not be reached. */
  deferred: number;
  /** Rows found stuck in "sending" (crashed sender) and queued again. */
  recovered: number;
};

type SenderState = { outages: number; timer?: ReturnType<typeof setInterval>; busy: boolean; lastDigestDay?: string };
const holder = globalThis as unknown as { __plateroomMailSender?: SenderState };
const state: SenderState = (holder.__plateroomMailSender ??= { outages: 0, busy: false });

type SmtpError = Error & { code?: string; responseCode?: number; response?: string };

function describe(err: SmtpError): string {
  const parts = [err.code, err.responseCode ? String(err.responseCode) : undefined, err.response ?? err.message].filter(Boolean);
  return parts.join(" ").slice(0, 1000);
}

function isUnreachable(err: SmtpError): boolean {
  if (typeof err.responseCode === "number" && err.code !== "EAUTH") return false;
  return err.code === undefined || UNREACHABLE_CODES.has(err.code);
}

/**
 * SMTP_URL → transport options. Not `createTransport(url)`: nodemailer then ignores every other
 * option (pooling, timeouts), and a fresh connection per message is ~3× slower.
 */
export function smtpOptions(url: string) {
  const u = new URL(url);
  if (u.protocol !== "smtp:" && u.protocol !== "smtps:") throw new Error(`SMTP_URL must start with smtp:// or smtps:// (got ${u.protocol})`);
  const secure = u.protocol === "smtps:";
  return {
    host: u.hostname.replace(/^\[|\]$/g, ""),
    port: u.port ? Number(u.port) : secure ? 465 : 587,
    secure,
    ...(u.username ? { auth: { user: decodeURIComponent(u.username), pass: decodeURIComponent(u.password) } } : {}),
  };
}

function createTransport(url: string) {
  return nodemailer.createTransport({
    ...smtpOptions(url),
    pool: true,
    maxConnections: 1,
    connectionTimeout: 10_000,
    greetingTimeout: 10_000,
    socketTimeout: 30_000,
  });
}

/** Queues again rows whose sender died mid-send (the lease in next_attempt_at ran out). */
async function recoverStuck(db: Database, now: Date): Promise<number> {
  const rows = await db
    .update(outbox)
    .set({ state: "queued", nextAttemptAt: now, lastError: "Sender stopped while sending; queued again (same Message-ID)." })
    .where(and(eq(outbox.state, "sending"), lte(outbox.nextAttemptAt, now)))
    .returning({ id: outbox.id });
  return rows.length;
}

/**
 * Takes up to `limit` due rows in one statement. FOR UPDATE SKIP LOCKED lets two senders (the
 * server's loop and `npm run mail:flush`) run at once without taking the same row.
 */
async function claim(db: Database, now: Date, limit: number): Promise<OutboxMessage[]> {
  const due = db
    .select({ id: outbox.id })
    .from(outbox)
    .where(and(eq(outbox.state, "queued"), lte(outbox.nextAttemptAt, now)))
    .orderBy(asc(outbox.nextAttemptAt), asc(outbox.id))
    .limit(limit)
    .for("update", { skipLocked: true });
  const rows = await db
    .update(outbox)
    .set({ state: "sending", attempts: sql`${outbox.attempts} + 1`, nextAttemptAt: new Date(now.getTime() + SENDING_LEASE_MS) })
    .where(and(inArray(outbox.id, due), eq(outbox.state, "queued")))
    .returning();
  return rows.sort((a, b) => a.id - b.id);
}

/**
 * Sends what is due. A row is marked sent right after the server accepted it; its Message-ID
 * was fixed when queued, so a re-send after a crash between the two is recognisable.
 */
export async function flushOutbox(opts: { now?: Date; limit?: number; smtpUrl?: string } = {}): Promise<FlushResult> {
  const db = getDb();
  const now = opts.now ?? new Date();
  const result: FlushResult = { claimed: 0, sent: 0, retried: 0, failed: 0, deferred: 0, recovered: await recoverStuck(db, now) };
  const rows = await claim(db, now, opts.limit ?? 50);
  result.claimed = rows.length;
  if (rows.length === 0) return result;

  const userIds = [...new Set(rows.map((r) => r.toUserId).filter((id): id is string => !!id))];
  const names = new Map<string, string>();
  if (userIds.length > 0) {
    for (const u of await db.select({ id: users.id, name: users.name }).from(users).where(inArray(users.id, userIds))) names.set(u.id, u.name);
  }

  const transport = createTransport(opts.smtpUrl ?? env.SMTP_URL);
  try {
    for (let i = 0; i < rows.length; i++) {
      const row = rows[i]!;
      const name = row.toUserId ? names.get(row.toUserId) : undefined;
      try {
        await transport.sendMail({
          from: env.PLATEROOM_MAIL_FROM,
          to: name ? { name, address: row.toEmail } : row.toEmail,
          subject: row.subject,
          text: row.text,
          html: row.html,
          messageId: row.messageId,
          date: row.createdAt,
          headers: Object.entries(row.headers).map(([key, value]) => ({ key, value })),
        });
        await db.update(outbox).set({ state: "sent", sentAt: new Date(), lastError: null }).where(eq(outbox.id, row.id));
        result.sent++;
        state.outages = 0;
      } catch (error) {
        const err = error as SmtpError;
        if (isUnreachable(err)) {
          // No server: this and the rest of the batch go back unchanged (the claim's attempt is undone).
          const wait = Math.min(OUTAGE_RETRY_MIN_MS * 2 ** state.outages, OUTAGE_RETRY_MAX_MS);
          state.outages = Math.min(state.outages + 1, 16);
          const rest = rows.slice(i).map((r) => r.id);
          await db
            .update(outbox)
            .set({
              state: "queued",
              attempts: sql`greatest(${outbox.attempts} - 1, 0)`,
              nextAttemptAt: new Date(now.getTime() + wait),
              lastError: `Mail server unreachable: ${describe(err)}`,
            })
            .where(and(inArray(outbox.id, rest), eq(outbox.state, "sending")));
          result.deferred += rest.length;
          break;
        }
        const permanent = (err.responseCode ?? 0) >= 500;
        const limit = permanent ? MAX_ATTEMPTS_PERMANENT : MAX_ATTEMPTS;
        if (row.attempts >= limit) {
          await db.update(outbox).set({ state: "failed", lastError: describe(err) }).where(eq(outbox.id, row.id));
          result.failed++;
        } else {
          const wait = RETRY_DELAYS_MS[Math.min(row.attempts - 1, RETRY_DELAYS_MS.length - 1)]!;
          await db
            .update(outbox)
            .set({ state: "queued", nextAttemptAt: new Date(now.getTime() + wait), lastError: describe(err) })
            .where(eq(outbox.id, row.id));
          result.retried++;
        }
      }
    }
  } finally {
    transport.close();
  }
  return result;
}

/** Flushes batch after batch until nothing is due (what `npm run mail:flush` does). */
export async function flushUntilIdle(opts: { now?: Date; smtpUrl?: string; batch?: number } = {}): Promise<FlushResult> {
  const total: FlushResult = { claimed: 0, sent: 0, retried: 0, failed: 0, deferred: 0, recovered: 0 };
  for (;;) {
    const r = await flushOutbox({ now: opts.now, smtpUrl: opts.smtpUrl, limit: opts.batch });
    for (const k of Object.keys(total) as (keyof FlushResult)[]) total[k] += r[k];
    if (r.claimed === 0 || r.deferred > 0) return total;
  }
}

function localDayKey(d: Date): string {
  return `${d.getFullYear()}-${String(d.getMonth() + 1).padStart(2, "0")}-${String(d.getDate()).padStart(2, "0")}`;
}

function startOfLocalDay(d: Date): Date {
  const s = new Date(d);
  s.setHours(0, 0, 0, 0);
  return s;
}

/**
 * One digest message per person per day, grouping their pending digest items up to `now`.
 * Someone who already had a digest today (by server-local day) waits for tomorrow's, so a
 * restarted server does not send a second one.
 */
export async function composeDigests(now: Date = new Date()): Promise<{ digests: number; items: number }> {
  const db = getDb();
  const dayStart = startOfLocalDay(now);
  const pending = await db
    .selectDistinct({ userId: digestItems.userId })
    .from(digestItems)
    .where(and(isNull(digestItems.digestedAt), lte(digestItems.createdAt, now)));
  let digests = 0;
  let itemCount = 0;
  for (const { userId } of pending) {
    const made = await db.transaction(async (tx) => {
      const [already] = await tx
        .select({ id: digestItems.id })
        .from(digestItems)
        .where(and(eq(digestItems.userId, userId), gte(digestItems.digestedAt, dayStart), lte(digestItems.digestedAt, now)))
        .limit(1);
      if (already) return 0;
      const items = await tx
        .select()
        .from(digestItems)
        .where(and(eq(digestItems.userId, userId), isNull(digestItems.digestedAt), lte(digestItems.createdAt, now)))
        .orderBy(asc(digestItems.createdAt), asc(digestItems.id))
        .for("update");
      if (items.length === 0) return 0;
      await tx
        .update(digestItems)
        .set({ digestedAt: now })
        .where(inArray(digestItems.id, items.map((i) => i.id)));
      const [person] = await tx.select().from(users).where(eq(users.id, userId)).limit(1);
      // Disabled people's items are closed without mail so they do not pile up.
      if (!person || person.disabledAt) return 0;
      const day = now.toLocaleDateString("en-GB", { weekday: "long", day: "numeric", month: "long", year: "numeric" });
      await enqueueMail(tx, {
        to: person,
        kind: "digest",
        content: digestMail({ name: person.name, day, entries: items, settingsUrl: `${baseUrl()}/settings` }),
        // Stopping the digest with one click stops what feeds it: all of the person's subscriptions.
        unsubscribe: { userId, kind: "all", key: "*" },
      });
      return items.length;
    });
    if (made > 0) {
      digests++;
      itemCount += made;
    }
  }
  return { digests, items: itemCount };
}

/** Admin: sends a failed (or waiting) message again as soon as the sender next runs. */
export async function retryFailed(actor: SessionUser, id: number): Promise<OutboxItemResponse> {
  assertCan(actor, "mail:read-outbox");
  return getDb().transaction(async (tx) => {
    const [row] = await tx.select().from(outbox).where(eq(outbox.id, id)).limit(1).for("update");
    if (!row) throw new AppError("not_found", "No such message in the outbox.");
    if (row.state === "sent" || row.state === "sending") throw new AppError("conflict", `This message is ${row.state}; only failed or waiting messages can be retried.`);
    const [updated] = await tx
      .update(outbox)
      .set({ state: "queued", attempts: 0, nextAttemptAt: new Date() })
      .where(eq(outbox.id, id))
      .returning();
    await writeAudit(tx, { actorId: actor.id, action: "mail.retry", targetType: "outbox", targetId: String(id), detail: { previousState: row.state, lastError: row.lastError } });
    return toOutboxItem(updated!);
  });
}

async function tick(): Promise<void> {
  if (state.busy) return;
  state.busy = true;
  try {
    const now = new Date();
    const day = localDayKey(now);
    if (now.getHours() >= env.PLATEROOM_DIGEST_HOUR && state.lastDigestDay !== day) {
      await composeDigests(now);
      state.lastDigestDay = day;
    }
    await flushUntilIdle({ now });
  } catch (error) {
    console.error("[mail] sender run failed:", error);
  } finally {
    state.busy = false;
  }
}

/**
 * Starts the in-process sender loop once per process (HMR and repeated calls reuse it). The
 * timer is unref'd so it never keeps a script or test alive. Returns a stop function.
 */
export function startMailSender(opts: { intervalMs?: number } = {}): () => void {
  if (!state.timer) {
    state.timer = setInterval(() => void tick(), opts.intervalMs ?? SENDER_INTERVAL_MS);
    state.timer.unref?.();
    void tick();
  }
  return stopMailSender;
}

function stopMailSender(): void {
  if (state.timer) clearInterval(state.timer);
  state.timer = undefined;
}
