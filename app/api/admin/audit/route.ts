import { z } from "zod";
import { apiRoute, parseWith, searchParamsOf } from "@/lib/api/handler";
import { listAudit } from "@/lib/audit/queries";
import { requireUser } from "@/lib/auth/session";

const querySchema = z.object({
  limit: z.coerce.number().int().min(1).max(500).default(100),
  offset: z.coerce.number().int().min(0).default(0),
});

export const GET = apiRoute(async (req) => {
  const user = await requireUser(req);
  return Response.json(await listAudit(user, parseWith(querySchema, searchParamsOf(req))));
});
