import "server-only";
import pg from "pg";

/**
 * LISTEN on the change channel of migrations 0001 and 0003 over a connection of its own (a
 * pooled connection may be handed to someone else between notices). PostgreSQL delivers a
 * notice after its transaction commits. When the connection drops it is opened again with a
 * growing pause; notices sent meanwhile are lost, so `onConnected` runs after every connect
 * (the caller catches up there) and callers keep a poll as well.
 */
export const CHANGE_CHANNEL = "plateroom_changes";

export type ChangeFeed = { stop(): Promise<void> };

export function listenForChanges(
  connectionString: string,
  handlers: { onNotice: (payload: string) => void; onConnected: (reconnected: boolean) => void },
): ChangeFeed {
  let client: pg.Client | null = null;
  let stopped = false;
  let attempts = 0;
  let timer: NodeJS.Timeout | null = null;
  let connectedOnce = false;

  const retry = () => {
    if (stopped || timer) return;
    const pause = Math.min(30_000, 500 * 2 ** attempts++);
    timer = setTimeout(() => {
      timer = null;
      void connect();
    }, pause);
    timer.unref();
  };

  async function connect(): Promise<void> {
    const c = new pg.Client({ connectionString });
    client = c;
    c.on("notification", (n) => {
      if (n.channel === CHANGE_CHANNEL) handlers.onNotice(n.payload ?? "");
    });
    c.on("error", (error) => {
      console.error("[db] change feed connection lost:", error.message);
      void c.end().catch(() => undefined);
      retry();
    });
    c.on("end", () => {
      if (client === c) client = null;
      retry();
    });
    try {
      await c.connect();
      await c.query(`LISTEN ${CHANGE_CHANNEL}`);
      if (stopped) return void (await c.end());
      attempts = 0;
      handlers.onConnected(connectedOnce);
      connectedOnce = true;
    } catch (error) {
      console.error("[db] cannot listen for changes:", (error as Error).message);
      void c.end().catch(() => undefined);
      retry();
    }
  }

  void connect();
  return {
    async stop() {
      stopped = true;
      if (timer) clearTimeout(timer);
      const c = client;
      client = null;
      await c?.end().catch(() => undefined);
    },
  };
}
