import { apiRoute, parseJson, parseWith, uuidParam } from "@/lib/api/handler";
import { requireUser } from "@/lib/auth/session";
import { keepRecipe } from "@/lib/plate-check/mutations";
import { keepRequestSchema, type KeptRecipeDto } from "@/lib/plate-check/schemas";

export const dynamic = "force-dynamic";

/** Keeps the filled recipe of a tried technique for the reader (private: theirs and the leads'). */
export const POST = apiRoute<{ id: string; slug: string }>(async (req, ctx) => {
  const user = await requireUser(req);
  const params = await ctx.params;
  const id = parseWith(uuidParam, params.id);
  const { note } = await parseJson(req, keepRequestSchema);
  return Response.json((await keepRecipe(user, id, params.slug, note)) satisfies KeptRecipeDto, { status: 201 });
});
