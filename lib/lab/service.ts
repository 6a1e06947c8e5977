import "server-only";
import { AppError } from "@/lib/api/errors";
import { assertCan } from "@/lib/auth/permissions";
import type { SessionUser } from "@/lib/auth/roles";
import { denoisedLoader, labCacheDir, labColour, originalBytes, readableStill } from "@/lib/lab/access";
import { boxMean, channelHistograms, lineProfile, type FloatImage } from "@/lib/lab/analysis";
import type { AnalysisSide, LabAnalyseParsed, LabAnalyseResponse, LabSampleParsed, LabSampleResponse } from "@/lib/lab/analysis-schemas";
import { LabAbortedError, LabInputError, LabOverflowError, runRecipeToFloat } from "@/lib/lab/engine";
import { labLimiter, LabBusyError, LabTimeoutError } from "@/lib/lab/limiter";
import type { LabRunRequest } from "@/lib/lab/recipe";
import { runLab, type LabRunOutput } from "@/lib/lab/runner";

/*
 * The lab's operations for a signed-in person: a recipe run (image), the plots (line profile,
 * histograms) and the solver's box samples. Each checks the permission and every still it reads,
 * runs under the one lab limiter, and turns the engine's typed errors into the API error shape.
 */

const ANALYSIS_TIMEOUT_MS = 60_000;

/** Engine, limiter and runner errors as the API error shape; anything else is rethrown. */
export function labAppError(error: unknown): unknown {
  if (error instanceof LabBusyError) return new AppError("rate_limited", "The lab is busy. Try again in a moment.", { cause: error });
  if (error instanceof LabTimeoutError) return new AppError("unavailable", `${error.message}. Try a proxy render or a smaller region.`);
  if (error instanceof LabAbortedError) return new AppError("unavailable", "The lab run took too long. Try a proxy render or a smaller region.");
  if (error instanceof LabOverflowError) {
    const key = `steps.${error.stepIndex}`;
    return new AppError("unprocessable", `${key}: ${error.message}`, { fields: { [key]: error.message } });
  }
  if (error instanceof LabInputError) {
    const key = error.stepIndex === undefined ? "still" : `steps.${error.stepIndex}`;
    return new AppError("validation_failed", error.stepIndex === undefined ? error.message : `${key}: ${error.message}`, {
      fields: { [key]: error.message },
    });
  }
  return error;
}

async function mapped<T>(work: () => Promise<T>): Promise<T> {
  try {
    return await work();
  } catch (error) {
    throw labAppError(error);
  }
}

/** Runs work in a slot of the lab limiter, aborted at the deadline. */
async function inLabSlot<T>(work: (signal: AbortSignal) => Promise<T>): Promise<T> {
  const deadline = Date.now() + ANALYSIS_TIMEOUT_MS;
  const release = await labLimiter().acquire(deadline, ANALYSIS_TIMEOUT_MS);
  try {
    return await work(AbortSignal.timeout(Math.max(1, deadline - Date.now())));
  } finally {
    release();
  }
}

/** POST /api/lab/run: the encoded result (from the result cache when the same run was done before). */
export async function runLabFor(user: SessionUser, input: LabRunRequest): Promise<LabRunOutput> {
  assertCan(user, "lab:run");
  const still = await readableStill(user, input.still);
  const loadStill = await denoisedLoader(user, input.steps);
  // The cache key names the colour handling beside the bytes' hash (a still shown two ways runs two ways).
  const { space, colour, key } = labColour(still, input.space, input.workingSpace, loadStill.stills);
  const stillBytes = await originalBytes(still);
  return mapped(() => runLab({ stillBytes, stillSha256: key, request: { ...input, space }, colour, loadStill, cacheDir: labCacheDir() }));
}

/** JSON for a header value: base64url, so any characters survive. */
function headerJson(value: unknown): string {
  return Buffer.from(JSON.stringify(value), "utf8").toString("base64url");
}

/**
 * The run's headers: step reports (base64url JSON), size, cache state, whether the render is an
 * approximate proxy, and how many pixels flatten filled from too little screen.
 */
export function labRunHeaders(out: LabRunOutput): Record<string, string> {
  const thin = out.reports.reduce((n, r) => n + (r.op === "flatten" ? r.thin : 0), 0);
  return {
    "X-Lab-Report": headerJson(out.reports),
    "X-Lab-Width": String(out.width),
    "X-Lab-Height": String(out.height),
    "X-Lab-Cache": out.cached || "miss",
    "X-Lab-Render": out.approximate ? "approximate" : "exact",
    ...(out.reports.some((r) => r.op === "flatten") ? { "X-Lab-Flatten-Thin": String(thin) } : {}),
  };
}

const MAX_PROFILE_SAMPLES = 1024;

/** POST /api/lab/analyse: line profile and histograms of the plate and of the recipe's float result. */
export async function analyseLab(user: SessionUser, input: LabAnalyseParsed): Promise<LabAnalyseResponse> {
  assertCan(user, "lab:run");
  const still = await readableStill(user, input.still);
  const steps = input.steps;
  const loadStill = await denoisedLoader(user, steps);
  const bytes = await originalBytes(still);
  const { space, colour } = labColour(still, input.space, input.workingSpace, loadStill.stills);
  const run = await mapped(() =>
    inLabSlot((signal) => runRecipeToFloat({ still: bytes, steps, space, colour, width: input.width, loadStill, signal, withBefore: true })),
  );
  const before = run.before!;
  const scale = run.sourceWidth / before.width;
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
  return {
    width: before.width,
    height: before.height,
    sourceWidth: run.sourceWidth,
    sourceHeight: run.sourceHeight,
    approximate: run.approximate,
    before: side(before),
    after: steps.length ? side(run.after) : null,
  };
}

/** POST /api/lab/sample: mean RGB floats of boxes on the full-resolution still (the solver's samples). */
export async function sampleLab(user: SessionUser, input: LabSampleParsed): Promise<LabSampleResponse> {
  assertCan(user, "lab:run");
  const still = await readableStill(user, input.still);
  const fields: Record<string, string> = {};
  input.boxes.forEach((b, i) => {
    if (b.x >= still.width || b.y >= still.height) fields[`boxes.${i}`] = "This box lies outside the still.";
  });
  if (Object.keys(fields).length) throw new AppError("validation_failed", Object.entries(fields).map(([k, v]) => `${k}: ${v}`)[0], { fields });
  const bytes = await originalBytes(still);
  const { space, colour } = labColour(still, input.space, input.workingSpace);
  const { before } = await mapped(() => inLabSlot((signal) => runRecipeToFloat({ still: bytes, steps: [], space, colour, signal, withBefore: true })));
  const image = before!;
  return {
    samples: input.boxes.map((b) => boxMean(image, b.x, b.y, b.w, b.h)),
    pixels: input.boxes.map((b) => (Math.min(image.width, b.x + b.w) - b.x) * (Math.min(image.height, b.y + b.h) - b.y)),
  };
}
