import { authedRoute, otherMethods, parseWith, uuidParam } from "@/lib/api/handler";
import { revokeApiToken } from "@/lib/people/mutations";

export const DELETE = authedRoute<{ id: string }>("token:manage", async (req, { user, params }) => {
  await revokeApiToken(user, parseWith(uuidParam, params.id));
  return new Response(null, { status: 204 });
});

export const { GET, HEAD, OPTIONS, POST, PUT, PATCH } = otherMethods({ DELETE });
