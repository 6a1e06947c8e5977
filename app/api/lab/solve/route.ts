import { AppError } from "@/lib/api/errors";
import { apiRoute, parseJson } from "@/lib/api/handler";
import { assertCan } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/session";
import { labSolveRequestSchema, type LabSolveResponse } from "@/lib/lab/recipe";
import { solveRow } from "@/lib/lab/solver";

export const dynamic = "force-dynamic";

/** POST /api/lab/solve (shared/API.md "The lab"): one channel's matrix row from picked samples. */
export const POST = apiRoute(async (req) => {
  const user = await requireUser(req);
  assertCan(user, "lab:run");
  const input = await parseJson(req, labSolveRequestSchema);
  const result = solveRow(input);
  // Degenerate samples (e.g. a screen of pure black) can leave nothing to solve for.
  if (![...result.row, result.residual, result.noiseGain].every(Number.isFinite)) {
    throw new AppError("validation_failed", "These samples do not determine a matrix row. Pick samples that differ.", {
      fields: { markers: "Pick marker and screen samples that differ in colour." },
    });
  }
  return Response.json(result satisfies LabSolveResponse);
});
