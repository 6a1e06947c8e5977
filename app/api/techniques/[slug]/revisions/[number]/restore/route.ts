import { z } from "zod";
import { apiRoute, parseJson, parseWith } from "@/lib/api/handler";
import { requireUser } from "@/lib/auth/session";
import { restoreRevision } from "@/lib/techniques/mutations";

const bodySchema = z.object({ baseRevision: z.number().int().min(1) });

export const POST = apiRoute<{ slug: string; number: string }>(async (req, ctx) => {
  const user = await requireUser(req);
  const params = await ctx.params;
  const number = parseWith(z.coerce.number().int().min(1), params.number);
  const { baseRevision } = await parseJson(req, bodySchema);
  return Response.json(await restoreRevision(user, params.slug, number, baseRevision), { status: 201 });
});
