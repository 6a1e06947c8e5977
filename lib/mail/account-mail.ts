import "server-only";
import type { Database } from "@/db/client";
import { enqueueMail } from "@/lib/mail/outbox";
import { inviteMail, resetMail } from "@/lib/mail/templates";

/**
 * Invitation and password-reset mail, written in the caller's transaction (so a rolled-back
 * invite sends nothing). Account mail is not a subscription: no unsubscribe link.
 */
export async function enqueueAccountMail(
  tx: Pick<Database, "insert" | "select">,
  m: { kind: "invite" | "reset"; to: { id: string; email: string; name: string }; link: string; invitedBy?: string },
): Promise<void> {
  const content =
    m.kind === "invite" ? inviteMail({ name: m.to.name, link: m.link, invitedBy: m.invitedBy }) : resetMail({ name: m.to.name, link: m.link });
  await enqueueMail(tx, { to: m.to, kind: m.kind, content });
}
