import { authedRoute, otherMethods } from "@/lib/api/handler";
import { submitTechnique } from "@/lib/techniques/mutations";

export const POST = authedRoute<{ slug: string }>("technique:submit", async (req, { user, params }) => {
  return Response.json(await submitTechnique(user, params.slug));
});

export const { GET, HEAD, OPTIONS, PUT, PATCH, DELETE } = otherMethods({ POST });
