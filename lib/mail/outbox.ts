import "server-only";
import crypto from "node:crypto";
import type { Database } from "@/db/client";
import { outbox } from "@/db/schema";
import { env } from "@/lib/env";
import { escapeHtml, renderMail, safeHref, type MailContent } from "@/lib/mail/templates";
import { unsubscribeUrl, type UnsubscribeTarget } from "@/lib/mail/unsubscribe";

type MailRecipient = { id?: string; email: string; name?: string };

type Rendered = { subject: string; html: string; text: string };

type EnqueueMailInput = {
  to: MailRecipient;
  /** e.g. "invite", "revision-approved", "digest"; shown in the admin outbox. */
  kind: string;
  /** Makes this a subscription message: List-Unsubscribe headers and a link in the body. */
  unsubscribe?: UnsubscribeTarget;
  /** Not before this time (default: at once). */
  sendAfter?: Date;
} & (Rendered | { content: MailContent });

export type Tx = Pick<Database, "insert" | "select">;

/** The domain of PLATEROOM_MAIL_FROM, for Message-IDs (RFC 5322 §3.6.4 wants a unique id-right, from memory). */
function mailDomain(from: string = env.PLATEROOM_MAIL_FROM): string {
  const match = /@([A-Za-z0-9.-]+)/.exec(from);
  return match?.[1] ?? "plateroom.invalid";
}

function newMessageId(): string {
  return `<${crypto.randomUUID()}@${mailDomain()}>`;
}

/**
 * Writes one message to the outbox in the caller's transaction, so it exists exactly when the
 * change that caused it commits. The Message-ID is fixed here: a re-send after a lost
 * acknowledgement carries the same one, and receivers can spot the duplicate.
 */
export async function enqueueMail(tx: Tx, message: EnqueueMailInput): Promise<void> {
  const listUrl = message.unsubscribe ? unsubscribeUrl(message.unsubscribe) : undefined;
  let rendered: Rendered;
  if ("content" in message) {
    rendered = renderMail({ ...message.content, unsubscribeUrl: listUrl ?? message.content.unsubscribeUrl });
  } else {
    rendered = { subject: message.subject, html: message.html, text: message.text };
    if (listUrl) rendered = withUnsubscribeFooter(rendered, listUrl);
  }
  const headers: Record<string, string> = { "X-Plateroom-Kind": message.kind };
  if (listUrl) {
    // RFC 2369 §3.2 (List-Unsubscribe, angle-bracketed URL) and RFC 8058 §3.1 (one-click POST).
    headers["List-Unsubscribe"] = `<${listUrl}>`;
    headers["List-Unsubscribe-Post"] = "List-Unsubscribe=One-Click";
  }
  await tx.insert(outbox).values({
    toEmail: message.to.email,
    toUserId: message.to.id ?? null,
    kind: message.kind,
    subject: rendered.subject,
    text: rendered.text,
    html: rendered.html,
    headers,
    messageId: newMessageId(),
    ...(message.sendAfter ? { nextAttemptAt: message.sendAfter } : {}),
  });
}

/** For callers that render their own parts: the body must carry the link as well as the header. */
function withUnsubscribeFooter(m: Rendered, url: string): Rendered {
  const line = `<p style="font-size:12px;color:#71717a;"><a href="${escapeHtml(safeHref(url))}">Unsubscribe</a> with one click, no sign-in needed.</p>`;
  const html = m.html.includes("</body>") ? m.html.replace("</body>", `${line}</body>`) : m.html + line;
  return { ...m, html, text: `${m.text.trimEnd()}\n\nUnsubscribe with one click: ${url}\n` };
}
