import "server-only";
import { z } from "zod";
import { AppError, validationError, type ErrorBody } from "@/lib/api/errors";

type RouteContext<P> = { params: Promise<P> };
type Handler<P> = (req: Request, ctx: RouteContext<P>) => Promise<Response>;

/**
 * Wraps a route handler so every failure leaves as the API error shape (shared/API.md):
 * AppError with its status, anything else logged and answered with a generic 500.
 * Never a stack trace, never an HTML error page.
 */
export function apiRoute<P = Record<string, never>>(handler: Handler<P>): Handler<P> {
  return async (req, ctx) => {
    try {
      refuseCrossSite(req);
      const res = await handler(req, ctx);
      return withApiHeaders(res);
    } catch (error) {
      return errorResponse(error);
    }
  };
}

const SAFE_METHODS = new Set(["GET", "HEAD", "OPTIONS"]);

/**
 * Browsers send Origin on cross-site writes; a write whose Origin is not this site is refused,
 * so a page elsewhere cannot use a signed-in person's cookie (OWASP CSRF Prevention Cheat Sheet,
 * verifying origin with standard headers). Scripts with a token send no Origin.
 */
export function refuseCrossSite(req: Request): void {
  if (SAFE_METHODS.has(req.method)) return;
  const origin = req.headers.get("origin");
  if (!origin) return;
  const host = req.headers.get("x-forwarded-host") ?? req.headers.get("host") ?? new URL(req.url).host;
  let originHost: string;
  try {
    originHost = new URL(origin).host;
  } catch {
    throw new AppError("forbidden", "Cross-site requests are refused.");
  }
  if (originHost !== host) throw new AppError("forbidden", "Cross-site requests are refused.");
}

export function errorResponse(error: unknown): Response {
  if (error instanceof AppError) {
    if (error.cause) console.error(`[api] ${error.code}:`, error.cause);
    return json(error.toBody(), error.status, error.code === "rate_limited" ? { "Retry-After": "60" } : undefined);
  }
  if (error instanceof z.ZodError) return json(validationError(error).toBody(), 400);
  // PostgreSQL refuses U+0000 in text and jsonb (SQLSTATE 22021, 22P05): bad input, not a server fault.
  const pgCode = (error as { cause?: { code?: unknown } } | null)?.cause?.code;
  if (pgCode === "22021" || pgCode === "22P05") return json(new AppError("validation_failed", "Text may not contain NUL (U+0000) characters.").toBody(), 400);
  console.error("[api] unexpected error:", error);
  return json(new AppError("internal").toBody(), 500);
}

function json(body: ErrorBody, status: number, extra?: Record<string, string>): Response {
  return withApiHeaders(Response.json(body, { status, headers: extra }));
}

function withApiHeaders(res: Response): Response {
  // API answers are per-person and often confidential: never cached by shared caches.
  if (!res.headers.has("Cache-Control")) res.headers.set("Cache-Control", "private, no-store");
  res.headers.set("X-Content-Type-Options", "nosniff");
  return res;
}

/** Reads and validates a JSON body; malformed JSON and wrong shapes are 400 with field messages. */
export async function parseJson<S extends z.ZodType>(req: Request, schema: S): Promise<z.infer<S>> {
  const type = req.headers.get("content-type") ?? "";
  if (type && !type.includes("json")) throw new AppError("unsupported_type", "Send JSON (Content-Type: application/json).");
  let raw: unknown;
  try {
    const text = await req.text();
    raw = text.length ? JSON.parse(text) : undefined;
  } catch {
    throw new AppError("validation_failed", "The body is not valid JSON.");
  }
  return parseWith(schema, raw);
}

export function parseWith<S extends z.ZodType>(schema: S, raw: unknown): z.infer<S> {
  const result = schema.safeParse(raw);
  if (!result.success) throw validationError(result.error);
  return result.data;
}

/** Query-string parameters as a plain object for zod; repeated keys become arrays. */
export function searchParamsOf(req: Request): Record<string, string | string[]> {
  const out: Record<string, string | string[]> = {};
  for (const [k, v] of new URL(req.url).searchParams) {
    const prev = out[k];
    out[k] = prev === undefined ? v : Array.isArray(prev) ? [...prev, v] : [prev, v];
  }
  return out;
}

export const uuidParam = z.string().uuid("Not a valid id.");
