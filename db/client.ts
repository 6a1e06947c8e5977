import "server-only";
import fs from "node:fs";
import path from "node:path";
import { PGlite } from "@electric-sql/pglite";
import { drizzle as drizzlePglite } from "drizzle-orm/pglite";
import { drizzle as drizzleNodePg } from "drizzle-orm/node-postgres";
import type { PgDatabase, PgQueryResultHKT } from "drizzle-orm/pg-core";
import pg from "pg";
import { env } from "@/lib/env";
import * as schema from "@/db/schema";

export type Database = PgDatabase<PgQueryResultHKT, typeof schema>;

type Driver = "pglite" | "postgres";
type Holder = { db?: Database; driver?: Driver; pglite?: PGlite; close?: () => Promise<void> };
const globalHolder = globalThis as unknown as { __plateroomDb?: Holder };
const holder: Holder = (globalHolder.__plateroomDb ??= {});

/**
 * The one database handle of this process, opened on first use (never at import time, so
 * `next build` does not open it). Kept on globalThis because two PGlite instances on one
 * data folder corrupt each other, and HMR would otherwise create a second.
 * With DATABASE_URL set the same schema runs on a PostgreSQL server instead.
 */
export function getDb(): Database {
  if (!holder.db) openDefault();
  return holder.db!;
}

/** The in-process PGlite behind getDb(), or undefined on a PostgreSQL server. */
export function currentPglite(): PGlite | undefined {
  getDb();
  return holder.pglite;
}

/** Which driver the open database uses (migrations pick their migrator by it). */
export function currentDriver(): Driver {
  getDb();
  return holder.driver!;
}

function openDefault(): void {
  if (env.DATABASE_URL) {
    installNodePostgres(env.DATABASE_URL);
    return;
  }
  const dir = path.resolve(env.PLATEROOM_DATA_DIR, "pg");
  fs.mkdirSync(dir, { recursive: true });
  installPglite(new PGlite(dir));
}

/** Installs a PGlite instance as this process's database (tests load a migrated template). */
export function installPglite(client: PGlite): Database {
  holder.db = drizzlePglite(client, { schema }) as unknown as Database;
  holder.driver = "pglite";
  holder.pglite = client;
  holder.close = () => client.close();
  return holder.db;
}

/** Installs a PostgreSQL server connection pool as this process's database. */
export function installNodePostgres(connectionString: string): Database {
  const pool = new pg.Pool({ connectionString, max: 10 });
  // An idle connection the server closes (restart, failover, admin command) must not crash the
  // process: the pool drops it and the next query opens a fresh one.
  pool.on("error", (error) => console.error("[db] idle connection lost:", error.message));
  holder.db = drizzleNodePg(pool, { schema }) as unknown as Database;
  holder.pglite = undefined;
  holder.driver = "postgres";
  holder.close = () => pool.end();
  return holder.db;
}

export async function closeDb(): Promise<void> {
  const close = holder.close;
  holder.db = undefined;
  holder.driver = undefined;
  holder.pglite = undefined;
  holder.close = undefined;
  if (close) await close();
}

export { schema };
