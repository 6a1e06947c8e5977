import { apiRoute, parseWith, uuidParam } from "@/lib/api/handler";
import { requireUser } from "@/lib/auth/session";
import { deletePair } from "@/lib/stills/mutations";

export const DELETE = apiRoute<{ id: string }>(async (req, ctx) => {
  const user = await requireUser(req);
  const id = parseWith(uuidParam, (await ctx.params).id);
  await deletePair(user, id);
  return new Response(null, { status: 204 });
});
