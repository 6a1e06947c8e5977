import { NextRequest } from "next/server";
import { clientAddress, handlers } from "@/lib/auth";
import { AppError } from "@/lib/api/errors";
import { BODY_LIMITS } from "@/lib/api/body-limits";
import { otherMethods, publicRoute } from "@/lib/api/handler";
import { isSignInLimited } from "@/lib/people/sign-in";

/** Public: Auth.js's own endpoints (csrf, session, providers); its CSRF token guards sign-in and sign-out. */
export const GET = publicRoute(async (req) => handlers.GET(req as NextRequest));

/** Scripts sign in here (shared/API.md); repeated failures get a real 429 before Auth.js runs. */
export const POST = publicRoute({ bodyLimit: BODY_LIMITS.form }, async (req, { bytes }) => {
  // Auth.js reads the form again: it gets the bytes already read within the limit, not the stream.
  const request = new NextRequest(req.url, { method: "POST", headers: req.headers, body: await bytes() });
  if (request.nextUrl.pathname.endsWith("/callback/credentials")) {
    const form = await request.clone().formData().catch(() => null);
    const email = String(form?.get("email") ?? "").trim().toLowerCase();
    if (await isSignInLimited(email, clientAddress(request.headers))) throw new AppError("rate_limited");
  }
  return handlers.POST(request);
});

export const { HEAD, OPTIONS, PUT, PATCH, DELETE } = otherMethods({ GET, POST });
