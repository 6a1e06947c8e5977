import { NextRequest } from "next/server";
import { handlers } from "@/lib/auth";
import { clientAddress } from "@/lib/auth/client-address";
import { AppError } from "@/lib/api/errors";
import { BODY_LIMITS } from "@/lib/api/body-limits";
import { otherMethods, publicRoute } from "@/lib/api/handler";
import { signInWait, signInWaitMessage } from "@/lib/people/sign-in";

/** Public: Auth.js's own endpoints (csrf, session, providers); its CSRF token guards sign-in and sign-out. */
export const GET = publicRoute(async (req) => handlers.GET(req as NextRequest));

/**
 * Scripts sign in here (shared/API.md); a throttled account or a flooding address gets a real
 * 429 with Retry-After (RFC 9110 §10.2.3) before Auth.js runs.
 */
export const POST = publicRoute({ bodyLimit: BODY_LIMITS.form }, async (req, { bytes }) => {
  // Auth.js reads the form again: it gets the bytes already read within the limit, not the stream.
  const request = new NextRequest(req.url, { method: "POST", headers: req.headers, body: await bytes() });
  if (request.nextUrl.pathname.endsWith("/callback/credentials")) {
    const form = await request.clone().formData().catch(() => null);
    const email = String(form?.get("email") ?? "").trim().toLowerCase();
    const wait = await signInWait(email, clientAddress(request.headers));
    if (wait) throw new AppError("rate_limited", signInWaitMessage(wait), { retryAfterSeconds: Math.ceil(wait.retryAfterMs / 1000) });
  }
  return handlers.POST(request);
});

export const { HEAD, OPTIONS, PUT, PATCH, DELETE } = otherMethods({ GET, POST });
