import { authedRoute, otherMethods } from "@/lib/api/handler";
import { listRevisions } from "@/lib/techniques/queries";

export const GET = authedRoute<{ slug: string }>(async (req, { user, params }) => {
  return Response.json(await listRevisions(user, params.slug));
});

export const { HEAD, OPTIONS, POST, PUT, PATCH, DELETE } = otherMethods({ GET });
