import { z } from "zod";
import { authedRoute, otherMethods, parseWith, searchParamsOf } from "@/lib/api/handler";
import { subscribe, unsubscribe } from "@/lib/subscriptions/mutations";
import { getSubscription, listSubscriptions } from "@/lib/subscriptions/queries";
import { SUBSCRIPTION_KINDS, subscribeSchema, unsubscribeSchema } from "@/lib/subscriptions/schemas";

const oneSchema = z.object({ kind: z.enum(SUBSCRIPTION_KINDS), key: z.string().min(1).max(200) });

/** The caller's subscriptions, or with ?kind=&key= just that one (`subscription: null` when none). */
export const GET = authedRoute("subscription:manage", async (req, { user }) => {
  const query = searchParamsOf(req);
  if (query.kind || query.key) {
    const { kind, key } = parseWith(oneSchema, query);
    return Response.json({ subscription: await getSubscription(user, kind, key) });
  }
  return Response.json(await listSubscriptions(user));
});

export const POST = authedRoute("subscription:manage", async (req, { user, json }) => {
  const input = await json(subscribeSchema);
  return Response.json(await subscribe(user, input), { status: 201 });
});

export const DELETE = authedRoute("subscription:manage", async (req, { user, json }) => {
  const { target } = await json(unsubscribeSchema);
  return Response.json(await unsubscribe(user, target));
});

export const { HEAD, OPTIONS, PUT, PATCH } = otherMethods({ GET, POST, DELETE });
