import { authedRoute, otherMethods } from "@/lib/api/handler";
import { labRunRequestSchema } from "@/lib/lab/recipe";
import { runLab, type LabRunOutput } from "@/lib/lab/runner";
import { denoisedLoader, headerJson, labCacheDir, mapLabError, originalBytes, readableStill } from "@/app/api/lab/_lib/lab-server";

export const dynamic = "force-dynamic";
export const runtime = "nodejs";

/**
 * POST /api/lab/run (shared/API.md "The lab"): runs a recipe on a readable still and answers
 * the encoded image. Step reports travel in `X-Lab-Report` (base64url JSON); `?report=1`
 * answers them as JSON instead of the image.
 */
export const POST = authedRoute("lab:run", async (req, { user, json }) => {
  const input = await json(labRunRequestSchema);
  const still = await readableStill(user, input.still);
  const loadStill = await denoisedLoader(user, input.steps);
  const stillBytes = await originalBytes(still);
  let out: LabRunOutput;
  try {
    out = await runLab({ stillBytes, stillSha256: still.sha256, request: input, loadStill, cacheDir: labCacheDir() });
  } catch (error) {
    mapLabError(error);
  }
  if (new URL(req.url).searchParams.get("report") === "1") {
    return Response.json({ width: out.width, height: out.height, contentType: out.contentType, cached: out.cached, reports: out.reports });
  }
  return new Response(new Uint8Array(out.bytes), {
    status: 200,
    headers: {
      "Content-Type": out.contentType,
      "Content-Length": String(out.bytes.length),
      "Cache-Control": "private, no-store",
      "X-Lab-Report": headerJson(out.reports),
      "X-Lab-Width": String(out.width),
      "X-Lab-Height": String(out.height),
      "X-Lab-Cache": out.cached || "miss",
    },
  });
});

export const { GET, HEAD, OPTIONS, PUT, PATCH, DELETE } = otherMethods({ POST });
