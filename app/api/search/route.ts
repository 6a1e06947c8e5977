import { authedRoute, otherMethods, parseWith, searchParamsOf } from "@/lib/api/handler";
import { searchQuerySchema, type SearchApiResponse } from "@/lib/search-ui/params";
import { runSearch } from "@/lib/search-ui/run";

export const GET = authedRoute(async (req, { user }) => {
  const query = parseWith(searchQuerySchema, searchParamsOf(req));
  return Response.json((await runSearch(user, query)) satisfies SearchApiResponse);
});

export const { HEAD, OPTIONS, POST, PUT, PATCH, DELETE } = otherMethods({ GET });
