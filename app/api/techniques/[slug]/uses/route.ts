import { apiRoute, parseJson, parseWith, searchParamsOf } from "@/lib/api/handler";
import { requireUser } from "@/lib/auth/session";
import { logUse } from "@/lib/shots/mutations";
import { listTechniqueUses } from "@/lib/shots/queries";
import { listUsesQuerySchema, logUseSchema, type TechniqueUsesResponse, type UseResponse } from "@/lib/shots/schemas";

type Params = { slug: string };

/** The technique's shot table (`sort`, `dir`, `outcome`, `show`, `q`, `limit`, `offset`) with outcome counts. */
export const GET = apiRoute<Params>(async (req, ctx) => {
  const user = await requireUser(req);
  const query = parseWith(listUsesQuerySchema, searchParamsOf(req));
  return Response.json((await listTechniqueUses(user, (await ctx.params).slug, query)) satisfies TechniqueUsesResponse);
});

/** Logs a use: `{ shot, outcome, note?, beforeStill?, afterStill? }` (shared/API.md). */
export const POST = apiRoute<Params>(async (req, ctx) => {
  const user = await requireUser(req);
  const input = await parseJson(req, logUseSchema);
  return Response.json((await logUse(user, (await ctx.params).slug, input)) satisfies UseResponse, { status: 201 });
});
