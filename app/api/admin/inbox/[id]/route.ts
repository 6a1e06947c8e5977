import { AppError } from "@/lib/api/errors";
import { apiRoute } from "@/lib/api/handler";
import { assertCan } from "@/lib/auth/permissions";
import { requireUser } from "@/lib/auth/session";
import { readInboxRaw } from "@/lib/mail/fake-smtp";

/** Admin: one received message exactly as it arrived (RFC 5322 bytes), to open in a mail program. */
export const GET = apiRoute<{ id: string }>(async (req, ctx) => {
  const user = await requireUser(req);
  assertCan(user, "mail:read-outbox");
  const { id } = await ctx.params;
  const raw = await readInboxRaw(id);
  if (!raw) throw new AppError("not_found", "No such message in the local inbox.");
  return new Response(new Uint8Array(raw), {
    headers: { "Content-Type": "message/rfc822", "Content-Disposition": `attachment; filename="${id}.eml"` },
  });
});
