import "server-only";
import { LRUCache } from "lru-cache";
import type { NextRequest } from "next/server";
import { userAndChangeStampFromRequest } from "@/lib/auth/session";
import { env, internalBaseUrl } from "@/lib/env";
import { CACHE_STATUS_HEADER, RENDER_HEADER } from "@/lib/page-cache/headers";
import { THEME_COOKIE } from "@/lib/theme";

/**
 * Rendered technique pages, kept per person so a reload or a link from mail is answered without
 * rendering again. A page is rendered the normal way (the proxy asks this instance for it with
 * RENDER_HEADER) and kept under the database's change stamp, the person, their role and theme:
 * any change to what pages show, by any instance, raises the stamp and retires every copy. The
 * session is checked on every request before the cache is read (lib/auth/session.ts).
 */

// Relative times on a page ("5 minutes ago") stay close to true.
const MAX_AGE_MS = 60_000;
const MAX_BYTES = 64 * 1024 * 1024;
const RENDER_TIMEOUT_MS = 20_000;
const TECHNIQUE_PAGE = /^\/techniques\/(?!new$)[a-z0-9][a-z0-9-]*$/;

// The nonce and its policy are made fresh for every answer; transport headers belong to each answer.
const NOT_KEPT = new Set(["content-security-policy", "set-cookie", "content-length", "content-encoding", "transfer-encoding", "connection", "keep-alive", "date"]);

/** The page's bytes cut where the render's nonce stood, so each answer joins them around its own. */
type RenderedPage = { pieces: Buffer[]; size: number; headers: [string, string][] };
type RenderContext = { path: string; cookie: string };

let renderFailureLogged = false;

async function render({ path, cookie }: RenderContext): Promise<RenderedPage | undefined> {
  const res = await fetch(new URL(path, internalBaseUrl()), {
    headers: { cookie, accept: "text/html", "accept-encoding": "identity", [RENDER_HEADER]: "1" },
    redirect: "manual",
    signal: AbortSignal.timeout(RENDER_TIMEOUT_MS),
  }).catch((error: unknown) => {
    if (!renderFailureLogged) console.warn(`[plateroom] page cache: cannot reach this instance at ${internalBaseUrl()} (set PLATEROOM_INTERNAL_URL); pages render uncached.`, error);
    renderFailureLogged = true;
    return null;
  });
  if (!res) return undefined;
  const html = await res.text();
  const nonce = /'nonce-([^']+)'/.exec(res.headers.get("content-security-policy") ?? "")?.[1];
  // Only a plain successful page is kept; redirects, errors and anything setting a cookie render every time.
  if (res.status !== 200 || !nonce || res.headers.has("set-cookie") || !res.headers.get("content-type")?.startsWith("text/html")) return undefined;
  const headers = [...res.headers].filter(([name]) => !NOT_KEPT.has(name) && name !== CACHE_STATUS_HEADER);
  const pieces = html.split(nonce).map((piece) => Buffer.from(piece));
  return { pieces, size: pieces.reduce((sum, piece) => sum + piece.length, 0), headers };
}

const pages = new LRUCache<string, RenderedPage, RenderContext>({
  maxSize: MAX_BYTES,
  sizeCalculation: (page) => page.size + 1024,
  ttl: MAX_AGE_MS,
  // Concurrent requests for the same key share one render.
  fetchMethod: (_key, _stale, { context }) => render(context),
});

/**
 * A browser loading a technique page as a document (typed address, reload, link from mail).
 * Next.js strips its RSC headers before the proxy sees a request, so client navigations and
 * `router.refresh()` are told apart by the Fetch Metadata headers browsers send (W3C Fetch
 * Metadata Request Headers): only a navigation to a document may be answered with cached HTML.
 */
export function isCacheablePageRequest(req: NextRequest): boolean {
  return (
    // In development a reload must show the edited code.
    env.NODE_ENV === "production" &&
    req.method === "GET" &&
    req.headers.get("sec-fetch-dest") === "document" &&
    TECHNIQUE_PAGE.test(req.nextUrl.pathname) &&
    !req.headers.has(RENDER_HEADER)
  );
}

/** The rendered page for this person, rendering it first when there is no current copy; undefined when it cannot be kept. */
export async function cachedPage(req: NextRequest): Promise<{ page: RenderedPage; hit: boolean } | undefined> {
  const session = await userAndChangeStampFromRequest(req);
  if (!session) return undefined;
  const { user, changeStamp: stamp } = session;
  const theme = req.cookies.get(THEME_COOKIE)?.value === "light" ? "light" : "dark";
  const path = req.nextUrl.pathname + req.nextUrl.search;
  const key = JSON.stringify([stamp, user.id, user.role, theme, path]);
  const hit = pages.has(key);
  try {
    const page = await pages.fetch(key, { context: { path, cookie: req.headers.get("cookie") ?? "" } });
    return page ? { page, hit } : undefined;
  } catch (error) {
    console.warn("[plateroom] page cache: render failed; rendering uncached.", error);
    return undefined;
  }
}

/** The kept page with this answer's own nonce in every place the rendered one stood. */
export function pageResponse({ page, hit }: { page: RenderedPage; hit: boolean }, nonce: string, csp: string): Response {
  const headers = new Headers(page.headers);
  headers.set("content-security-policy", csp);
  headers.set(CACHE_STATUS_HEADER, hit ? "hit" : "rendered");
  const nonceBytes = Buffer.from(nonce);
  const body = Buffer.concat(page.pieces.flatMap((piece, i) => (i === 0 ? [piece] : [nonceBytes, piece])));
  return new Response(body, { status: 200, headers });
}
