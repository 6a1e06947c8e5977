import { apiRoute, parseWith, uuidParam } from "@/lib/api/handler";
import { requireUser } from "@/lib/auth/session";
import { revokeApiToken } from "@/lib/people/mutations";

export const DELETE = apiRoute<{ id: string }>(async (req, ctx) => {
  const user = await requireUser(req);
  await revokeApiToken(user, parseWith(uuidParam, (await ctx.params).id));
  return new Response(null, { status: 204 });
});
