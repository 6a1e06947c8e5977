import { z } from "zod";
import { apiRoute, parseJson, parseWith, searchParamsOf } from "@/lib/api/handler";
import { requireUser } from "@/lib/auth/session";
import { requireVisibleTechnique } from "@/lib/techniques/queries";
import { createPair } from "@/lib/stills/mutations";
import { listPairsForTechnique } from "@/lib/stills/queries";
import { createPairSchema, type StillPairResponse } from "@/lib/stills/schemas";

export const POST = apiRoute(async (req) => {
  const user = await requireUser(req);
  const input = await parseJson(req, createPairSchema);
  return Response.json((await createPair(user, input)) satisfies StillPairResponse, { status: 201 });
});

const listQuery = z.object({ technique: z.string().min(1, "Name a technique.") });

export const GET = apiRoute(async (req) => {
  const user = await requireUser(req);
  const q = parseWith(listQuery, searchParamsOf(req));
  const { technique } = await requireVisibleTechnique(user, q.technique);
  const items = await listPairsForTechnique(user, technique.id);
  return Response.json({ items } satisfies { items: StillPairResponse[] });
});
