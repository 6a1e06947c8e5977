import { authedRoute, otherMethods } from "@/lib/api/handler";
import { updateShow } from "@/lib/shows/mutations";
import { getShow } from "@/lib/shows/queries";
import { updateShowSchema, type ShowResponse } from "@/lib/shows/schemas";

type Params = { code: string };

export const GET = authedRoute<Params>(async (req, { user, params }) => {
  return Response.json((await getShow(user, params.code)) satisfies ShowResponse);
});

/** Leads only; the code itself cannot change (it is part of every shot code). */
export const PATCH = authedRoute<Params>("show:manage", async (req, { user, params, json }) => {
  const input = await json(updateShowSchema);
  return Response.json((await updateShow(user, params.code, input)) satisfies ShowResponse);
});

export const { HEAD, OPTIONS, POST, PUT, DELETE } = otherMethods({ GET, PATCH });
