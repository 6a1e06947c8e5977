import { closeDb } from "@/db/client";
import { runMigrations } from "@/db/migrate";
import { seedDemo } from "@/scripts/seed/demo";

try {
  await runMigrations();
  await seedDemo();
  console.log("Demo data ready.");
} catch (error) {
  console.error("Seeding failed:", error);
  process.exitCode = 1;
} finally {
  await closeDb();
}
