import { apiRoute, parseWith, uuidParam } from "@/lib/api/handler";
import { requireUser } from "@/lib/auth/session";
import { getStillForRead, toStillResponse } from "@/lib/stills/queries";
import type { StillResponse } from "@/lib/stills/schemas";

export const GET = apiRoute<{ id: string }>(async (req, ctx) => {
  const user = await requireUser(req);
  const id = parseWith(uuidParam, (await ctx.params).id);
  const still = await getStillForRead(user, id);
  return Response.json(toStillResponse(still) satisfies StillResponse);
});
