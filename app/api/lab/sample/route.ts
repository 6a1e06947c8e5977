import { authedRoute, otherMethods } from "@/lib/api/handler";
import { labSampleRequestSchema, type LabSampleResponse } from "@/lib/lab/analysis-schemas";
import { sampleLab } from "@/lib/lab/service";

export const dynamic = "force-dynamic";
export const runtime = "nodejs";

/** POST /api/lab/sample: mean RGB floats of boxes on the full-resolution still (the solver's samples). */
export const POST = authedRoute("lab:run", async (req, { user, json }) => {
  const input = await json(labSampleRequestSchema);
  return Response.json((await sampleLab(user, input)) satisfies LabSampleResponse);
});

export const { GET, HEAD, OPTIONS, PUT, PATCH, DELETE } = otherMethods({ POST });
