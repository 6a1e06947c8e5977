import { authedRoute, otherMethods, parseWith, searchParamsOf } from "@/lib/api/handler";
import { logUse } from "@/lib/uses/mutations";
import { listTechniqueUses } from "@/lib/uses/queries";
import { listUsesQuerySchema, logUseSchema, type TechniqueUsesResponse, type UseResponse } from "@/lib/uses/schemas";

type Params = { slug: string };

/** The technique's shot table (`sort`, `dir`, `outcome`, `show`, `q`, `limit`, `offset`) with outcome counts. */
export const GET = authedRoute<Params>(async (req, { user, params }) => {
  const query = parseWith(listUsesQuerySchema, searchParamsOf(req));
  return Response.json((await listTechniqueUses(user, params.slug, query)) satisfies TechniqueUsesResponse);
});

/** Logs a use: `{ shot, outcome, note?, beforeStill?, afterStill? }` (shared/API.md). */
export const POST = authedRoute<Params>("use:log", async (req, { user, params, json }) => {
  const input = await json(logUseSchema);
  return Response.json((await logUse(user, params.slug, input)) satisfies UseResponse, { status: 201 });
});

export const { HEAD, OPTIONS, PUT, PATCH, DELETE } = otherMethods({ GET, POST });
