import { apiRoute, parseJson } from "@/lib/api/handler";
import { requireUser } from "@/lib/auth/session";
import { retireTechnique } from "@/lib/techniques/mutations";
import { retireSchema } from "@/lib/techniques/schemas";

export const POST = apiRoute<{ slug: string }>(async (req, ctx) => {
  const user = await requireUser(req);
  const input = await parseJson(req, retireSchema);
  return Response.json(await retireTechnique(user, (await ctx.params).slug, input));
});
