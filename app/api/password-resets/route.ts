import { z } from "zod";
import { AppError } from "@/lib/api/errors";
import { BODY_LIMITS } from "@/lib/api/body-limits";
import { otherMethods, publicRoute } from "@/lib/api/handler";
import { emailSchema } from "@/lib/auth/schemas";
import { clientAddress } from "@/lib/auth/client-address";
import { afterAnswer, requestPasswordReset, resetAnswerMessage } from "@/lib/people/password-reset";
import { waitInWords } from "@/lib/people/sign-in";

export const dynamic = "force-dynamic";

/**
 * POST /api/password-resets `{ email }` (no session): 202 with the same message for every
 * address; 429 with Retry-After past the limits per e-mail and per client address.
 */
export const POST = publicRoute({ bodyLimit: BODY_LIMITS.json }, async (req, { json }) => {
  const { email } = await json(z.object({ email: emailSchema }));
  const answer = await requestPasswordReset(email, clientAddress(req.headers), afterAnswer);
  const message = resetAnswerMessage(answer, waitInWords);
  if (!answer.ok) throw new AppError("rate_limited", message, { retryAfterSeconds: Math.ceil(answer.retryAfterMs / 1000) });
  return Response.json({ message }, { status: 202 });
});

export const { GET, HEAD, OPTIONS, PUT, PATCH, DELETE } = otherMethods({ POST });
