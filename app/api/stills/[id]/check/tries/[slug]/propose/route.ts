import { apiRoute, parseJson, parseWith, uuidParam } from "@/lib/api/handler";
import { assertCan } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/session";
import { proposeRecipe } from "@/lib/plate-check/mutations";
import { proposeRequestSchema } from "@/lib/plate-check/schemas";

export const dynamic = "force-dynamic";

/** Senior+: proposes the filled recipe as a new revision of the technique (it goes to review). */
export const POST = apiRoute<{ id: string; slug: string }>(async (req, ctx) => {
  const user = await requireUser(req);
  assertCan(user, "technique:write");
  const params = await ctx.params;
  const id = parseWith(uuidParam, params.id);
  const { changeNote } = await parseJson(req, proposeRequestSchema);
  return Response.json(await proposeRecipe(user, id, params.slug, changeNote), { status: 201 });
});
