import { closeDb } from "@/db/client";
import { runMigrations } from "@/db/migrate";

await runMigrations();
await closeDb();
console.log("Migrations applied.");
