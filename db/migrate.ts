import "server-only";
import path from "node:path";
import { migrate as migratePglite } from "drizzle-orm/pglite/migrator";
import { migrate as migrateNodePg } from "drizzle-orm/node-postgres/migrator";
import type { PgliteDatabase } from "drizzle-orm/pglite";
import type { NodePgDatabase } from "drizzle-orm/node-postgres";
import { currentDriver, getDb, type Database } from "@/db/client";

/** Resolved from the working directory: inside a Next.js bundle import.meta.url points into .next/. */
const MIGRATIONS_FOLDER = path.resolve(process.cwd(), "db/migrations");

/** Applies the committed drizzle-kit migrations; safe to run on every start. */
export async function runMigrations(db: Database = getDb(), folder = MIGRATIONS_FOLDER): Promise<void> {
  if (currentDriver() === "postgres") {
    await migrateNodePg(db as unknown as NodePgDatabase, { migrationsFolder: folder });
  } else {
    await migratePglite(db as unknown as PgliteDatabase, { migrationsFolder: folder });
  }
}
