import { apiRoute, parseJson } from "@/lib/api/handler";
import { requireUser } from "@/lib/auth/session";
import { updateShow } from "@/lib/shots/mutations";
import { getShow } from "@/lib/shots/queries";
import { updateShowSchema, type ShowResponse } from "@/lib/shots/schemas";

type Params = { code: string };

export const GET = apiRoute<Params>(async (req, ctx) => {
  const user = await requireUser(req);
  return Response.json((await getShow(user, (await ctx.params).code)) satisfies ShowResponse);
});

/** Leads only; the code itself cannot change (it is part of every shot code). */
export const PATCH = apiRoute<Params>(async (req, ctx) => {
  const user = await requireUser(req);
  const input = await parseJson(req, updateShowSchema);
  return Response.json((await updateShow(user, (await ctx.params).code, input)) satisfies ShowResponse);
});
