import { NextResponse, type NextRequest } from "next/server";

const SESSION_COOKIES = ["authjs.session-token", "__Secure-authjs.session-token"];
const PUBLIC_PATHS = ["/login", "/set-password", "/forgot-password", "/unsubscribed"];

/**
 * A quick redirect for signed-out visitors of app pages. Not the gate: every page, action
 * and route handler checks the session and permissions itself (lib/auth/session.ts).
 */
export function proxy(req: NextRequest): NextResponse {
  const { pathname, search } = req.nextUrl;
  const isPublic = PUBLIC_PATHS.some((p) => pathname === p || pathname.startsWith(`${p}/`));
  const hasSession = SESSION_COOKIES.some((name) => req.cookies.has(name));
  if (!isPublic && !hasSession) {
    const url = req.nextUrl.clone();
    url.pathname = "/login";
    url.search = pathname === "/" ? "" : `?next=${encodeURIComponent(pathname + search)}`;
    return NextResponse.redirect(url);
  }
  return NextResponse.next();
}

export const config = {
  // API routes answer 401 themselves; static files and Next internals need no session.
  matcher: ["/((?!api/|_next/|favicon|logo\\.svg|.*\\.(?:svg|png|webp|jpg|woff2)$).*)"],
};
