import crypto from "node:crypto";
import fs from "node:fs/promises";
import path from "node:path";
import type { AddressInfo } from "node:net";
import { simpleParser, type AddressObject } from "mailparser";
import { SMTPServer } from "smtp-server";
import type { InboxMessage } from "@/lib/mail/schemas";

export type FakeSmtp = {
  port: number;
  host: string;
  url: string;
  storeDir: string;
  /** Messages this instance received, oldest first. */
  messages(): InboxMessage[];
  /** Resolves when the next `n` messages (counted from now) have been stored. */
  waitFor(n: number, timeoutMs?: number): Promise<void>;
  stop(): Promise<void>;
};

/** Header values as they arrived (unfolded per RFC 5322 §2.2.3, from memory; encoded-words left as they are). */
function rawHeaders(lines: ReadonlyArray<{ key: string; line: string }>): Record<string, string> {
  const out: Record<string, string> = {};
  for (const { key, line } of lines) {
    const colon = line.indexOf(":");
    const value = line
      .slice(colon + 1)
      .replace(/\r?\n[ \t]/g, " ")
      .trim();
    const k = key.toLowerCase();
    out[k] = out[k] === undefined ? value : `${out[k]}, ${value}`;
  }
  return out;
}

function addressText(a: AddressObject | AddressObject[] | undefined): string {
  if (!a) return "";
  return (Array.isArray(a) ? a : [a]).map((x) => x.text).join(", ");
}

/**
 * A local SMTP server for the demo and the tests: accepts any mail without auth or TLS and
 * stores each message as `<id>.eml` (the raw bytes) plus `<id>.json` (parsed, see InboxMessage).
 */
export async function startFakeSmtp(opts: {
  port?: number;
  host?: string;
  storeDir: string;
  quiet?: boolean;
  /** For tests: an SMTP reply code (e.g. 550, 451) to refuse a recipient with, or null to accept. */
  refuseRecipient?: (address: string) => number | null;
}): Promise<FakeSmtp> {
  const host = opts.host ?? "127.0.0.1";
  const storeDir = path.resolve(opts.storeDir);
  await fs.mkdir(storeDir, { recursive: true });
  const received: InboxMessage[] = [];
  const waiters: { target: number; resolve: () => void }[] = [];
  let seq = 0;

  const store = async (raw: Buffer, envelope: InboxMessage["envelope"]): Promise<InboxMessage> => {
    // The HTML↔text conversions are slow (~100 ms a message) and we store both parts as sent anyway.
    const parsed = await simpleParser(raw, { skipHtmlToText: true, skipTextToHtml: true, skipTextLinks: true, skipImageLinks: true });
    const receivedAt = new Date();
    // Sortable by name: time first, then a counter and a random part for uniqueness.
    const id = `${receivedAt.getTime().toString().padStart(14, "0")}-${String(++seq).padStart(6, "0")}-${crypto.randomBytes(4).toString("hex")}`;
    const message: InboxMessage = {
      id,
      receivedAt: receivedAt.toISOString(),
      envelope,
      messageId: parsed.messageId ? `<${parsed.messageId.replace(/^<|>$/g, "")}>` : null,
      date: parsed.date?.toISOString() ?? null,
      from: addressText(parsed.from),
      to: addressText(parsed.to),
      subject: parsed.subject ?? "",
      text: parsed.text ?? "",
      html: typeof parsed.html === "string" ? parsed.html : null,
      headers: rawHeaders(parsed.headerLines),
    };
    await fs.writeFile(path.join(storeDir, `${id}.eml`), raw);
    await fs.writeFile(path.join(storeDir, `${id}.json`), JSON.stringify(message, null, 2));
    return message;
  };

  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ["STARTTLS", "AUTH"],
    banner: "Plateroom local mail catcher",
    logger: false,
    // A reverse DNS lookup per connection costs ~150 ms here and tells us nothing about 127.0.0.1.
    disableReverseLookup: true,
    onRcptTo(address, _session, callback) {
      const code = opts.refuseRecipient?.(address.address) ?? null;
      if (code === null) return callback();
      const err = new Error(code >= 500 ? "Recipient refused by the local mail catcher" : "Try again later") as Error & { responseCode: number };
      err.responseCode = code;
      callback(err);
    },
    onData(stream, session, callback) {
      const chunks: Buffer[] = [];
      stream.on("data", (c: Buffer) => chunks.push(c));
      stream.on("error", (err) => callback(err));
      stream.on("end", () => {
        const envelope = {
          from: session.envelope.mailFrom ? session.envelope.mailFrom.address : null,
          to: session.envelope.rcptTo.map((r) => r.address),
        };
        store(Buffer.concat(chunks), envelope).then(
          (message) => {
            received.push(message);
            for (const w of waiters.filter((w) => received.length >= w.target)) {
              waiters.splice(waiters.indexOf(w), 1);
              w.resolve();
            }
            if (!opts.quiet) console.log(`[fake-smtp] ${message.to}: ${message.subject}`);
            callback();
          },
          (err: unknown) => callback(err instanceof Error ? err : new Error(String(err))),
        );
      });
    },
  });

  await new Promise<void>((resolve, reject) => {
    server.once("error", reject);
    server.listen(opts.port ?? 0, host, () => {
      server.off("error", reject);
      resolve();
    });
  });
  server.on("error", (err) => console.error("[fake-smtp]", err));
  const port = (server.server.address() as AddressInfo).port;

  return {
    port,
    host,
    url: `smtp://${host}:${port}`,
    storeDir,
    messages: () => [...received],
    waitFor(n, timeoutMs = 10_000) {
      const target = received.length + n;
      if (n <= 0) return Promise.resolve();
      return new Promise((resolve, reject) => {
        const timer = setTimeout(() => reject(new Error(`fake SMTP: ${received.length}/${target} messages after ${timeoutMs} ms`)), timeoutMs);
        waiters.push({ target, resolve: () => (clearTimeout(timer), resolve()) });
      });
    },
    stop: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}
