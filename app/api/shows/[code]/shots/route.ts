import { AppError } from "@/lib/api/errors";
import { apiRoute, parseJson, parseWith, searchParamsOf } from "@/lib/api/handler";
import { requireUser } from "@/lib/auth/session";
import { importShots } from "@/lib/shots/mutations";
import { exportShowShots, listShots } from "@/lib/shots/queries";
import { importShotsSchema, listShotsQuerySchema, MAX_IMPORT_CSV_CHARS, type ImportShotsResponse, type ShotsResponse } from "@/lib/shots/schemas";

type Params = { code: string };

/** The show's shots as JSON (paged, `q` filters), or all of them as a CSV download with `?format=csv`. */
export const GET = apiRoute<Params>(async (req, ctx) => {
  const user = await requireUser(req);
  const { code } = await ctx.params;
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
export const POST = apiRoute<Params>(async (req, ctx) => {
  const user = await requireUser(req);
  const { code } = await ctx.params;
  const length = Number(req.headers.get("content-length") ?? 0);
  if (length > MAX_IMPORT_CSV_CHARS * 4) throw new AppError("too_large", "The shot list is too large.");
  const type = (req.headers.get("content-type") ?? "").toLowerCase();
  let result: ImportShotsResponse;
  if (type.startsWith("text/csv") || type.startsWith("text/plain")) {
    const csvText = await req.text();
    if (csvText.length > MAX_IMPORT_CSV_CHARS) throw new AppError("too_large", "The shot list is too large.");
    const dryRun = /^(1|true|yes)$/i.test(new URL(req.url).searchParams.get("dryRun") ?? "");
    result = await importShots(user, code, { csvText, dryRun });
  } else {
    const body = await parseJson(req, importShotsSchema);
    result = await importShots(user, code, { rows: body.rows, csvText: body.csv, mapping: body.mapping, dryRun: body.dryRun });
  }
  return Response.json(result satisfies ImportShotsResponse);
});
