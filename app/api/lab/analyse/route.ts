import { authedRoute, otherMethods } from "@/lib/api/handler";
import { channelHistograms, lineProfile, type FloatImage } from "@/lib/lab/analysis";
import { denoisedLoader, mapLabError, originalBytes, readableStill, withAnalysisSlot } from "@/app/api/lab/_lib/lab-server";
import { runToFloat } from "@/app/api/lab/_lib/float-run";
import { labAnalyseRequestSchema, type AnalysisSide, type LabAnalyseResponse } from "@/app/api/lab/_lib/schemas";

export const dynamic = "force-dynamic";
export const runtime = "nodejs";

const MAX_PROFILE_SAMPLES = 1024;

/**
 * POST /api/lab/analyse: R, G, B along a line and per-channel histograms of the plate and of
 * the recipe's float result (before clipping, so values outside 0..1 show as below/above).
 */
export const POST = authedRoute("lab:run", async (req, { user, json }) => {
  const input = await json(labAnalyseRequestSchema);
  const still = await readableStill(user, input.still);
  const loadStill = await denoisedLoader(user, input.steps);
  const bytes = await originalBytes(still);
  const run = await withAnalysisSlot(() =>
    runToFloat({ still: bytes, steps: input.steps, space: input.space, width: input.width, loadStill }).catch(mapLabError),
  );
  const scale = run.sourceWidth / run.before.width;
  const side = (img: FloatImage): AnalysisSide => {
    let profile: AnalysisSide["profile"] = null;
    if (input.line) {
      const { x0, y0, x1, y1 } = input.line;
      // Coordinates arrive in full-resolution pixels; the image may be a proxy.
      const p0 = { x: x0 / scale, y: y0 / scale }, p1 = { x: x1 / scale, y: y1 / scale };
      const n = Math.min(MAX_PROFILE_SAMPLES, Math.round(Math.hypot(p1.x - p0.x, p1.y - p0.y)) + 1);
      const p = lineProfile(img, p0, p1, n);
      profile = { ...p, t: p.t.map((v) => v * scale), x: p.x.map((v) => v * scale), y: p.y.map((v) => v * scale) };
    }
    return { profile, histogram: input.histogram ? channelHistograms(img, input.bins) : null };
  };
  const body: LabAnalyseResponse = {
    width: run.before.width,
    height: run.before.height,
    sourceWidth: run.sourceWidth,
    sourceHeight: run.sourceHeight,
    before: side(run.before),
    after: run.after ? side(run.after) : null,
  };
  return Response.json(body);
});

export const { GET, HEAD, OPTIONS, PUT, PATCH, DELETE } = otherMethods({ POST });
