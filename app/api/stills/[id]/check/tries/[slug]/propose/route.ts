import { authedRoute, otherMethods, parseWith, uuidParam } from "@/lib/api/handler";
import { proposeRecipe } from "@/lib/plate-check/mutations";
import { proposeRequestSchema } from "@/lib/plate-check/schemas";

export const dynamic = "force-dynamic";

/** Senior+: proposes the filled recipe as a new revision of the technique (it goes to review). */
export const POST = authedRoute<{ id: string; slug: string }>("technique:write", async (req, { user, params, json }) => {
  const id = parseWith(uuidParam, params.id);
  const { changeNote } = await json(proposeRequestSchema);
  return Response.json(await proposeRecipe(user, id, params.slug, changeNote), { status: 201 });
});

export const { GET, HEAD, OPTIONS, PUT, PATCH, DELETE } = otherMethods({ POST });
