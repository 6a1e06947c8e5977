import "server-only";
import crypto from "node:crypto";
import fs from "node:fs";
import path from "node:path";
import { env } from "@/lib/env";

let cached: string | undefined;

/**
 * AUTH_SECRET signs session cookies and unsubscribe links. Production refuses to run
 * without it; elsewhere one is generated once and kept in the data folder, so a demo
 * needs no set-up and sessions survive restarts.
 */
export function authSecret(): string {
  if (cached) return cached;
  if (env.AUTH_SECRET) return (cached = env.AUTH_SECRET);
  if (env.NODE_ENV === "production") {
    throw new Error("AUTH_SECRET is required in production (32+ random characters). `npm run demo` sets one for you.");
  }
  cached = readOrCreateSecret(env.PLATEROOM_DATA_DIR);
  return cached;
}

function readOrCreateSecret(dataDir: string): string {
  const file = path.resolve(dataDir, "auth-secret");
  try {
    return fs.readFileSync(file, "utf8").trim();
  } catch {
    fs.mkdirSync(path.dirname(file), { recursive: true });
    const secret = crypto.randomBytes(32).toString("base64url");
    fs.writeFileSync(file, secret, { mode: 0o600 });
    return secret;
  }
}
