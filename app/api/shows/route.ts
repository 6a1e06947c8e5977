import { authedRoute, otherMethods } from "@/lib/api/handler";
import { createShow } from "@/lib/shots/mutations";
import { listShows } from "@/lib/shots/queries";
import { createShowSchema, type ShowResponse, type ShowsResponse } from "@/lib/shots/schemas";

export const GET = authedRoute(async (req, { user }) => {
  return Response.json({ items: await listShows(user) } satisfies ShowsResponse);
});

/** Leads only. */
export const POST = authedRoute("show:manage", async (req, { user, json }) => {
  const input = await json(createShowSchema);
  return Response.json((await createShow(user, input)) satisfies ShowResponse, { status: 201 });
});

export const { HEAD, OPTIONS, PUT, PATCH, DELETE } = otherMethods({ GET, POST });
