import "server-only";
import crypto from "node:crypto";

/** A random secret shown once, and the hash that is stored in its place. */
export function newSecretToken(prefix: string): { token: string; hash: string } {
  const token = `${prefix}_${crypto.randomBytes(32).toString("base64url")}`;
  return { token, hash: hashToken(token) };
}

export function hashToken(token: string): string {
  return crypto.createHash("sha256").update(token).digest("hex");
}
