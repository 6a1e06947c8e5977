import { apiRoute, parseJson } from "@/lib/api/handler";
import { requireUser } from "@/lib/auth/session";
import { askQuestion, listQuestions } from "@/lib/questions";
import { questionSchema } from "@/lib/techniques/schemas";

export const GET = apiRoute<{ slug: string }>(async (req, ctx) => {
  const user = await requireUser(req);
  return Response.json({ items: await listQuestions(user, (await ctx.params).slug) });
});

export const POST = apiRoute<{ slug: string }>(async (req, ctx) => {
  const user = await requireUser(req);
  const { body } = await parseJson(req, questionSchema);
  return Response.json(await askQuestion(user, (await ctx.params).slug, body), { status: 201 });
});
