import { AppError } from "@/lib/api/errors";
import { authedRoute, otherMethods } from "@/lib/api/handler";
import { getInboxRaw } from "@/lib/mail/inbox";

/** Admin: one received message exactly as it arrived (RFC 5322 bytes), to open in a mail program. */
export const GET = authedRoute<{ id: string }>("mail:read-outbox", async (req, { user, params: { id } }) => {
  const raw = await getInboxRaw(user, id);
  if (!raw) throw new AppError("not_found", "No such message in the local inbox.");
  return new Response(new Uint8Array(raw), {
    headers: { "Content-Type": "message/rfc822", "Content-Disposition": `attachment; filename="${id}.eml"` },
  });
});

export const { HEAD, OPTIONS, POST, PUT, PATCH, DELETE } = otherMethods({ GET });
