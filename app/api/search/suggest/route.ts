import { authedRoute, otherMethods, parseWith, searchParamsOf } from "@/lib/api/handler";
import { suggestQuerySchema, type SuggestApiResponse } from "@/lib/search-ui/params";
import { runSuggest } from "@/lib/search-ui/run";

export const GET = authedRoute(async (req, { user }) => {
  const { q, limit } = parseWith(suggestQuerySchema, searchParamsOf(req));
  return Response.json(runSuggest(user, q, limit) satisfies SuggestApiResponse);
});

export const { HEAD, OPTIONS, POST, PUT, PATCH, DELETE } = otherMethods({ GET });
