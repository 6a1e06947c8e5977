import { apiRoute, parseJson } from "@/lib/api/handler";
import { requireUser } from "@/lib/auth/session";
import { deleteUse, updateUse } from "@/lib/shots/mutations";
import { getUse } from "@/lib/shots/queries";
import { updateUseSchema, type UseResponse } from "@/lib/shots/schemas";

type Params = { id: string };

export const GET = apiRoute<Params>(async (req, ctx) => {
  const user = await requireUser(req);
  return Response.json((await getUse(user, (await ctx.params).id)) satisfies UseResponse);
});

/** The log's author, or a lead. */
export const PATCH = apiRoute<Params>(async (req, ctx) => {
  const user = await requireUser(req);
  const input = await parseJson(req, updateUseSchema);
  return Response.json((await updateUse(user, (await ctx.params).id, input)) satisfies UseResponse);
});

export const DELETE = apiRoute<Params>(async (req, ctx) => {
  const user = await requireUser(req);
  await deleteUse(user, (await ctx.params).id);
  return new Response(null, { status: 204 });
});
