import { z } from "zod";
import { apiRoute, parseWith } from "@/lib/api/handler";
import { requireUser } from "@/lib/auth/session";
import { retryFailed } from "@/lib/mail/sender";

const idParam = z.coerce.number({ error: "Not a valid message id." }).int("Not a valid message id.").positive("Not a valid message id.");

/** Admin: queue a failed (or waiting) message again; 409 when it is already sent or being sent. */
export const POST = apiRoute<{ id: string }>(async (req, ctx) => {
  const user = await requireUser(req);
  const id = parseWith(idParam, (await ctx.params).id);
  return Response.json(await retryFailed(user, id));
});
