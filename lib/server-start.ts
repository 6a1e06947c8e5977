import "server-only";
import fs from "node:fs";
import { runMigrations } from "@/db/migrate";
import { env } from "@/lib/env";
import { startMailSender } from "@/lib/mail/sender";
import { rebuildSearchFromDb } from "@/lib/techniques/search-sync";

/** Start-up work of a server process: schema up to date, search index built, mail sender running. */
export async function startServerServices(): Promise<void> {
  fs.mkdirSync(env.PLATEROOM_UPLOADS_DIR, { recursive: true });
  await runMigrations();
  const count = await rebuildSearchFromDb();
  console.log(`[plateroom] search index built: ${count} techniques`);
  if (env.PLATEROOM_MAIL_SENDER === "on") startMailSender();
}
