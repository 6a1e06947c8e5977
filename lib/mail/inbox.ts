import "server-only";
import fs from "node:fs/promises";
import path from "node:path";
import { assertCan } from "@/lib/auth/permissions";
import type { SessionUser } from "@/lib/auth/roles";
import { env } from "@/lib/env";
import type { InboxMessage } from "@/lib/mail/schemas";

/**
 * The local inbox the admin mail view shows: what the demo's fake SMTP server
 * (scripts/fake-smtp/server.ts) stored as `<id>.eml` plus `<id>.json`. Read only here.
 */

/** Where the demo's fake server keeps what it receives, and where the admin mail view reads it. */
export function inboxDir(): string {
  return path.resolve(env.PLATEROOM_DATA_DIR, "mail-inbox");
}

/** Admin: the received messages, newest first. */
export async function listInbox(actor: SessionUser, opts: { limit?: number } = {}): Promise<InboxMessage[]> {
  assertCan(actor, "mail:read-outbox");
  return readInbox(inboxDir(), opts);
}

/** Admin: one received message exactly as it arrived; null when there is no such message. */
export async function getInboxRaw(actor: SessionUser, id: string): Promise<Buffer | null> {
  assertCan(actor, "mail:read-outbox");
  return readInboxRaw(id, inboxDir());
}

/** What a fake server stored in `dir`, newest first; a missing folder is an empty inbox. */
export async function readInbox(dir: string = inboxDir(), opts: { limit?: number } = {}): Promise<InboxMessage[]> {
  let names: string[];
  try {
    // The folder is configuration (PLATEROOM_DATA_DIR), known only at run time.
    names = await fs.readdir(/* turbopackIgnore: true */ dir);
  } catch {
    return [];
  }
  const files = names
    .filter((n) => n.endsWith(".json"))
    .sort()
    .reverse()
    .slice(0, opts.limit ?? 200);
  const out: InboxMessage[] = [];
  for (const file of files) {
    try {
      out.push(JSON.parse(await fs.readFile(path.join(dir, file), "utf8")) as InboxMessage);
    } catch {
      // A message still being written, or a stray file: skip it rather than fail the whole view.
    }
  }
  return out;
}

/** The raw message exactly as received, for "download .eml". Ids are checked so no other file can be read. */
async function readInboxRaw(id: string, dir: string = inboxDir()): Promise<Buffer | null> {
  if (!/^[0-9]{14}-[0-9]{6}-[0-9a-f]{8}$/.test(id)) return null;
  try {
    return await fs.readFile(path.join(dir, `${id}.eml`));
  } catch {
    return null;
  }
}
