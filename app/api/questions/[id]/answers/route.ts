import { BODY_LIMITS } from "@/lib/api/body-limits";
import { authedRoute, otherMethods, parseWith, uuidParam } from "@/lib/api/handler";
import { answerQuestion } from "@/lib/questions/mutations";
import { answerSchema } from "@/lib/questions/schemas";

export const POST = authedRoute<{ id: string }>({ bodyLimit: BODY_LIMITS.document }, async (req, { user, params, json }) => {
  const id = parseWith(uuidParam, params.id);
  const { body } = await json(answerSchema);
  return Response.json(await answerQuestion(user, id, body), { status: 201 });
});

export const { GET, HEAD, OPTIONS, PUT, PATCH, DELETE } = otherMethods({ POST });
