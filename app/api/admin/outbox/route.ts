import { apiRoute, parseWith, searchParamsOf } from "@/lib/api/handler";
import { requireUser } from "@/lib/auth/session";
import { listOutbox } from "@/lib/mail/queries";
import { listOutboxSchema } from "@/lib/mail/schemas";

/** Admin: the outbox, newest first, `{ items, total, counts }` (shared/API.md). ?state=&limit=&offset= */
export const GET = apiRoute(async (req) => {
  const user = await requireUser(req);
  const query = parseWith(listOutboxSchema, searchParamsOf(req));
  return Response.json(await listOutbox(user, query));
});
