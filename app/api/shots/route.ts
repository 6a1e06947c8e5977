import { apiRoute, parseWith, searchParamsOf } from "@/lib/api/handler";
import { requireUser } from "@/lib/auth/session";
import { searchShotCodes } from "@/lib/shots/queries";
import { shotSearchQuerySchema, type ShotSearchResponse } from "@/lib/shots/schemas";

/** Typeahead: shot codes starting with `q`. */
export const GET = apiRoute(async (req) => {
  const user = await requireUser(req);
  const { q, limit } = parseWith(shotSearchQuerySchema, searchParamsOf(req));
  return Response.json({ items: await searchShotCodes(user, q, limit) } satisfies ShotSearchResponse);
});
