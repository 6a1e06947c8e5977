import { z } from "zod";
import { authedRoute, otherMethods, parseWith, searchParamsOf } from "@/lib/api/handler";
import { requireVisibleTechnique } from "@/lib/techniques/queries";
import { createPair } from "@/lib/stills/mutations";
import { listPairsForTechnique } from "@/lib/stills/queries";
import { createPairSchema, type StillPairResponse } from "@/lib/stills/schemas";

export const POST = authedRoute("still:upload", async (req, { user, json }) => {
  const input = await json(createPairSchema);
  return Response.json((await createPair(user, input)) satisfies StillPairResponse, { status: 201 });
});

const listQuery = z.object({ technique: z.string().min(1, "Name a technique.") });

export const GET = authedRoute(async (req, { user }) => {
  const q = parseWith(listQuery, searchParamsOf(req));
  const { technique } = await requireVisibleTechnique(user, q.technique);
  const items = await listPairsForTechnique(user, technique.id);
  return Response.json({ items } satisfies { items: StillPairResponse[] });
});

export const { HEAD, OPTIONS, PUT, PATCH, DELETE } = otherMethods({ GET, POST });
