import crypto from "node:crypto";
import fs from "node:fs";
import path from "node:path";
import { PGlite } from "@electric-sql/pglite";
import pg from "pg";
import { afterAll } from "vitest";
import { closeDb, installNodePostgres, installPglite } from "@/db/client";
import { PG_TEMPLATE_DB, postgresRunUrl, withDatabase } from "@/tests/global-setup";

// Each test file gets its own database, a copy of the migrated template made in global-setup:
// in-process PGlite by default, or in the PostgreSQL run (npm run test:pg) a database on its server.
const serverUrl = postgresRunUrl();
let dropDatabase: (() => Promise<void>) | undefined;

if (serverUrl) {
  const name = `plateroom_test_${crypto.randomBytes(6).toString("hex")}`;
  const admin = new pg.Client({ connectionString: serverUrl });
  await admin.connect();
  await admin.query(`CREATE DATABASE ${name} TEMPLATE ${PG_TEMPLATE_DB}`);
  await admin.end();
  installNodePostgres(withDatabase(serverUrl, name));
  dropDatabase = async () => {
    const c = new pg.Client({ connectionString: serverUrl });
    await c.connect();
    await c.query(`DROP DATABASE IF EXISTS ${name} WITH (FORCE)`);
    await c.end();
  };
} else {
  const template = fs.readFileSync(path.resolve("tests/.tmp/template.tar.gz"));
  installPglite(new PGlite({ loadDataDir: new Blob([template]) }));
}

afterAll(async () => {
  await closeDb();
  await dropDatabase?.();
});
