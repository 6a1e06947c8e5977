import { authedRoute, otherMethods } from "@/lib/api/handler";
import { labRunRequestSchema } from "@/lib/lab/recipe";
import { labRunHeaders, runLabFor } from "@/lib/lab/service";

export const dynamic = "force-dynamic";
export const runtime = "nodejs";

/**
 * POST /api/lab/run (shared/API.md "The lab"): runs a recipe on a readable still and answers
 * the encoded image, with step reports in `X-Lab-Report` (base64url JSON) and `X-Lab-Render:
 * exact | approximate`; `?report=1` answers the reports as JSON instead of the image.
 */
export const POST = authedRoute("lab:run", async (req, { user, json }) => {
  const input = await json(labRunRequestSchema);
  const out = await runLabFor(user, input);
  if (new URL(req.url).searchParams.get("report") === "1") {
    const { width, height, contentType, cached, approximate, reports } = out;
    return Response.json({ width, height, contentType, cached, approximate, reports });
  }
  return new Response(new Uint8Array(out.bytes), {
    status: 200,
    headers: {
      "Content-Type": out.contentType,
      "Content-Length": String(out.bytes.length),
      "Cache-Control": "private, no-store",
      ...labRunHeaders(out),
      ...(input.format === "exr" ? { "Content-Disposition": `attachment; filename="lab-${input.still.slice(0, 8)}.exr"` } : {}),
    },
  });
});

export const { GET, HEAD, OPTIONS, PUT, PATCH, DELETE } = otherMethods({ POST });
