import { apiRoute } from "@/lib/api/handler";
import { requireUser } from "@/lib/auth/session";
import { getShotWithUses } from "@/lib/shots/queries";
import type { ShotDetailResponse } from "@/lib/shots/schemas";

type Params = { code: string };

/** A shot with the techniques used on it, their outcomes, stills and follow-up notes. */
export const GET = apiRoute<Params>(async (req, ctx) => {
  const user = await requireUser(req);
  return Response.json((await getShotWithUses(user, (await ctx.params).code)) satisfies ShotDetailResponse);
});
