import crypto from "node:crypto";
import sharp from "sharp";

/**
 * Talks to a running Plateroom the way a pipeline script does (README "HTTP API"): signs in
 * through Auth.js's credentials endpoint, then uses a personal API token. Shared by the
 * reliability e2e tests and the load benchmark.
 */

function cookiesFrom(res: Response): string[] {
  return res.headers.getSetCookie().map((c) => c.split(";")[0] ?? "").filter(Boolean);
}

/** Signs in with e-mail and password; returns the Cookie header value of the session. */
export async function signInCookie(baseUrl: string, email: string, password: string): Promise<string> {
  const csrfRes = await fetch(`${baseUrl}/api/auth/csrf`);
  if (!csrfRes.ok) throw new Error(`GET /api/auth/csrf answered ${csrfRes.status}`);
  const { csrfToken } = (await csrfRes.json()) as { csrfToken: string };
  const jar = cookiesFrom(csrfRes);
  const res = await fetch(`${baseUrl}/api/auth/callback/credentials`, {
    method: "POST",
    redirect: "manual",
    headers: { "content-type": "application/x-www-form-urlencoded", cookie: jar.join("; ") },
    body: new URLSearchParams({ csrfToken, email, password, callbackUrl: `${baseUrl}/` }).toString(),
  });
  const session = cookiesFrom(res).find((c) => /authjs\.session-token=/.test(c) && !/=$/.test(c));
  if (!session) throw new Error(`Sign-in as ${email} gave no session cookie (status ${res.status}).`);
  return session;
}

/** Signs in and creates a personal API token; returns the bearer token. */
export async function createApiToken(baseUrl: string, email: string, password: string, name = "reliability script"): Promise<string> {
  const cookie = await signInCookie(baseUrl, email, password);
  const res = await fetch(`${baseUrl}/api/tokens`, {
    method: "POST",
    headers: { "content-type": "application/json", cookie },
    body: JSON.stringify({ name }),
  });
  if (res.status !== 201) throw new Error(`POST /api/tokens answered ${res.status}: ${await res.text()}`);
  const { token } = (await res.json()) as { token: string };
  return token;
}

export type Api = {
  get(path: string): Promise<Response>;
  json<T = unknown>(method: string, path: string, body?: unknown): Promise<{ status: number; body: T }>;
  upload(png: Uint8Array, fields: Record<string, string>): Promise<{ status: number; body: { id?: string; sha256?: string; error?: unknown } }>;
};

/** A small client with a bearer token. */
export function apiClient(baseUrl: string, token: string): Api {
  const auth = { authorization: `Bearer ${token}` };
  return {
    get: (path) => fetch(`${baseUrl}${path}`, { headers: auth }),
    async json(method, path, body) {
      const res = await fetch(`${baseUrl}${path}`, {
        method,
        headers: { ...auth, ...(body === undefined ? {} : { "content-type": "application/json" }) },
        body: body === undefined ? undefined : JSON.stringify(body),
      });
      const text = await res.text();
      return { status: res.status, body: (text ? JSON.parse(text) : null) as never };
    },
    async upload(png, fields) {
      const form = new FormData();
      for (const [k, v] of Object.entries(fields)) form.append(k, v);
      form.append("file", new Blob([new Uint8Array(png)], { type: "image/png" }), "still.png");
      const res = await fetch(`${baseUrl}/api/stills`, { method: "POST", headers: auth, body: form });
      const text = await res.text();
      return { status: res.status, body: (text ? JSON.parse(text) : {}) as never };
    },
  };
}

/** A small RGB PNG of random pixels: every call gives different content (and so a different sha256). */
export async function randomPng(width = 16, height = 12): Promise<Buffer> {
  return sharp(crypto.randomBytes(width * height * 3), { raw: { width, height, channels: 3 } }).png().toBuffer();
}

export const sha256 = (bytes: Uint8Array): string => crypto.createHash("sha256").update(bytes).digest("hex");
