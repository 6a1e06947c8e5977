import { authedRoute, otherMethods, parseWith, searchParamsOf } from "@/lib/api/handler";
import { searchShotCodes } from "@/lib/shots/queries";
import { shotSearchQuerySchema, type ShotSearchResponse } from "@/lib/shots/schemas";

/** Typeahead: shot codes starting with `q`. */
export const GET = authedRoute(async (req, { user }) => {
  const { q, limit } = parseWith(shotSearchQuerySchema, searchParamsOf(req));
  return Response.json({ items: await searchShotCodes(user, q, limit) } satisfies ShotSearchResponse);
});

export const { HEAD, OPTIONS, POST, PUT, PATCH, DELETE } = otherMethods({ GET });
