import { sql } from "drizzle-orm";
import { getDb } from "@/db/client";
import { otherMethods, publicRoute } from "@/lib/api/handler";

export const dynamic = "force-dynamic";

/** Public: for load balancers and monitors; says only whether the database answers. */
export const GET = publicRoute(async () => {
  let db: "ok" | "error" = "ok";
  try {
    await getDb().execute(sql`select 1`);
  } catch (error) {
    console.error("[health] database check failed:", error);
    db = "error";
  }
  return Response.json({ status: db === "ok" ? "ok" : "degraded", db }, { status: db === "ok" ? 200 : 503 });
});

export const { HEAD, OPTIONS, POST, PUT, PATCH, DELETE } = otherMethods({ GET });
