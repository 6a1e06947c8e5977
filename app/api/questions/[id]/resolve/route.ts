import { apiRoute, parseWith, uuidParam } from "@/lib/api/handler";
import { requireUser } from "@/lib/auth/session";
import { resolveQuestion } from "@/lib/questions";

export const POST = apiRoute<{ id: string }>(async (req, ctx) => {
  const user = await requireUser(req);
  await resolveQuestion(user, parseWith(uuidParam, (await ctx.params).id));
  return Response.json({ resolved: true });
});
