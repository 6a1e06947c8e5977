import { apiRoute, parseJson, parseWith, uuidParam } from "@/lib/api/handler";
import { requireUser } from "@/lib/auth/session";
import { updatePerson } from "@/lib/people/mutations";
import { updatePersonSchema } from "@/lib/people/schemas";

export const PATCH = apiRoute<{ id: string }>(async (req, ctx) => {
  const user = await requireUser(req);
  const id = parseWith(uuidParam, (await ctx.params).id);
  const input = await parseJson(req, updatePersonSchema);
  return Response.json(await updatePerson(user, id, input));
});
