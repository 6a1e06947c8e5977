import { apiRoute, parseJson } from "@/lib/api/handler";
import { assertCan } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/session";
import { labAnalyseRequestSchema, type LabAnalyseResponse } from "@/lib/lab/analysis-schemas";
import { analyseLab } from "@/lib/lab/service";

export const dynamic = "force-dynamic";
export const runtime = "nodejs";

/**
 * POST /api/lab/analyse: R, G, B along a line and per-channel histograms of the plate and of
 * the recipe's float result (before clipping, so values outside 0..1 show as below/above).
 */
export const POST = apiRoute(async (req) => {
  const user = await requireUser(req);
  assertCan(user, "lab:run");
  const input = await parseJson(req, labAnalyseRequestSchema);
  return Response.json((await analyseLab(user, input)) satisfies LabAnalyseResponse);
});
