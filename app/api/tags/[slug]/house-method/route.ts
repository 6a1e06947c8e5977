import { z } from "zod";
import { authedRoute, otherMethods } from "@/lib/api/handler";
import { setHouseMethod } from "@/lib/techniques/mutations";
import { slugSchema } from "@/lib/techniques/schemas";

/** `replaces`: the method the lead agreed to replace (null: none); omitted, no check is made. */
const bodySchema = z.object({ technique: slugSchema.nullable(), replaces: slugSchema.nullable().optional() });

/** Sets or clears the department's approved method for a problem tag. */
export const PUT = authedRoute<{ slug: string }>("technique:set-house-method", async (req, { user, params, json }) => {
  const { technique, replaces } = await json(bodySchema);
  await setHouseMethod(user, params.slug, technique, { replaces });
  return Response.json({ tag: params.slug, technique });
});

export const { GET, HEAD, OPTIONS, POST, PATCH, DELETE } = otherMethods({ PUT });
