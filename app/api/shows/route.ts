import { authedRoute, otherMethods } from "@/lib/api/handler";
import { createShow } from "@/lib/shows/mutations";
import { listShows } from "@/lib/shows/queries";
import { createShowSchema, type ShowResponse, type ShowsResponse } from "@/lib/shows/schemas";

export const GET = authedRoute(async (req, { user }) => {
  return Response.json({ items: await listShows(user) } satisfies ShowsResponse);
});

/** Leads only. */
export const POST = authedRoute("show:manage", async (req, { user, json }) => {
  const input = await json(createShowSchema);
  return Response.json((await createShow(user, input)) satisfies ShowResponse, { status: 201 });
});

export const { HEAD, OPTIONS, PUT, PATCH, DELETE } = otherMethods({ GET, POST });
