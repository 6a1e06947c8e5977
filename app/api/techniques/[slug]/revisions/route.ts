import { apiRoute } from "@/lib/api/handler";
import { requireUser } from "@/lib/auth/session";
import { listRevisions } from "@/lib/techniques/queries";

export const GET = apiRoute<{ slug: string }>(async (req, ctx) => {
  const user = await requireUser(req);
  return Response.json(await listRevisions(user, (await ctx.params).slug));
});
