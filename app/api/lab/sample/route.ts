import { apiRoute, parseJson } from "@/lib/api/handler";
import { assertCan } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/session";
import { labSampleRequestSchema, type LabSampleResponse } from "@/lib/lab/analysis-schemas";
import { sampleLab } from "@/lib/lab/service";

export const dynamic = "force-dynamic";
export const runtime = "nodejs";

/** POST /api/lab/sample: mean RGB floats of boxes on the full-resolution still (the solver's samples). */
export const POST = apiRoute(async (req) => {
  const user = await requireUser(req);
  assertCan(user, "lab:run");
  const input = await parseJson(req, labSampleRequestSchema);
  return Response.json((await sampleLab(user, input)) satisfies LabSampleResponse);
});
