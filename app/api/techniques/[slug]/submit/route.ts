import { apiRoute } from "@/lib/api/handler";
import { requireUser } from "@/lib/auth/session";
import { submitTechnique } from "@/lib/techniques/mutations";

export const POST = apiRoute<{ slug: string }>(async (req, ctx) => {
  const user = await requireUser(req);
  return Response.json(await submitTechnique(user, (await ctx.params).slug));
});
