import "server-only";
import fs from "node:fs";
import path from "node:path";
import { runMigrations } from "@/db/migrate";
import { env } from "@/lib/env";
import { startMailSender } from "@/lib/mail/sender";
import { applySearchChange } from "@/lib/search";
import { rebuildSearchFromDb, syncChangedSince } from "@/lib/techniques/search-sync";
import { loadThesaurusForSearch, thesaurusSignature } from "@/lib/thesaurus/queries";

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
  const signature = await thesaurusSignature();
  const count = await rebuildSearchFromDb();
  if (env.DATABASE_URL) keepSearchInStep(startedAt, signature);
  console.log(`[plateroom] search index built: ${count} techniques`);
  if (env.PLATEROOM_MAIL_SENDER === "on") startMailSender();
}

/** Other instances write to the same server: pick up their technique and thesaurus changes every 30 s. */
function keepSearchInStep(from: Date, thesaurusAtStart: string): void {
  let mark = from;
  let thesaurus = thesaurusAtStart;
  const catchUp = async (): Promise<void> => {
    mark = await syncChangedSince(mark);
    const now = await thesaurusSignature();
    if (now !== thesaurus) {
      await applySearchChange({ kind: "thesaurus", entries: await loadThesaurusForSearch() });
      thesaurus = now;
    }
  };
  const timer = setInterval(() => {
    catchUp().catch((error) => console.error("[search] catch-up failed:", error));
  }, 30_000);
  timer.unref();
}
