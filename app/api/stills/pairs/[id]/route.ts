import { authedRoute, otherMethods, parseWith, uuidParam } from "@/lib/api/handler";
import { deletePair } from "@/lib/stills/mutations";

export const DELETE = authedRoute<{ id: string }>("still:upload", async (req, { user, params }) => {
  const id = parseWith(uuidParam, params.id);
  await deletePair(user, id);
  return new Response(null, { status: 204 });
});

export const { GET, HEAD, OPTIONS, POST, PUT, PATCH } = otherMethods({ DELETE });
