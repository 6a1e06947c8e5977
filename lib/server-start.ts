import "server-only";
import fs from "node:fs";
import path from "node:path";
import { runMigrations } from "@/db/migrate";
import { env } from "@/lib/env";
import { startMailSender } from "@/lib/mail/sender";
import { followSearchChanges } from "@/lib/techniques/search-follow";
import { rebuildSearchFromDb } from "@/lib/techniques/search-sync";

/** Start-up work of a server process: schema up to date, search index built, mail sender running. */
export async function startServerServices(): Promise<void> {
  fs.mkdirSync(env.PLATEROOM_UPLOADS_DIR, { recursive: true });
  if (!env.DATABASE_URL) {
    // Lets `npm run backup` tell that this data folder is in use (PGlite allows one process).
    fs.mkdirSync(env.PLATEROOM_DATA_DIR, { recursive: true });
    fs.writeFileSync(path.join(env.PLATEROOM_DATA_DIR, "server.pid"), String(process.pid));
  }
  await runMigrations();
  const startedAt = new Date();
  const count = await rebuildSearchFromDb();
  // Other instances write to the same server: their changes reach this index within a second.
  if (env.DATABASE_URL) followSearchChanges(env.DATABASE_URL, startedAt);
  console.log(`[plateroom] search index built: ${count} techniques`);
  if (env.PLATEROOM_MAIL_SENDER === "on") startMailSender();
}
