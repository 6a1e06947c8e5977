import { apiRoute, parseWith, searchParamsOf } from "@/lib/api/handler";
import { requireUser } from "@/lib/auth/session";
import { suggestQuerySchema, type SuggestApiResponse } from "@/lib/search-ui/params";
import { runSuggest } from "@/lib/search-ui/run";

export const GET = apiRoute(async (req) => {
  const user = await requireUser(req);
  const { q, limit } = parseWith(suggestQuerySchema, searchParamsOf(req));
  return Response.json(runSuggest(user, q, limit) satisfies SuggestApiResponse);
});
