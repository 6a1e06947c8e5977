import fs from "node:fs";
import path from "node:path";
import { PGlite } from "@electric-sql/pglite";
import { drizzle } from "drizzle-orm/pglite";
import { migrate } from "drizzle-orm/pglite/migrator";
import { drizzle as drizzleNodePg } from "drizzle-orm/node-postgres";
import { migrate as migrateNodePg } from "drizzle-orm/node-postgres/migrator";
import pg from "pg";

export const TEMPLATE_PATH = path.resolve("tests/.tmp/template.tar.gz");
export const PG_TEMPLATE_DB = "plateroom_test_template";
const MIGRATIONS = path.resolve("db/migrations");

/**
 * The PostgreSQL server the integration suite runs against, only in the run that asks for it
 * (scripts/test-pg.mjs sets PLATEROOM_TEST_DB=pg); every other run uses PGlite, the product's
 * default, even where CI has a server up for the browser test of several instances.
 */
export function postgresRunUrl(): string | undefined {
  return process.env.PLATEROOM_TEST_DB === "pg" ? process.env.PLATEROOM_TEST_PG_URL : undefined;
}

/**
 * Creating and migrating a database takes seconds; copying one takes far less. So the run
 * migrates one template and every integration test file gets a copy of it: a PGlite dump, or
 * with PLATEROOM_TEST_PG_URL set (a PostgreSQL server), a database created from a template.
 */
export default async function setup(): Promise<void> {
  fs.mkdirSync(path.dirname(TEMPLATE_PATH), { recursive: true });
  const client = new PGlite();
  await migrate(drizzle(client), { migrationsFolder: MIGRATIONS });
  const dump = await client.dumpDataDir("gzip");
  // Written whole and renamed into place: the test runs that npm test starts side by side share it.
  const partial = `${TEMPLATE_PATH}.${process.pid}.tmp`;
  fs.writeFileSync(partial, Buffer.from(await dump.arrayBuffer()));
  fs.renameSync(partial, TEMPLATE_PATH);
  await client.close();

  const serverUrl = postgresRunUrl();
  if (serverUrl) {
    const admin = new pg.Client({ connectionString: serverUrl });
    await admin.connect();
    await admin.query(`DROP DATABASE IF EXISTS ${PG_TEMPLATE_DB} WITH (FORCE)`);
    await admin.query(`CREATE DATABASE ${PG_TEMPLATE_DB}`);
    await admin.end();
    const pool = new pg.Pool({ connectionString: withDatabase(serverUrl, PG_TEMPLATE_DB) });
    await migrateNodePg(drizzleNodePg(pool), { migrationsFolder: MIGRATIONS });
    await pool.end();
  }
}

export function withDatabase(url: string, database: string): string {
  const u = new URL(url);
  u.pathname = `/${database}`;
  return u.toString();
}
