import { z } from "zod";
import { authedRoute, otherMethods, parseWith } from "@/lib/api/handler";
import { restoreRevision } from "@/lib/techniques/mutations";

const bodySchema = z.object({ baseRevision: z.number().int().min(1) });

export const POST = authedRoute<{ slug: string; number: string }>("technique:write", async (req, { user, params, json }) => {
  const number = parseWith(z.coerce.number().int().min(1), params.number);
  const { baseRevision } = await json(bodySchema);
  return Response.json(await restoreRevision(user, params.slug, number, baseRevision), { status: 201 });
});

export const { GET, HEAD, OPTIONS, PUT, PATCH, DELETE } = otherMethods({ POST });
