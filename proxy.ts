import { NextResponse, type NextRequest } from "next/server";
import { crossOriginWriteReason } from "@/lib/api/origin";
import { cachedPage, isCacheablePageRequest, pageResponse } from "@/lib/page-cache/rendered-pages";

const SESSION_COOKIES = ["authjs.session-token", "__Secure-authjs.session-token"];
const PUBLIC_PATHS = ["/login", "/set-password", "/forgot-password", "/unsubscribe"];

/**
 * Content-Security-Policy with a fresh nonce per request: Next.js puts it on its own inline
 * scripts, and 'strict-dynamic' lets those load the rest. No 'unsafe-eval' outside development
 * (React's dev tooling needs it there).
 */
function contentSecurityPolicy(nonce: string, isDev = process.env.NODE_ENV === "development"): string {
  return [
    "default-src 'self'",
    `script-src 'self' 'nonce-${nonce}' 'strict-dynamic'${isDev ? " 'unsafe-eval'" : ""}`,
    // Inline style attributes (compare divider position, chart sizes) need this; styles cannot run code.
    "style-src 'self' 'unsafe-inline'",
    "img-src 'self' blob: data:",
    "font-src 'self'",
    "connect-src 'self'",
    "object-src 'none'",
    "base-uri 'self'",
    "form-action 'self'",
    "frame-ancestors 'none'",
    "frame-src 'self'",
  ].join("; ");
}

/**
 * Sets the CSP and redirects signed-out visitors of app pages to sign-in. The redirect is a
 * convenience, not the gate: every page, action and route handler checks the session itself.
 * Technique pages loaded as documents are answered from lib/page-cache when a current copy exists.
 * A server action posted with the session cookie from another origin is refused here by the same
 * rule the API uses (lib/api/origin.ts), which compares scheme, host and port, not just the host.
 */
export async function proxy(req: NextRequest): Promise<Response> {
  const { pathname, search } = req.nextUrl;
  const isPublic = PUBLIC_PATHS.some((p) => pathname === p || pathname.startsWith(`${p}/`));
  const hasSession = SESSION_COOKIES.some((name) => req.cookies.has(name));
  const refusal = hasSession ? crossOriginWriteReason(req.method, req.headers) : null;
  if (refusal) return new Response(refusal, { status: 403, headers: { "Content-Type": "text/plain; charset=utf-8", "X-Content-Type-Options": "nosniff" } });
  if (!isPublic && !hasSession) {
    const url = req.nextUrl.clone();
    url.pathname = "/login";
    url.search = pathname === "/" ? "" : `?next=${encodeURIComponent(pathname + search)}`;
    return NextResponse.redirect(url);
  }
  const nonce = Buffer.from(crypto.randomUUID()).toString("base64");
  const csp = contentSecurityPolicy(nonce);
  if (isCacheablePageRequest(req)) {
    const cached = await cachedPage(req);
    if (cached) return pageResponse(cached, nonce, csp);
  }
  const requestHeaders = new Headers(req.headers);
  requestHeaders.set("x-nonce", nonce);
  requestHeaders.set("Content-Security-Policy", csp);
  const res = NextResponse.next({ request: { headers: requestHeaders } });
  res.headers.set("Content-Security-Policy", csp);
  return res;
}

export const config = {
  // API routes answer 401 themselves (and must not pass through the proxy: it caps body size);
  // static files and Next internals need no session.
  matcher: [
    {
      source: "/((?!api/|_next/static|_next/image|favicon|logo\\.svg|.*\\.(?:svg|png|webp|jpg|woff2)$).*)",
      missing: [
        { type: "header", key: "next-router-prefetch" },
        { type: "header", key: "purpose", value: "prefetch" },
      ],
    },
  ],
};
