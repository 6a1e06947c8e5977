import "server-only";
import crypto from "node:crypto";
import { and, eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { subscriptions } from "@/db/schema";
import { AppError } from "@/lib/api/errors";
import { authSecret } from "@/lib/auth/secret";
import { writeAudit } from "@/lib/audit/log";
import { baseUrl } from "@/lib/env";

/** What one unsubscribe link removes: one subscription, or ("all") every subscription of the person (digests). */
export type UnsubscribeTarget = { userId: string; kind: "technique" | "tag" | "show" | "all"; key: string };

export const UNSUBSCRIBE_VALID_MS = 90 * 24 * 60 * 60 * 1000;

// A label of its own so an unsubscribe signature can never be replayed as another use of AUTH_SECRET.
const HMAC_LABEL = "plateroom.unsubscribe.v1";
const KINDS = new Set(["technique", "tag", "show", "all"]);

function signature(payload: string): Buffer {
  const key = crypto.createHmac("sha256", authSecret()).update(HMAC_LABEL).digest();
  return crypto.createHmac("sha256", key).update(payload).digest();
}

/** `base64url(JSON {u,k,s,e}).base64url(HMAC-SHA256)`; e is the expiry in seconds since 1970. */
export function createUnsubscribeToken(target: UnsubscribeTarget, now: Date = new Date()): string {
  const exp = Math.floor((now.getTime() + UNSUBSCRIBE_VALID_MS) / 1000);
  const payload = Buffer.from(JSON.stringify({ u: target.userId, k: target.kind, s: target.key, e: exp })).toString("base64url");
  return `${payload}.${signature(payload).toString("base64url")}`;
}

/** Checks signature (constant time) and expiry; throws bad_request for anything tampered, malformed or old. */
export function verifyUnsubscribeToken(token: string, now: Date = new Date()): UnsubscribeTarget {
  const refused = new AppError("bad_request", "This unsubscribe link is not valid or has expired. Manage your subscriptions in your settings.");
  const parts = token.split(".");
  if (parts.length !== 2 || !parts[0] || !parts[1]) throw refused;
  const [payload, sig] = parts as [string, string];
  const given = Buffer.from(sig, "base64url");
  const expected = signature(payload);
  if (given.length !== expected.length || !crypto.timingSafeEqual(given, expected)) throw refused;
  let data: unknown;
  try {
    data = JSON.parse(Buffer.from(payload, "base64url").toString("utf8"));
  } catch {
    throw refused;
  }
  const d = data as { u?: unknown; k?: unknown; s?: unknown; e?: unknown };
  if (typeof d.u !== "string" || typeof d.k !== "string" || !KINDS.has(d.k) || typeof d.s !== "string" || typeof d.e !== "number") throw refused;
  if (d.e * 1000 <= now.getTime()) throw refused;
  return { userId: d.u, kind: d.k as UnsubscribeTarget["kind"], key: d.s };
}

export function unsubscribeUrl(target: UnsubscribeTarget, now?: Date): string {
  return `${baseUrl()}/api/unsubscribe?token=${encodeURIComponent(createUnsubscribeToken(target, now))}`;
}

type UnsubscribeResult = { removed: number; target: { kind: UnsubscribeTarget["kind"]; key: string } };

/**
 * The one-click action (RFC 8058): needs no session, the signature is the authority.
 * Idempotent: a second use succeeds and removes nothing.
 */
export async function applyUnsubscribe(token: string, now: Date = new Date()): Promise<UnsubscribeResult> {
  const target = verifyUnsubscribeToken(token, now);
  return getDb().transaction(async (tx) => {
    const where =
      target.kind === "all"
        ? eq(subscriptions.userId, target.userId)
        : and(eq(subscriptions.userId, target.userId), eq(subscriptions.kind, target.kind), eq(subscriptions.key, target.key));
    const removed = await tx.delete(subscriptions).where(where).returning({ id: subscriptions.id });
    if (removed.length > 0) {
      await writeAudit(tx, {
        actorId: target.userId,
        action: "subscription.unsubscribe-link",
        targetType: "subscription",
        targetId: `${target.kind}:${target.key}`,
        detail: { removed: removed.length },
      });
    }
    return { removed: removed.length, target: { kind: target.kind, key: target.key } };
  });
}
