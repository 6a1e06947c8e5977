import { AppError } from "@/lib/api/errors";
import { authedRoute, otherMethods } from "@/lib/api/handler";
import { boxMean } from "@/lib/lab/analysis";
import { mapLabError, originalBytes, readableStill, withAnalysisSlot } from "@/app/api/lab/_lib/lab-server";
import { runToFloat } from "@/app/api/lab/_lib/float-run";
import { labSampleRequestSchema, type LabSampleResponse } from "@/app/api/lab/_lib/schemas";

export const dynamic = "force-dynamic";
export const runtime = "nodejs";

/** POST /api/lab/sample: mean RGB floats of boxes on the full-resolution still (the solver's samples). */
export const POST = authedRoute("lab:run", async (req, { user, json }) => {
  const input = await json(labSampleRequestSchema);
  const still = await readableStill(user, input.still);
  const fields: Record<string, string> = {};
  input.boxes.forEach((b, i) => {
    if (b.x >= still.width || b.y >= still.height) fields[`boxes.${i}`] = "This box lies outside the still.";
  });
  if (Object.keys(fields).length) throw new AppError("validation_failed", Object.entries(fields).map(([k, v]) => `${k}: ${v}`)[0], { fields });
  const bytes = await originalBytes(still);
  const noLoader = async (): Promise<Uint8Array> => new Uint8Array();
  const { before } = await withAnalysisSlot(() => runToFloat({ still: bytes, steps: [], space: input.space, loadStill: noLoader }).catch(mapLabError));
  const samples: [number, number, number][] = [];
  const pixels: number[] = [];
  for (const b of input.boxes) {
    samples.push(boxMean(before, b.x, b.y, b.w, b.h));
    pixels.push((Math.min(before.width, b.x + b.w) - b.x) * (Math.min(before.height, b.y + b.h) - b.y));
  }
  return Response.json({ samples, pixels } satisfies LabSampleResponse);
});

export const { GET, HEAD, OPTIONS, PUT, PATCH, DELETE } = otherMethods({ POST });
