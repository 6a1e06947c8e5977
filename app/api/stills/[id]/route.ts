import { authedRoute, otherMethods, parseWith, uuidParam } from "@/lib/api/handler";
import { getStillForRead, toStillResponse } from "@/lib/stills/queries";
import type { StillResponse } from "@/lib/stills/schemas";

export const GET = authedRoute<{ id: string }>(async (req, { user, params }) => {
  const id = parseWith(uuidParam, params.id);
  const still = await getStillForRead(user, id);
  return Response.json(toStillResponse(still) satisfies StillResponse);
});

export const { HEAD, OPTIONS, POST, PUT, PATCH, DELETE } = otherMethods({ GET });
