import { sql } from "drizzle-orm";
import { getDb } from "@/db/client";
import { apiRoute } from "@/lib/api/handler";

export const dynamic = "force-dynamic";

export const GET = apiRoute(async () => {
  let db: "ok" | "error" = "ok";
  try {
    await getDb().execute(sql`select 1`);
  } catch (error) {
    console.error("[health] database check failed:", error);
    db = "error";
  }
  return Response.json({ status: db === "ok" ? "ok" : "degraded", db }, { status: db === "ok" ? 200 : 503 });
});
