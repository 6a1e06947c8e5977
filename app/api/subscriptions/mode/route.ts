import { authedRoute, otherMethods } from "@/lib/api/handler";
import { setMailMode } from "@/lib/subscriptions/mutations";
import { setMailModeSchema } from "@/lib/subscriptions/schemas";

/** Immediate mail or one daily summary, for all of this person's subscriptions. */
export const PUT = authedRoute("subscription:manage", async (req, { user, json }) => {
  const { mode } = await json(setMailModeSchema);
  return Response.json(await setMailMode(user, mode));
});

export const { GET, HEAD, OPTIONS, POST, PATCH, DELETE } = otherMethods({ PUT });
