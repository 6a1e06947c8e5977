import "server-only";
import { listenForChanges, type ChangeFeed } from "@/db/change-feed";
import { rebuildSearchFromDb, reindexTechnique, syncChangedSince } from "@/lib/techniques/search-sync";

/*
 * With several app instances on one PostgreSQL server, each keeps its own search index. The
 * database says which techniques a committed change touched (migration 0003, on the channel of
 * db/change-feed.ts) and each instance reindexes them at once; a poll every 30 s stays as the
 * fallback for notices lost while the listening connection was down.
 */

/** Notices arriving this close together are applied in one go. */
const BATCH_MS = 50;
export const SEARCH_POLL_MS = 30_000;

export type SearchFollower = { stop(): Promise<void>; settled(): Promise<void> };

export function followSearchChanges(connectionString: string, from: Date): SearchFollower {
  let mark = from;
  const pending = new Set<string>();
  let reloadAll = false;
  let timer: NodeJS.Timeout | null = null;
  let running: Promise<void> = Promise.resolve();

  const apply = () => {
    timer = null;
    const ids = [...pending];
    const all = reloadAll;
    pending.clear();
    reloadAll = false;
    running = running.then(async () => {
      try {
        if (all) await rebuildSearchFromDb();
        else for (const id of ids) await reindexTechnique(id);
      } catch (error) {
        console.error("[search] could not apply a change from another instance:", error);
      }
    });
  };
  const schedule = () => {
    timer ??= setTimeout(apply, BATCH_MS);
  };

  const feed: ChangeFeed = listenForChanges(connectionString, {
    onNotice(payload) {
      if (!payload.startsWith("search:")) return;
      const what = payload.slice("search:".length);
      if (what === "*") reloadAll = true;
      else pending.add(what);
      schedule();
    },
    onConnected(reconnected) {
      // Notices sent while nobody listened are gone: start again from the database.
      if (reconnected) {
        reloadAll = true;
        schedule();
      }
    },
  });

  const poll = setInterval(() => {
    running = running.then(() =>
      syncChangedSince(mark)
        .then((next) => void (mark = next))
        .catch((error: unknown) => console.error("[search] catch-up failed:", error)),
    );
  }, SEARCH_POLL_MS);
  poll.unref();

  return {
    async stop() {
      clearInterval(poll);
      if (timer) clearTimeout(timer);
      await feed.stop();
      await running;
    },
    settled: () => running,
  };
}
