import { apiRoute, parseWith, uuidParam } from "@/lib/api/handler";
import { requireUser } from "@/lib/auth/session";
import { claimRequest } from "@/lib/requests";

export const POST = apiRoute<{ id: string }>(async (req, ctx) => {
  const user = await requireUser(req);
  await claimRequest(user, parseWith(uuidParam, (await ctx.params).id));
  return Response.json({ claimed: true });
});
