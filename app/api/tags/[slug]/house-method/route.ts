import { z } from "zod";
import { apiRoute, parseJson } from "@/lib/api/handler";
import { requireUser } from "@/lib/auth/session";
import { setHouseMethod } from "@/lib/techniques/mutations";
import { slugSchema } from "@/lib/techniques/schemas";

const bodySchema = z.object({ technique: slugSchema.nullable() });

/** Sets or clears the department's approved method for a problem tag. */
export const PUT = apiRoute<{ slug: string }>(async (req, ctx) => {
  const user = await requireUser(req);
  const { technique } = await parseJson(req, bodySchema);
  await setHouseMethod(user, (await ctx.params).slug, technique);
  return Response.json({ tag: (await ctx.params).slug, technique });
});
