import fs from "node:fs";
import path from "node:path";
import { PGlite } from "@electric-sql/pglite";
import { afterAll } from "vitest";
import { closeDb, usePglite } from "@/db/client";

// Each test file gets its own database: a copy of the migrated template made in global-setup.
const template = fs.readFileSync(path.resolve("tests/.tmp/template.tar.gz"));
usePglite(new PGlite({ loadDataDir: new Blob([template]) }));

afterAll(async () => {
  await closeDb();
});
