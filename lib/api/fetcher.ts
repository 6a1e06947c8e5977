import type { ErrorBody, ErrorCode } from "@/lib/api/errors";

/** The API error shape turned into a typed error on the client. */
export class ApiError extends Error {
  readonly status: number;
  readonly code: ErrorCode | "network";
  readonly fields?: Record<string, string>;
  readonly body?: unknown;

  constructor(status: number, code: ErrorCode | "network", message: string, fields?: Record<string, string>, body?: unknown) {
    super(message);
    this.name = "ApiError";
    this.status = status;
    this.code = code;
    this.fields = fields;
    this.body = body;
  }
}

/** fetch for our own API: JSON in and out, and any non-2xx answer thrown as ApiError. */
export async function apiFetch<T>(path: string, init?: RequestInit & { json?: unknown }): Promise<T> {
  const { json, ...rest } = init ?? {};
  const headers = new Headers(rest.headers);
  if (json !== undefined) headers.set("Content-Type", "application/json");
  let res: Response;
  try {
    res = await fetch(path, { ...rest, headers, body: json !== undefined ? JSON.stringify(json) : rest.body, credentials: "same-origin" });
  } catch {
    throw new ApiError(0, "network", "Could not reach Plateroom. Check your connection and try again.");
  }
  const text = await res.text();
  let body: unknown = undefined;
  if (text) {
    try {
      body = JSON.parse(text);
    } catch {
      body = undefined;
    }
  }
  if (!res.ok) {
    const err = (body as ErrorBody | undefined)?.error;
    throw new ApiError(res.status, err?.code ?? "internal", err?.message ?? `Request failed (${res.status}).`, err?.fields, body);
  }
  return body as T;
}
