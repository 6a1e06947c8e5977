import { z } from "zod";
import { apiRoute, parseJson, parseWith, searchParamsOf } from "@/lib/api/handler";
import { requireUser } from "@/lib/auth/session";
import { subscribe, unsubscribe } from "@/lib/subscriptions/mutations";
import { getSubscription, listSubscriptions } from "@/lib/subscriptions/queries";
import { SUBSCRIPTION_KINDS, subscribeSchema, unsubscribeSchema } from "@/lib/subscriptions/schemas";

const oneSchema = z.object({ kind: z.enum(SUBSCRIPTION_KINDS), key: z.string().min(1).max(200) });

/** The caller's subscriptions, or with ?kind=&key= just that one (`subscription: null` when none). */
export const GET = apiRoute(async (req) => {
  const user = await requireUser(req);
  const query = searchParamsOf(req);
  if (query.kind || query.key) {
    const { kind, key } = parseWith(oneSchema, query);
    return Response.json({ subscription: await getSubscription(user, kind, key) });
  }
  return Response.json(await listSubscriptions(user));
});

export const POST = apiRoute(async (req) => {
  const user = await requireUser(req);
  const input = await parseJson(req, subscribeSchema);
  return Response.json(await subscribe(user, input), { status: 201 });
});

export const DELETE = apiRoute(async (req) => {
  const user = await requireUser(req);
  const { target } = await parseJson(req, unsubscribeSchema);
  return Response.json(await unsubscribe(user, target));
});
