import { authedRoute, otherMethods, parseWith, uuidParam } from "@/lib/api/handler";
import { updatePerson } from "@/lib/people/mutations";
import { updatePersonSchema } from "@/lib/people/schemas";

export const PATCH = authedRoute<{ id: string }>("people:manage", async (req, { user, params, json }) => {
  const id = parseWith(uuidParam, params.id);
  const input = await json(updatePersonSchema);
  return Response.json(await updatePerson(user, id, input));
});

export const { GET, HEAD, OPTIONS, POST, PUT, DELETE } = otherMethods({ PATCH });
