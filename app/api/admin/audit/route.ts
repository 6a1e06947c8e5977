import { z } from "zod";
import { authedRoute, otherMethods, parseWith, searchParamsOf } from "@/lib/api/handler";
import { listAudit } from "@/lib/audit/queries";

const querySchema = z.object({
  limit: z.coerce.number().int().min(1).max(500).default(100),
  offset: z.coerce.number().int().min(0).default(0),
});

export const GET = authedRoute("audit:read", async (req, { user }) => {
  return Response.json(await listAudit(user, parseWith(querySchema, searchParamsOf(req))));
});

export const { HEAD, OPTIONS, POST, PUT, PATCH, DELETE } = otherMethods({ GET });
