import { z } from "zod";
import { apiRoute, parseJson } from "@/lib/api/handler";
import { requireUser } from "@/lib/auth/session";
import { setHouseMethod } from "@/lib/techniques/mutations";
import { slugSchema } from "@/lib/techniques/schemas";

/** `replaces`: the method the lead agreed to replace (null: none); omitted, no check is made. */
const bodySchema = z.object({ technique: slugSchema.nullable(), replaces: slugSchema.nullable().optional() });

/** Sets or clears the department's approved method for a problem tag. */
export const PUT = apiRoute<{ slug: string }>(async (req, ctx) => {
  const user = await requireUser(req);
  const { technique, replaces } = await parseJson(req, bodySchema);
  await setHouseMethod(user, (await ctx.params).slug, technique, { replaces });
  return Response.json({ tag: (await ctx.params).slug, technique });
});
