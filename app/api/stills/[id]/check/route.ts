import { AppError } from "@/lib/api/errors";
import { authedRoute, otherMethods, parseWith, uuidParam } from "@/lib/api/handler";
import { runPlateCheck } from "@/lib/plate-check/mutations";
import { getPlateCheck } from "@/lib/plate-check/queries";
import { runCheckSchema, type CheckDto } from "@/lib/plate-check/schemas";

export const dynamic = "force-dynamic";
export const runtime = "nodejs";

type Params = { id: string };

/** The stored check (findings, suggestions, tries, the reader's kept recipes); 404 before the first check. */
export const GET = authedRoute<Params>(async (req, { user, params }) => {
  const dto = await getPlateCheck(user, parseWith(uuidParam, params.id));
  if (!dto) throw new AppError("not_found", "This still has not been checked yet.");
  return Response.json(dto satisfies CheckDto);
});

/**
 * Runs the plate check (or answers current stored findings unless `force`). With
 * `Accept: application/x-ndjson` the answer streams one `{ "stage": … }` line per detector,
 * then `{ "check": … }` (or `{ "error": … }`), for a progress bar.
 */
export const POST = authedRoute<Params>("still:check", async (req, { user, params, json }) => {
  const id = parseWith(uuidParam, params.id);
  const { force } = await json(runCheckSchema);
  if (!(req.headers.get("accept") ?? "").includes("application/x-ndjson")) {
    return Response.json((await runPlateCheck(user, id, { force })) satisfies CheckDto);
  }
  const encoder = new TextEncoder();
  const body = new ReadableStream<Uint8Array>({
    async start(controller) {
      const line = (value: unknown) => controller.enqueue(encoder.encode(`${JSON.stringify(value)}\n`));
      try {
        const check = await runPlateCheck(user, id, { force, onStage: (stage, done, total) => line({ stage, done, total }) });
        line({ check });
      } catch (error) {
        if (!(error instanceof AppError)) console.error("[plate-check] stream:", error);
        line((error instanceof AppError ? error : new AppError("internal")).toBody());
      }
      controller.close();
    },
  });
  return new Response(body, { headers: { "Content-Type": "application/x-ndjson; charset=utf-8" } });
});

export const { HEAD, OPTIONS, PUT, PATCH, DELETE } = otherMethods({ GET, POST });
