import { apiRoute, parseJson } from "@/lib/api/handler";
import { requireUser } from "@/lib/auth/session";
import { createShow } from "@/lib/shots/mutations";
import { listShows } from "@/lib/shots/queries";
import { createShowSchema, type ShowResponse, type ShowsResponse } from "@/lib/shots/schemas";

export const GET = apiRoute(async (req) => {
  const user = await requireUser(req);
  return Response.json({ items: await listShows(user) } satisfies ShowsResponse);
});

/** Leads only. */
export const POST = apiRoute(async (req) => {
  const user = await requireUser(req);
  const input = await parseJson(req, createShowSchema);
  return Response.json((await createShow(user, input)) satisfies ShowResponse, { status: 201 });
});
