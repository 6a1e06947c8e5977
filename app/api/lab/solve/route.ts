import { AppError } from "@/lib/api/errors";
import { authedRoute, otherMethods } from "@/lib/api/handler";
import { labSolveRequestSchema, type LabSolveResponse } from "@/lib/lab/recipe";
import { solveRow } from "@/lib/lab/solver";

export const dynamic = "force-dynamic";

/** POST /api/lab/solve (shared/API.md "The lab"): one channel's matrix row from picked samples. */
export const POST = authedRoute("lab:run", async (req, { json }) => {
  const input = await json(labSolveRequestSchema);
  const result = solveRow(input);
  // Degenerate samples (e.g. a screen of pure black) can leave nothing to solve for.
  if (![...result.row, result.residual, result.noiseGain].every(Number.isFinite)) {
    throw new AppError("validation_failed", "These samples do not determine a matrix row. Pick samples that differ.", {
      fields: { markers: "Pick marker and screen samples that differ in colour." },
    });
  }
  return Response.json(result satisfies LabSolveResponse);
});

export const { GET, HEAD, OPTIONS, PUT, PATCH, DELETE } = otherMethods({ POST });
