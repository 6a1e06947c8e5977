import { authedRoute, otherMethods } from "@/lib/api/handler";
import { deleteUse, updateUse } from "@/lib/uses/mutations";
import { getUse } from "@/lib/uses/queries";
import { updateUseSchema, type UseResponse } from "@/lib/uses/schemas";

type Params = { id: string };

export const GET = authedRoute<Params>(async (req, { user, params }) => {
  return Response.json((await getUse(user, params.id)) satisfies UseResponse);
});

/** The log's author, or a lead. */
export const PATCH = authedRoute<Params>(async (req, { user, params, json }) => {
  const input = await json(updateUseSchema);
  return Response.json((await updateUse(user, params.id, input)) satisfies UseResponse);
});

export const DELETE = authedRoute<Params>(async (req, { user, params }) => {
  await deleteUse(user, params.id);
  return new Response(null, { status: 204 });
});

export const { HEAD, OPTIONS, POST, PUT } = otherMethods({ GET, PATCH, DELETE });
