import { apiRoute, parseJson } from "@/lib/api/handler";
import { requireUser } from "@/lib/auth/session";
import { setMailMode } from "@/lib/subscriptions/mutations";
import { setMailModeSchema } from "@/lib/subscriptions/schemas";

/** Immediate mail or one daily summary, for all of this person's subscriptions. */
export const PUT = apiRoute(async (req) => {
  const user = await requireUser(req);
  const { mode } = await parseJson(req, setMailModeSchema);
  return Response.json(await setMailMode(user, mode));
});
