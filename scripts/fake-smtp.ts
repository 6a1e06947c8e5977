/**
 * A local SMTP server that keeps what it receives (see scripts/fake-smtp/server.ts).
 *   tsx --conditions=react-server scripts/fake-smtp.ts [--port N] [--dir PATH]
 * The port defaults to the one in SMTP_URL (2525), the folder to PLATEROOM_DATA_DIR/mail-inbox,
 * which is where the admin mail view reads.
 */
import { parseArgs } from "node:util";
import { env } from "@/lib/env";
import { inboxDir } from "@/lib/mail/inbox";
import { startFakeSmtp } from "@/scripts/fake-smtp/server";

function defaultPort(): number {
  try {
    const port = Number(new URL(env.SMTP_URL).port);
    return Number.isInteger(port) && port > 0 ? port : 2525;
  } catch {
    return 2525;
  }
}

const { values } = parseArgs({ options: { port: { type: "string" }, dir: { type: "string" }, host: { type: "string" } } });
const port = values.port ? Number(values.port) : defaultPort();
if (!Number.isInteger(port) || port < 0 || port > 65535) {
  console.error(`Not a port: ${values.port}`);
  process.exit(1);
}

const server = await startFakeSmtp({ port, host: values.host ?? "127.0.0.1", storeDir: values.dir ?? inboxDir() });
console.log(`[fake-smtp] listening on ${server.url}, storing in ${server.storeDir}`);

for (const signal of ["SIGINT", "SIGTERM"] as const) {
  process.once(signal, () => {
    void server.stop().then(() => process.exit(0));
    // Open client connections could hold close() forever.
    setTimeout(() => process.exit(0), 2_000).unref();
  });
}
