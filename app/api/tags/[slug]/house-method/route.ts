import { z } from "zod";
import { authedRoute, otherMethods } from "@/lib/api/handler";
import { setHouseMethod } from "@/lib/techniques/mutations";
import { slugSchema } from "@/lib/techniques/schemas";

const bodySchema = z.object({ technique: slugSchema.nullable() });

/** Sets or clears the department's approved method for a problem tag. */
export const PUT = authedRoute<{ slug: string }>("technique:set-house-method", async (req, { user, params, json }) => {
  const { technique } = await json(bodySchema);
  await setHouseMethod(user, params.slug, technique);
  return Response.json({ tag: params.slug, technique });
});

export const { GET, HEAD, OPTIONS, POST, PATCH, DELETE } = otherMethods({ PUT });
