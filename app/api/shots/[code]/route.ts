import { authedRoute, otherMethods } from "@/lib/api/handler";
import { getShotWithUses } from "@/lib/shots/queries";
import type { ShotDetailResponse } from "@/lib/shots/schemas";

type Params = { code: string };

/** A shot with the techniques used on it, their outcomes, stills and follow-up notes. */
export const GET = authedRoute<Params>(async (req, { user, params }) => {
  return Response.json((await getShotWithUses(user, params.code)) satisfies ShotDetailResponse);
});

export const { HEAD, OPTIONS, POST, PUT, PATCH, DELETE } = otherMethods({ GET });
