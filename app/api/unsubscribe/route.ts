import { z } from "zod";
import { AppError } from "@/lib/api/errors";
import { BODY_LIMITS } from "@/lib/api/body-limits";
import { otherMethods, parseWith, publicRoute, searchParamsOf } from "@/lib/api/handler";
import { applyUnsubscribe } from "@/lib/mail/unsubscribe";

const tokenQuery = z.object({ token: z.string().trim().min(1, "The link has no token.").max(2000) });

/**
 * The one-click unsubscribe (RFC 8058 §3.2, from memory): the receiving mail system POSTs
 * `List-Unsubscribe=One-Click` to the List-Unsubscribe URL, with no cookies and no sign-in;
 * the signed token in the URL is the only authority. The answer is never a redirect (same
 * section). Using it twice is harmless.
 */
// Public, and no cross-site check: that guards cookie sessions, and this endpoint uses none. A
// webmail page or a receiver's server may POST from anywhere; the token decides.
export const POST = publicRoute({ bodyLimit: BODY_LIMITS.form }, async (req, { form }) => {
  const { token } = parseWith(tokenQuery, searchParamsOf(req));
  await checkOneClickBody(req, form);
  const result = await applyUnsubscribe(token);
  return Response.json({ unsubscribed: true, removed: result.removed, target: result.target });
});

/**
 * A person clicking the link (or a link scanner fetching it, RFC 8058 §1, from memory) must not
 * unsubscribe anyone: GET only leads to the confirmation page, whose button does it.
 */
export const GET = publicRoute(async (req) => {
  const token = new URL(req.url).searchParams.get("token") ?? "";
  // A relative Location (RFC 9110 §10.2.2, from memory) keeps whatever host the person used.
  return new Response(null, { status: 303, headers: { Location: `/unsubscribe?token=${encodeURIComponent(token)}` } });
});

/**
 * The body RFC 8058 names is `List-Unsubscribe=One-Click`, form-encoded. An empty body is
 * accepted (the token decides); a body that says something else is refused.
 */
async function checkOneClickBody(req: Request, form: () => Promise<FormData>): Promise<void> {
  const type = req.headers.get("content-type") ?? "";
  if (!type.includes("application/x-www-form-urlencoded") && !type.includes("multipart/form-data")) return;
  const value = (await form()).get("List-Unsubscribe");
  if (value !== null && value !== "One-Click") throw new AppError("bad_request", "Expected List-Unsubscribe=One-Click.");
}

export const { HEAD, OPTIONS, PUT, PATCH, DELETE } = otherMethods({ GET, POST });
