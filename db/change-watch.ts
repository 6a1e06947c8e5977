import "server-only";
import type { PGlite } from "@electric-sql/pglite";
import { currentPglite } from "@/db/client";

/**
 * Migration 0001's triggers send a notice on `plateroom_changes` whenever a committed change
 * touches what pages show or who may sign in. In PGlite the notice is delivered in this process
 * while the writer's query returns — before the writer answers anyone — so what a process
 * remembers about sessions and pages can be dropped exactly when it goes stale. A PostgreSQL
 * server has other writers and late notices: there nothing is remembered and every request
 * reads the database.
 */
const CHANNEL = "plateroom_changes";

type Watch = { client: PGlite; listening: boolean; generation: number };
const holder = globalThis as unknown as { __plateroomChangeWatch?: Watch };

/**
 * A number that changes after every such committed change, or null while this process cannot
 * know (a PostgreSQL server, or before the watch is listening): then read the database.
 */
export function changeGeneration(): number | null {
  const client = currentPglite();
  if (!client) return null;
  let watch = holder.__plateroomChangeWatch;
  if (!watch || watch.client !== client) {
    // Numbers keep rising across a new database handle (tests install several), so nothing
    // remembered under the old handle's numbers can match the new one's.
    const fresh: Watch = { client, listening: false, generation: (watch?.generation ?? 0) + 1 };
    holder.__plateroomChangeWatch = watch = fresh;
    client.listen(CHANNEL, () => void fresh.generation++).then(
      () => void (fresh.listening = true),
      (error: unknown) => console.error("[db] cannot watch for changes; every request will read the database:", error),
    );
  }
  return watch.listening ? watch.generation : null;
}
