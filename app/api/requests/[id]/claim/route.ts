import { authedRoute, otherMethods, parseWith, uuidParam } from "@/lib/api/handler";
import { claimRequest } from "@/lib/requests/mutations";

export const POST = authedRoute<{ id: string }>("request:claim", async (req, { user, params }) => {
  await claimRequest(user, parseWith(uuidParam, params.id));
  return Response.json({ claimed: true });
});

export const { GET, HEAD, OPTIONS, PUT, PATCH, DELETE } = otherMethods({ POST });
