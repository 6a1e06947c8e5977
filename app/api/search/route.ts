import { apiRoute, parseWith, searchParamsOf } from "@/lib/api/handler";
import { requireUser } from "@/lib/auth/session";
import { searchQuerySchema, type SearchApiResponse } from "@/lib/search-ui/params";
import { runSearch } from "@/lib/search-ui/run";

export const GET = apiRoute(async (req) => {
  const user = await requireUser(req);
  const query = parseWith(searchQuerySchema, searchParamsOf(req));
  return Response.json(runSearch(user, query) satisfies SearchApiResponse);
});
