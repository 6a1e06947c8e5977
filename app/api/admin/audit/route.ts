import { z } from "zod";
import { authedRoute, otherMethods, parseWith, searchParamsOf } from "@/lib/api/handler";
import { listAudit } from "@/lib/audit/queries";
import { auditFilterSchema } from "@/lib/audit/schemas";

const querySchema = auditFilterSchema.extend({
  limit: z.coerce.number().int().min(1).max(500).default(100),
  offset: z.coerce.number().int().min(0).default(0),
});

export const GET = authedRoute("audit:read", async (req, { user }) => {
  const q = parseWith(querySchema, searchParamsOf(req));
  return Response.json(await listAudit(user, { actorId: q.person, actions: q.action ? [q.action] : undefined, from: q.from, to: q.to, limit: q.limit, offset: q.offset }));
});

export const { HEAD, OPTIONS, POST, PUT, PATCH, DELETE } = otherMethods({ GET });
