import type { NextRequest } from "next/server";
import { handlers } from "@/lib/auth";
import { clientAddress } from "@/lib/auth/client-address";
import { AppError } from "@/lib/api/errors";
import { errorResponse } from "@/lib/api/handler";
import { signInWait, signInWaitMessage } from "@/lib/people/sign-in";

export const GET = handlers.GET;

/**
 * Scripts sign in here (shared/API.md); a throttled account or a flooding address gets a real
 * 429 with Retry-After (RFC 9110 §10.2.3) before Auth.js runs.
 */
export async function POST(req: NextRequest): Promise<Response> {
  if (req.nextUrl.pathname.endsWith("/callback/credentials")) {
    const form = await req.clone().formData().catch(() => null);
    const email = String(form?.get("email") ?? "").trim().toLowerCase();
    const wait = await signInWait(email, clientAddress(req.headers));
    if (wait) {
      const res = errorResponse(new AppError("rate_limited", signInWaitMessage(wait)));
      res.headers.set("Retry-After", String(Math.ceil(wait.retryAfterMs / 1000)));
      return res;
    }
  }
  return handlers.POST(req);
}
