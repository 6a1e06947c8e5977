import { AppError } from "@/lib/api/errors";
import { BODY_LIMITS } from "@/lib/api/body-limits";
import { authedRoute, otherMethods, parseWith, searchParamsOf } from "@/lib/api/handler";
import { importShots } from "@/lib/shots/mutations";
import { exportShowShots, listShots } from "@/lib/shots/queries";
import { importShotsSchema, listShotsQuerySchema, MAX_IMPORT_CSV_CHARS, type ImportShotsResponse, type ShotsResponse } from "@/lib/shots/schemas";

type Params = { code: string };

/** The show's shots as JSON (paged, `q` filters), or all of them as a CSV download with `?format=csv`. */
export const GET = authedRoute<Params>(async (req, { user, params: { code } }) => {
  const query = parseWith(listShotsQuerySchema, searchParamsOf(req));
  if (query.format === "csv") {
    const { filename, csv } = await exportShowShots(user, code);
    return new Response(csv, {
      headers: { "Content-Type": "text/csv; charset=utf-8", "Content-Disposition": `attachment; filename="${filename}"` },
    });
  }
  return Response.json((await listShots(user, code, query)) satisfies ShotsResponse);
});

/**
 * Leads import a shot list: a `text/csv` body (columns guessed from the header; `?dryRun=true`
 * plans only), or JSON `{ rows }` or `{ csv, mapping?, dryRun? }`.
 */
export const POST = authedRoute<Params>({ permission: "show:manage", bodyLimit: BODY_LIMITS.shotList }, async (req, { user, params: { code }, json, text }) => {
  const type = (req.headers.get("content-type") ?? "").toLowerCase();
  let result: ImportShotsResponse;
  if (type.startsWith("text/csv") || type.startsWith("text/plain")) {
    const csvText = await text();
    if (csvText.length > MAX_IMPORT_CSV_CHARS) throw new AppError("too_large", "The shot list is too large.");
    const dryRun = /^(1|true|yes)$/i.test(new URL(req.url).searchParams.get("dryRun") ?? "");
    result = await importShots(user, code, { csvText, dryRun });
  } else {
    const body = await json(importShotsSchema);
    result = await importShots(user, code, { rows: body.rows, csvText: body.csv, mapping: body.mapping, dryRun: body.dryRun });
  }
  return Response.json(result satisfies ImportShotsResponse);
});

export const { HEAD, OPTIONS, PUT, PATCH, DELETE } = otherMethods({ GET, POST });
