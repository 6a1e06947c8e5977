import { authedRoute, otherMethods } from "@/lib/api/handler";
import { reviewTechnique } from "@/lib/techniques/mutations";
import { reviewSchema } from "@/lib/techniques/schemas";

export const POST = authedRoute<{ slug: string }>("technique:review", async (req, { user, params, json }) => {
  const input = await json(reviewSchema);
  return Response.json(await reviewTechnique(user, params.slug, input));
});

export const { GET, HEAD, OPTIONS, PUT, PATCH, DELETE } = otherMethods({ POST });
