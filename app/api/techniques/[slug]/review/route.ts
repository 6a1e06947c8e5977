import { apiRoute, parseJson } from "@/lib/api/handler";
import { requireUser } from "@/lib/auth/session";
import { reviewTechnique } from "@/lib/techniques/mutations";
import { reviewSchema } from "@/lib/techniques/schemas";

export const POST = apiRoute<{ slug: string }>(async (req, ctx) => {
  const user = await requireUser(req);
  const input = await parseJson(req, reviewSchema);
  return Response.json(await reviewTechnique(user, (await ctx.params).slug, input));
});
