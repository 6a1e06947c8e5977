import "server-only";
import { sql } from "drizzle-orm";
import { getDb } from "@/db/client";

/** Whether the database answers a trivial query, for GET /api/health; a failure is logged, not thrown. */
export async function databaseAnswers(): Promise<boolean> {
  try {
    await getDb().execute(sql`select 1`);
    return true;
  } catch (error) {
    console.error("[health] database check failed:", error);
    return false;
  }
}
