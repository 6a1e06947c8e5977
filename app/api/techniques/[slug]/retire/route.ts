import { authedRoute, otherMethods } from "@/lib/api/handler";
import { retireTechnique } from "@/lib/techniques/mutations";
import { retireSchema } from "@/lib/techniques/schemas";

export const POST = authedRoute<{ slug: string }>("technique:retire", async (req, { user, params, json }) => {
  const input = await json(retireSchema);
  return Response.json(await retireTechnique(user, params.slug, input));
});

export const { GET, HEAD, OPTIONS, PUT, PATCH, DELETE } = otherMethods({ POST });
