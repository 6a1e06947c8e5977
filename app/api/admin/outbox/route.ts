import { authedRoute, otherMethods, parseWith, searchParamsOf } from "@/lib/api/handler";
import { listOutbox } from "@/lib/mail/queries";
import { listOutboxSchema } from "@/lib/mail/schemas";

/** Admin: the outbox, newest first, `{ items, total, counts }` (shared/API.md). ?state=&limit=&offset= */
export const GET = authedRoute("mail:read-outbox", async (req, { user }) => {
  const query = parseWith(listOutboxSchema, searchParamsOf(req));
  return Response.json(await listOutbox(user, query));
});

export const { HEAD, OPTIONS, POST, PUT, PATCH, DELETE } = otherMethods({ GET });
