import { z } from "zod";
import { apiRoute, parseWith, searchParamsOf } from "@/lib/api/handler";
import { assertCan } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/session";
import { readInbox } from "@/lib/mail/fake-smtp";

const querySchema = z.object({ limit: z.coerce.number().int().min(1).max(200).default(50) });

/** Admin: what the local fake SMTP server received, newest first, as the recipients would see it. */
export const GET = apiRoute(async (req) => {
  const user = await requireUser(req);
  assertCan(user, "mail:read-outbox");
  const { limit } = parseWith(querySchema, searchParamsOf(req));
  return Response.json({ items: await readInbox(undefined, { limit }) });
});
