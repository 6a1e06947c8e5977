import type { NextRequest } from "next/server";
import { clientAddress, handlers } from "@/lib/auth";
import { AppError } from "@/lib/api/errors";
import { errorResponse } from "@/lib/api/handler";
import { isSignInLimited } from "@/lib/people/sign-in";

export const GET = handlers.GET;

/** Scripts sign in here (shared/API.md); repeated failures get a real 429 before Auth.js runs. */
export async function POST(req: NextRequest): Promise<Response> {
  if (req.nextUrl.pathname.endsWith("/callback/credentials")) {
    const form = await req.clone().formData().catch(() => null);
    const email = String(form?.get("email") ?? "").trim().toLowerCase();
    if (await isSignInLimited(email, clientAddress(req.headers))) return errorResponse(new AppError("rate_limited"));
  }
  return handlers.POST(req);
}
