import { z } from "zod";
import { apiRoute, parseJson, parseWith, searchParamsOf } from "@/lib/api/handler";
import { requireUser } from "@/lib/auth/session";
import { createRequest, listRequests } from "@/lib/requests";
import { requestSchema } from "@/lib/techniques/schemas";

const listSchema = z.object({ scope: z.enum(["open", "mine"]).default("open") });

export const GET = apiRoute(async (req) => {
  const user = await requireUser(req);
  const { scope } = parseWith(listSchema, searchParamsOf(req));
  return Response.json({ items: await listRequests(user, scope) });
});

export const POST = apiRoute(async (req) => {
  const user = await requireUser(req);
  const input = await parseJson(req, requestSchema);
  return Response.json(await createRequest(user, input), { status: 201 });
});
