import { authedRoute, otherMethods } from "@/lib/api/handler";
import { labAnalyseRequestSchema, type LabAnalyseResponse } from "@/lib/lab/analysis-schemas";
import { analyseLab } from "@/lib/lab/service";

export const dynamic = "force-dynamic";
export const runtime = "nodejs";

/**
 * POST /api/lab/analyse: R, G, B along a line and per-channel histograms of the plate and of
 * the recipe's float result (before clipping, so values outside 0..1 show as below/above).
 */
export const POST = authedRoute("lab:run", async (req, { user, json }) => {
  const input = await json(labAnalyseRequestSchema);
  return Response.json((await analyseLab(user, input)) satisfies LabAnalyseResponse);
});

export const { GET, HEAD, OPTIONS, PUT, PATCH, DELETE } = otherMethods({ POST });
