import { apiRoute, parseJson, parseWith, uuidParam } from "@/lib/api/handler";
import { requireUser } from "@/lib/auth/session";
import { answerQuestion } from "@/lib/questions";
import { answerSchema } from "@/lib/techniques/schemas";

export const POST = apiRoute<{ id: string }>(async (req, ctx) => {
  const user = await requireUser(req);
  const id = parseWith(uuidParam, (await ctx.params).id);
  const { body } = await parseJson(req, answerSchema);
  return Response.json(await answerQuestion(user, id, body), { status: 201 });
});
