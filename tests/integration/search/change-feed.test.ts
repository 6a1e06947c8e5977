import pg from "pg";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { getDb } from "@/db/client";
import { techniques } from "@/db/schema";
import { eq, sql } from "drizzle-orm";
import { getSearchIndex } from "@/lib/search";
import { followSearchChanges, SEARCH_POLL_MS, type SearchFollower } from "@/lib/techniques/search-follow";
import { rebuildSearchFromDb } from "@/lib/techniques/search-sync";
import { createPerson, simpleDoc } from "@/tests/factories";
import { createTechnique } from "@/lib/techniques/mutations";
import { postgresRunUrl } from "@/tests/global-setup";

/*
 * Several instances on one PostgreSQL server (README, "Beyond one machine"): a change committed
 * by another instance reaches this instance's search index within a second through PostgreSQL
 * LISTEN/NOTIFY (PostgreSQL documentation, NOTIFY: delivered after the sending transaction
 * commits), well before the 30-second poll. "Another instance" here is a separate connection
 * that writes with plain SQL, so nothing in this process reindexes except the change feed.
 * Runs in the PostgreSQL run (npm run test:pg); tests/e2e/several-instances.test.ts runs
 * two whole app instances.
 */

const serverUrl = postgresRunUrl();

describe.skipIf(!serverUrl)("search index kept in step across instances by LISTEN/NOTIFY", () => {
  let follower: SearchFollower;
  let other: pg.Client;
  let databaseUrl = "";

  beforeAll(async () => {
    const answer: unknown = await getDb().execute(sql`select current_database() as db`);
    const { rows } = answer as { rows: { db: string }[] };
    const u = new URL(serverUrl!);
    u.pathname = `/${rows[0]!.db}`;
    databaseUrl = u.toString();
    other = new pg.Client({ connectionString: databaseUrl });
    await other.connect();
    await rebuildSearchFromDb();
    follower = followSearchChanges(databaseUrl, new Date());
    // Let the feed's LISTEN land before anything is written.
    await new Promise((r) => setTimeout(r, 300));
  });

  afterAll(async () => {
    await follower?.stop();
    await other?.end();
  });

  /** Ms until the working view finds a technique with this slug for `word`, or null within the time. */
  async function searchable(word: string, slug: string, withinMs: number): Promise<number | null> {
    const started = Date.now();
    for (;;) {
      const { results } = getSearchIndex().search(word, { audience: "working" });
      if (results.some((r) => r.slug === slug)) return Date.now() - started;
      if (Date.now() - started > withinMs) return null;
      await new Promise((r) => setTimeout(r, 20));
    }
  }

  it("a title another instance changes is found here within a second, long before the poll", async () => {
    expect(SEARCH_POLL_MS).toBeGreaterThanOrEqual(30_000);
    const lead = await createPerson("lead");
    const made = await createTechnique(lead, { title: "Crossed tape on the sky", summary: "Paint out tape crosses.", aliases: [], tags: [], recipe: [], body: simpleDoc("Tape crosses on a bright sky.") });
    const [t] = await getDb().select().from(techniques).where(eq(techniques.slug, made.slug));
    await follower.settled();
    expect(await searchable("zephyrine", made.slug, 100)).toBeNull();
    // Another instance renames the latest revision's title in one committed statement.
    await other.query(`update revisions set title = 'Zephyrine marker removal' where id = $1`, [t!.latestRevisionId]);
    const tookMs = await searchable("zephyrine", made.slug, 1000);
    expect(tookMs).not.toBeNull();
  });
});
