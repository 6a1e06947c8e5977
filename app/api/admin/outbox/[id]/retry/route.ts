import { z } from "zod";
import { authedRoute, otherMethods, parseWith } from "@/lib/api/handler";
import { retryFailed } from "@/lib/mail/sender";

const idParam = z.coerce.number({ error: "Not a valid message id." }).int("Not a valid message id.").positive("Not a valid message id.");

/** Admin: queue a failed (or waiting) message again; 409 when it is already sent or being sent. */
export const POST = authedRoute<{ id: string }>("mail:read-outbox", async (req, { user, params }) => {
  const id = parseWith(idParam, params.id);
  return Response.json(await retryFailed(user, id));
});

export const { GET, HEAD, OPTIONS, PUT, PATCH, DELETE } = otherMethods({ POST });
