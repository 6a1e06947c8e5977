import fs from "node:fs";
import path from "node:path";
import { PGlite } from "@electric-sql/pglite";
import { drizzle } from "drizzle-orm/pglite";
import { migrate } from "drizzle-orm/pglite/migrator";

export const TEMPLATE_PATH = path.resolve("tests/.tmp/template.tar.gz");

/**
 * Creating and migrating a PGlite database takes seconds; loading a dump takes far less.
 * So the run migrates one template and every integration test file loads a copy of it.
 */
export default async function setup(): Promise<void> {
  fs.mkdirSync(path.dirname(TEMPLATE_PATH), { recursive: true });
  const client = new PGlite();
  await migrate(drizzle(client), { migrationsFolder: path.resolve("db/migrations") });
  const dump = await client.dumpDataDir("gzip");
  fs.writeFileSync(TEMPLATE_PATH, Buffer.from(await dump.arrayBuffer()));
  await client.close();
}
