import { authedRoute, otherMethods, parseWith, uuidParam } from "@/lib/api/handler";
import { resolveQuestion } from "@/lib/questions/mutations";

export const POST = authedRoute<{ id: string }>(async (req, { user, params }) => {
  await resolveQuestion(user, parseWith(uuidParam, params.id));
  return Response.json({ resolved: true });
});

export const { GET, HEAD, OPTIONS, PUT, PATCH, DELETE } = otherMethods({ POST });
