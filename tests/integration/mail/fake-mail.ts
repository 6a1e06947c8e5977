import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { gte } from "drizzle-orm";
import { afterAll, beforeAll, beforeEach } from "vitest";
import { getDb } from "@/db/client";
import { digestItems, outbox } from "@/db/schema";
import { env } from "@/lib/env";
import type { InboxMessage } from "@/lib/mail/schemas";
import { flushUntilIdle } from "@/lib/mail/sender";
import { startFakeSmtp, type FakeSmtp } from "@/scripts/fake-smtp/server";

/** The base URL mail links use in these tests: RFC 8058 §3.1 wants an HTTPS unsubscribe URI. */
export const MAIL_BASE = "https://plateroom.kestrel.test";

/**
 * One fake SMTP server for a test file (its received mail stored in a temporary folder), links
 * pointing at MAIL_BASE, and an empty outbox and digest queue before each test. Call at the top of
 * the file; `smtp` and `storeDir` are there once the file's tests run.
 */
export function setUpFakeMail() {
  let smtp: FakeSmtp | undefined;
  let storeDir = "";
  let savedBase: string | undefined;
  beforeAll(async () => {
    savedBase = env.PLATEROOM_BASE_URL;
    env.PLATEROOM_BASE_URL = MAIL_BASE;
    storeDir = fs.mkdtempSync(path.join(os.tmpdir(), "plateroom-mail-"));
    smtp = await startFakeSmtp({ storeDir, quiet: true });
  });
  afterAll(async () => {
    env.PLATEROOM_BASE_URL = savedBase;
    await smtp?.stop();
    fs.rmSync(storeDir, { recursive: true, force: true });
  });
  beforeEach(async () => {
    await getDb().delete(outbox).where(gte(outbox.id, 0));
    await getDb().delete(digestItems).where(gte(digestItems.id, 0));
  });
  const server = (): FakeSmtp => {
    if (!smtp) throw new Error("setUpFakeMail: the fake SMTP server starts in beforeAll; use it inside tests.");
    return smtp;
  };
  return {
    get smtp() {
      return server();
    },
    get storeDir() {
      return storeDir;
    },
    /** Sends everything queued to the fake server; what the flush counted and what the server received in this run. */
    async deliver(): Promise<{ sent: number; messages: InboxMessage[] }> {
      const before = server().messages().length;
      const { sent } = await flushUntilIdle({ smtpUrl: server().url });
      return { sent, messages: server().messages().slice(before) };
    },
  };
}
