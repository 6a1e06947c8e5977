import { authedRoute, otherMethods, parseWith, uuidParam } from "@/lib/api/handler";
import { keepRecipe } from "@/lib/plate-check/mutations";
import { keepRequestSchema, type KeptRecipeDto } from "@/lib/plate-check/schemas";

export const dynamic = "force-dynamic";

/** Keeps the filled recipe of a tried technique for the reader (private: theirs alone). */
export const POST = authedRoute<{ id: string; slug: string }>("recipe:keep", async (req, { user, params, json }) => {
  const id = parseWith(uuidParam, params.id);
  const { note } = await json(keepRequestSchema);
  return Response.json((await keepRecipe(user, id, params.slug, note)) satisfies KeptRecipeDto, { status: 201 });
});

export const { GET, HEAD, OPTIONS, PUT, PATCH, DELETE } = otherMethods({ POST });
