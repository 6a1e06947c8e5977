import "server-only";
import { hash, verify } from "@node-rs/argon2";

/**
 * argon2id with the OWASP Password Storage Cheat Sheet's first recommended setting:
 * m = 19 MiB, t = 2, p = 1.
 */
const PASSWORD_HASH_OPTIONS = {
  // Algorithm.Argon2id; the package exports a const enum, which verbatimModuleSyntax cannot read.
  algorithm: 2,
  memoryCost: 19 * 1024,
  timeCost: 2,
  parallelism: 1,
} as const;

export function hashPassword(password: string): Promise<string> {
  return hash(password, PASSWORD_HASH_OPTIONS);
}

// Verified against when the e-mail is unknown, so both paths cost one argon2 verification.
let dummyHash: Promise<string> | undefined;

export async function verifyPassword(storedHash: string | null | undefined, password: string): Promise<boolean> {
  if (!storedHash) {
    dummyHash ??= hashPassword("plateroom-timing-equaliser");
    await verify(await dummyHash, password).catch(() => false);
    return false;
  }
  return verify(storedHash, password).catch(() => false);
}
