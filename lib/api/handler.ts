import "server-only";
import { z } from "zod";
import { BODY_LIMITS, describeBytes } from "@/lib/api/body-limits";
import { AppError, validationError, type ErrorBody } from "@/lib/api/errors";
import { crossOriginWriteReason } from "@/lib/api/origin";
import { assertCan, type Permission } from "@/lib/auth/permissions";
import type { SessionUser } from "@/lib/auth/roles";
import { requireUser } from "@/lib/auth/session";

/*
 * The route wrapper. Every app/api/**\/route.ts is
 *
 *   export const GET = authedRoute<{ id: string }>(async (req, { user, params }) => Response.json(await getThing(user, params.id)));
 *   export const PUT = authedRoute<{ id: string }>("thing:write", async (req, { user, params, json }) => {
 *     const input = await json(thingSchema);
 *     return Response.json(await updateThing(user, params.id, input));
 *   });
 *   export const { HEAD, OPTIONS, POST, PATCH, DELETE } = otherMethods({ GET, PUT });
 *
 * `authedRoute` resolves the signed-in person (token or session cookie) before the handler runs,
 * so a handler cannot forget to; `publicRoute` is the explicit exception (health, sign-in,
 * unsubscribe, unknown paths). `otherMethods` answers the methods a file does not declare.
 */

const DECLARABLE = ["GET", "POST", "PUT", "PATCH", "DELETE"] as const;
type Declarable = (typeof DECLARABLE)[number];
const ROUTE_METHODS = ["GET", "HEAD", "OPTIONS", "POST", "PUT", "PATCH", "DELETE"] as const;
type RouteMethod = (typeof ROUTE_METHODS)[number];

/** What Next.js passes a route handler besides the request. */
type RouteContext<P> = { params: Promise<P> };
// The context is optional for callers (tests, the catch-all); Next.js always passes it.
type RouteHandler<P = Record<string, never>> = (req: Request, ctx?: RouteContext<P>) => Promise<Response>;

/** The request body, read only when asked for and never past the route's limit. */
type BodyReaders = {
  /** The JSON body validated by `schema`: 415 for another content type, 400 for bad JSON or shape, 413 when too large. */
  json<S extends z.ZodType>(schema: S): Promise<z.infer<S>>;
  /** The body as UTF-8 text (e.g. a CSV upload). */
  text(): Promise<string>;
  /** A urlencoded or multipart form body. */
  form(): Promise<FormData>;
  /** The raw bytes. */
  bytes(): Promise<Uint8Array<ArrayBuffer>>;
};
type PublicContext<P> = BodyReaders & { params: P };
type AuthedContext<P> = PublicContext<P> & { user: SessionUser };

type RouteOptions = {
  /** Checked after sign-in and before the body is read: a role that may not act gets 403, never field errors. */
  permission?: Permission;
  /** Bytes of body this route reads at most (lib/api/body-limits.ts); default BODY_LIMITS.json. */
  bodyLimit?: number;
};

type Options = Permission | RouteOptions;
const optionsOf = (o: Options | undefined): RouteOptions => (typeof o === "string" ? { permission: o } : (o ?? {}));

/**
 * A route for signed-in people. Order: a cookie write from another origin is refused (403), the
 * person is resolved (401), `permission` is checked (403), a declared Content-Length over the
 * limit is refused (413); only then does the handler run and read the body.
 */
export function authedRoute<P = Record<string, never>>(handler: (req: Request, ctx: AuthedContext<P>) => Promise<Response>): RouteHandler<P>;
export function authedRoute<P = Record<string, never>>(options: Options, handler: (req: Request, ctx: AuthedContext<P>) => Promise<Response>): RouteHandler<P>;
export function authedRoute<P>(
  a: Options | ((req: Request, ctx: AuthedContext<P>) => Promise<Response>),
  b?: (req: Request, ctx: AuthedContext<P>) => Promise<Response>,
): RouteHandler<P> {
  const options = optionsOf(typeof a === "function" ? undefined : a);
  const handler = typeof a === "function" ? a : b!;
  return answered(async (req, ctx) => {
    const refusal = crossOriginWriteReason(req.method, req.headers);
    if (refusal) throw new AppError("forbidden", refusal);
    const user = await requireUser(req);
    if (options.permission) assertCan(user, options.permission);
    return handler(req, { ...(await prepared(req, ctx, options)), user });
  });
}

/**
 * A route anyone may call, signed in or not. Its own authority (a signed token, Auth.js's CSRF
 * token) or none at all (health, unknown paths) — say which in the route file.
 */
export function publicRoute<P = Record<string, never>>(handler: (req: Request, ctx: PublicContext<P>) => Promise<Response>): RouteHandler<P>;
export function publicRoute<P = Record<string, never>>(options: RouteOptions, handler: (req: Request, ctx: PublicContext<P>) => Promise<Response>): RouteHandler<P>;
export function publicRoute<P>(
  a: RouteOptions | ((req: Request, ctx: PublicContext<P>) => Promise<Response>),
  b?: (req: Request, ctx: PublicContext<P>) => Promise<Response>,
): RouteHandler<P> {
  const options = typeof a === "function" ? {} : a;
  const handler = typeof a === "function" ? a : b!;
  return answered(async (req, ctx) => handler(req, await prepared(req, ctx, options)));
}

type Declared = Partial<Record<Declarable, RouteHandler<never>>>;
type ParamsOf<D> = D[keyof D] extends RouteHandler<infer P> | undefined ? P : never;

/**
 * The methods a route file does not declare, made from the ones it does: HEAD runs GET and drops
 * the body; OPTIONS answers 204 with `Allow`; any other method answers 405 in the error shape
 * with `Allow` (RFC 9110 §15.5.6, §9.3.2, §9.3.7). Every route file ends with
 * `export const { …the rest… } = otherMethods({ GET, POST });` — naming a declared method
 * there does not compile, and tests/integration/security/route-table.test.ts fails for a file
 * that leaves one out (Next.js would answer it with an empty 405).
 */
export function otherMethods<D extends Declared>(declared: D): Omit<Record<RouteMethod, RouteHandler<ParamsOf<D>>>, keyof D> {
  type P = ParamsOf<D>;
  const has = declared as Partial<Record<Declarable, RouteHandler<P>>>;
  const allowed = ROUTE_METHODS.filter((m) => m === "OPTIONS" || (m === "HEAD" ? has.GET : has[m as Declarable]));
  const allow = allowed.join(", ");
  const usable = allowed.filter((m) => m !== "HEAD" && m !== "OPTIONS").join(" or ");
  const notAllowed: RouteHandler<P> = async (req) => {
    const error = new AppError("method_not_allowed", `${req.method} is not allowed here${usable ? `; use ${usable}` : ""}.`);
    const res = json(error.toBody(), 405, { Allow: allow });
    // A HEAD answer carries no content (RFC 9110 §9.3.2).
    return req.method === "HEAD" ? new Response(null, { status: 405, headers: res.headers }) : res;
  };
  const get = has.GET;
  const all: Record<RouteMethod, RouteHandler<P>> = {
    GET: notAllowed,
    HEAD: get
      ? async (req, ctx) => {
          const res = await get(req, ctx);
          // The same status and headers as GET, without the content (RFC 9110 §9.3.2).
          await res.body?.cancel();
          return new Response(null, { status: res.status, statusText: res.statusText, headers: res.headers });
        }
      : notAllowed,
    OPTIONS: async () => withApiHeaders(new Response(null, { status: 204, headers: { Allow: allow } })),
    POST: notAllowed,
    PUT: notAllowed,
    PATCH: notAllowed,
    DELETE: notAllowed,
  };
  for (const m of DECLARABLE) if (has[m]) delete (all as Partial<typeof all>)[m];
  return all;
}

/** Every failure leaves as the API error shape: AppError with its status, anything else a logged, generic 500. */
function answered<P>(run: RouteHandler<P>): RouteHandler<P> {
  return async (req, ctx) => {
    try {
      return withApiHeaders(await run(req, ctx));
    } catch (error) {
      return errorResponse(error);
    }
  };
}

async function prepared<P>(req: Request, ctx: RouteContext<P> | undefined, options: RouteOptions): Promise<PublicContext<P>> {
  const limit = options.bodyLimit ?? BODY_LIMITS.json;
  refuseDeclaredTooLarge(req, limit);
  const params = ((await ctx?.params) ?? {}) as P;
  return {
    params,
    json: (schema) => readJson(req, schema, limit),
    text: async () => new TextDecoder().decode(await readBody(req, limit)),
    form: async () => readForm(req, limit),
    bytes: () => readBody(req, limit),
  };
}

function tooLarge(limit: number): AppError {
  return new AppError("too_large", `The request body is larger than ${describeBytes(limit)}, the most this endpoint accepts.`);
}

function refuseDeclaredTooLarge(req: Request, limit: number): void {
  const declared = Number(req.headers.get("content-length") ?? NaN);
  if (Number.isFinite(declared) && declared > limit) throw tooLarge(limit);
}

/**
 * The body, counted while it streams in: the moment it passes `limit` the stream is cancelled
 * and 413 thrown, so an oversized body is never held in memory (issue 19: 300 MB bodies were).
 */
async function readBody(req: Request, limit: number): Promise<Uint8Array<ArrayBuffer>> {
  refuseDeclaredTooLarge(req, limit);
  if (!req.body) return new Uint8Array();
  const reader = req.body.getReader();
  const chunks: Uint8Array<ArrayBuffer>[] = [];
  let total = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    total += value.byteLength;
    if (total > limit) {
      void reader.cancel().catch(() => undefined);
      throw tooLarge(limit);
    }
    chunks.push(value as Uint8Array<ArrayBuffer>);
  }
  if (chunks.length === 1) return chunks[0]!;
  const out = new Uint8Array(total);
  let at = 0;
  for (const chunk of chunks) {
    out.set(chunk, at);
    at += chunk.byteLength;
  }
  return out;
}

/** Reads (up to `limit` bytes) and validates a JSON body; malformed JSON and wrong shapes are 400 with field messages. */
async function readJson<S extends z.ZodType>(req: Request, schema: S, limit: number = BODY_LIMITS.json): Promise<z.infer<S>> {
  const type = req.headers.get("content-type") ?? "";
  if (type && !type.includes("json")) throw new AppError("unsupported_type", "Send JSON (Content-Type: application/json).");
  const text = new TextDecoder().decode(await readBody(req, limit));
  let raw: unknown;
  try {
    raw = text.length ? JSON.parse(text) : undefined;
  } catch {
    throw new AppError("validation_failed", "The body is not valid JSON.");
  }
  return parseWith(schema, raw);
}

async function readForm(req: Request, limit: number): Promise<FormData> {
  const bytes = await readBody(req, limit);
  try {
    return await new Response(bytes, { headers: { "Content-Type": req.headers.get("content-type") ?? "" } }).formData();
  } catch {
    throw new AppError("bad_request", "The form body could not be read.");
  }
}

function errorResponse(error: unknown): Response {
  if (error instanceof AppError) {
    if (error.cause) console.error(`[api] ${error.code}:`, error.cause);
    const headers: Record<string, string> = {};
    if (error.code === "rate_limited") headers["Retry-After"] = String(error.retryAfterSeconds ?? 60);
    // The rest of an oversized body is not worth reading (RFC 9110 §15.5.14: the server may close the connection).
    if (error.code === "too_large") headers.Connection = "close";
    return json(error.toBody(), error.status, headers);
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
  // Some answers (Response.redirect, a fetched Response) have immutable headers: copy those.
  let out = res;
  try {
    out.headers.set("X-Content-Type-Options", "nosniff");
  } catch {
    out = new Response(res.body, { status: res.status, statusText: res.statusText, headers: res.headers });
    out.headers.set("X-Content-Type-Options", "nosniff");
  }
  // API answers are per-person and often confidential: never cached by shared caches.
  if (!out.headers.has("Cache-Control")) out.headers.set("Cache-Control", "private, no-store");
  return out;
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
