import { z } from "zod";
import { authedRoute, otherMethods, parseWith, searchParamsOf } from "@/lib/api/handler";
import { readInbox } from "@/lib/mail/fake-smtp";

const querySchema = z.object({ limit: z.coerce.number().int().min(1).max(200).default(50) });

/** Admin: what the local fake SMTP server received, newest first, as the recipients would see it. */
export const GET = authedRoute("mail:read-outbox", async (req) => {
  const { limit } = parseWith(querySchema, searchParamsOf(req));
  return Response.json({ items: await readInbox(undefined, { limit }) });
});

export const { HEAD, OPTIONS, POST, PUT, PATCH, DELETE } = otherMethods({ GET });
