import { z } from "zod";
import { authedRoute, otherMethods, parseWith, searchParamsOf } from "@/lib/api/handler";
import { createRequest } from "@/lib/requests/mutations";
import { listRequests } from "@/lib/requests/queries";
import { requestSchema } from "@/lib/requests/schemas";

const listSchema = z.object({ scope: z.enum(["open", "mine"]).default("open") });

export const GET = authedRoute(async (req, { user }) => {
  const { scope } = parseWith(listSchema, searchParamsOf(req));
  return Response.json({ items: await listRequests(user, scope) });
});

export const POST = authedRoute("request:create", async (req, { user, json }) => {
  const input = await json(requestSchema);
  return Response.json(await createRequest(user, input), { status: 201 });
});

export const { HEAD, OPTIONS, PUT, PATCH, DELETE } = otherMethods({ GET, POST });
