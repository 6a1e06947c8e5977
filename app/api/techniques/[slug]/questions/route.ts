import { BODY_LIMITS } from "@/lib/api/body-limits";
import { authedRoute, otherMethods } from "@/lib/api/handler";
import { askQuestion } from "@/lib/questions/mutations";
import { listQuestions } from "@/lib/questions/queries";
import { questionSchema } from "@/lib/questions/schemas";

export const GET = authedRoute<{ slug: string }>(async (req, { user, params }) => {
  return Response.json({ items: await listQuestions(user, params.slug) });
});

export const POST = authedRoute<{ slug: string }>({ permission: "question:ask", bodyLimit: BODY_LIMITS.document }, async (req, { user, params, json }) => {
  const { body } = await json(questionSchema);
  return Response.json(await askQuestion(user, params.slug, body), { status: 201 });
});

export const { HEAD, OPTIONS, PUT, PATCH, DELETE } = otherMethods({ GET, POST });
