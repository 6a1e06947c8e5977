import { z } from "zod";
import { authedRoute, otherMethods, parseWith, searchParamsOf } from "@/lib/api/handler";
import { listInbox } from "@/lib/mail/inbox";

const querySchema = z.object({ limit: z.coerce.number().int().min(1).max(200).default(50) });

/** Admin: what the local fake SMTP server received, newest first, as the recipients would see it. */
export const GET = authedRoute("mail:read-outbox", async (req, { user }) => {
  const { limit } = parseWith(querySchema, searchParamsOf(req));
  return Response.json({ items: await listInbox(user, { limit }) });
});

export const { HEAD, OPTIONS, POST, PUT, PATCH, DELETE } = otherMethods({ GET });
