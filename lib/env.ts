import "server-only";
import net from "node:net";
import { z } from "zod";

/** "10.0.0.0/8", "192.0.2.7", "::1", "fd00::/8": an address or a CIDR range. */
function isAddressOrRange(entry: string): boolean {
  const [address, bits, extra] = entry.split("/");
  const family = net.isIP(address ?? "");
  if (!family || extra !== undefined) return false;
  if (bits === undefined) return true;
  const n = Number(bits);
  return /^\d+$/.test(bits) && n >= 0 && n <= (family === 4 ? 32 : 128);
}

/**
 * The only reader of process.env. Every variable has a working default for the demo;
 * AUTH_SECRET is the exception in production (see lib/auth/secret.ts).
 */
const envSchema = z.object({
  NODE_ENV: z.enum(["development", "production", "test"]).default("development"),
  PORT: z.coerce.number().int().min(1).max(65535).default(3000),
  PLATEROOM_DATA_DIR: z.string().min(1).default("./.data"),
  PLATEROOM_UPLOADS_DIR: z.string().min(1).default("./uploads"),
  DATABASE_URL: z.string().url().optional(),
  SMTP_URL: z.string().default("smtp://127.0.0.1:2525"),
  AUTH_SECRET: z.string().min(32, "AUTH_SECRET must be at least 32 characters").optional(),
  /** Public address used in links inside mail. */
  PLATEROOM_BASE_URL: z.string().url().optional(),
  PLATEROOM_MAX_UPLOAD_BYTES: z.coerce.number().int().positive().default(80 * 1024 * 1024),
  PLATEROOM_MAIL_FROM: z.string().default("Plateroom <plateroom@kestrel.test>"),
  PLATEROOM_DIGEST_HOUR: z.coerce.number().int().min(0).max(23).default(7),
  /** Where this instance reaches itself to render a page for the page cache (lib/page-cache). */
  PLATEROOM_INTERNAL_URL: z.string().url().optional(),
  /**
   * Reverse proxies in front of the app, as addresses or CIDR ranges, comma-separated. Only a
   * request arriving from one of them may name its client in X-Forwarded-For; otherwise the
   * client is the connection's own address (lib/auth/client-address.ts).
   */
  PLATEROOM_TRUSTED_PROXIES: z
    .string()
    .default("")
    .transform((v) => v.split(",").map((s) => s.trim()).filter(Boolean))
    .refine((list) => list.every(isAddressOrRange), "PLATEROOM_TRUSTED_PROXIES: list IP addresses or CIDR ranges, comma-separated"),
  /** Set by the demo and tests to start the in-process mail sender loop. */
  PLATEROOM_MAIL_SENDER: z.enum(["on", "off"]).default("on"),
});

type Env = z.infer<typeof envSchema>;

function readEnv(): Env {
  if (process.env.SKIP_ENV_VALIDATION) return envSchema.parse({});
  const parsed = envSchema.safeParse(process.env);
  if (!parsed.success) {
    const problems = parsed.error.issues.map((i) => `${i.path.join(".")}: ${i.message}`).join("; ");
    throw new Error(`Invalid configuration: ${problems}`);
  }
  return parsed.data;
}

export const env: Env = readEnv();

/** The public address people use; links in mail start with it, and writes must come from its origin. */
export function baseUrl(): string {
  // Read at call time without a configured address: `next start -p N` sets PORT only once it listens.
  return (env.PLATEROOM_BASE_URL ?? `http://localhost:${process.env.PORT ?? env.PORT}`).replace(/\/+$/, "");
}

/** The app's own origin (RFC 6454 §4: scheme, host and port), from PLATEROOM_BASE_URL. */
export function appOrigin(): string {
  return new URL(baseUrl()).origin;
}

/**
 * This instance's own address. Read at call time: `next start -p N` sets PORT only once it
 * listens. Never taken from a request's Host header, which a caller controls.
 */
export function internalBaseUrl(): string {
  return env.PLATEROOM_INTERNAL_URL ?? `http://127.0.0.1:${process.env.PORT ?? env.PORT}`;
}
