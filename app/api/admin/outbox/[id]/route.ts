import { z } from "zod";
import { AppError } from "@/lib/api/errors";
import { apiRoute, parseWith } from "@/lib/api/handler";
import { requireUser } from "@/lib/auth/session";
import { getOutboxItem } from "@/lib/mail/queries";

const idParam = z.coerce.number({ error: "Not a valid message id." }).int("Not a valid message id.").positive("Not a valid message id.");

/** Admin: one outbox message with its parts and headers. */
export const GET = apiRoute<{ id: string }>(async (req, ctx) => {
  const user = await requireUser(req);
  const id = parseWith(idParam, (await ctx.params).id);
  const item = await getOutboxItem(user, id);
  if (!item) throw new AppError("not_found", "No such message in the outbox.");
  return Response.json(item);
});
