import { otherMethods, publicRoute } from "@/lib/api/handler";
import { databaseAnswers } from "@/lib/health";

export const dynamic = "force-dynamic";

/** Public: for load balancers and monitors; says only whether the database answers. */
export const GET = publicRoute(async () => {
  const ok = await databaseAnswers();
  return Response.json({ status: ok ? "ok" : "degraded", db: ok ? "ok" : "error" }, { status: ok ? 200 : 503 });
});

export const { HEAD, OPTIONS, POST, PUT, PATCH, DELETE } = otherMethods({ GET });
