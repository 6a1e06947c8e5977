import { z } from "zod";
import { AppError } from "@/lib/api/errors";
import { authedRoute, otherMethods, parseWith } from "@/lib/api/handler";
import { getOutboxItem } from "@/lib/mail/queries";

const idParam = z.coerce.number({ error: "Not a valid message id." }).int("Not a valid message id.").positive("Not a valid message id.");

/** Admin: one outbox message with its parts and headers. */
export const GET = authedRoute<{ id: string }>("mail:read-outbox", async (req, { user, params }) => {
  const id = parseWith(idParam, params.id);
  const item = await getOutboxItem(user, id);
  if (!item) throw new AppError("not_found", "No such message in the outbox.");
  return Response.json(item);
});

export const { HEAD, OPTIONS, POST, PUT, PATCH, DELETE } = otherMethods({ GET });
