import "server-only";
import crypto from "node:crypto";
import fs from "node:fs/promises";
import path from "node:path";
import { env } from "@/lib/env";
import type { StillVariant } from "@/lib/stills/schemas";

/**
 * Content-addressed file store under PLATEROOM_UPLOADS_DIR (outside the web root; OWASP
 * File Upload Cheat Sheet, "rename on store"):
 *   originals/ab/<sha256>.bin   the uploaded bytes less identifying metadata (strip-metadata.ts; OpenEXR: lib/exr/rewrite.ts)
 *   previews/ab/<sha256>.webp   longest side ≤ 2048, metadata stripped
 *   thumbs/ab/<sha256>.webp     longest side ≤ 400, metadata stripped
 *   displays/ab/<sha256>.png    full resolution, 8-bit, for stills a browser cannot show as stored
 *   derived files of a still shown through the display transform carry a look:
 *   <sha256>.<look>.webp|png, the look naming its colour space and layer (lib/stills/display.ts)
 *   tmp/                        uploads being received (same filesystem, so rename is atomic)
 * Every function takes the root as a parameter (tests use a temporary folder).
 */

export const PREVIEW_MAX = 2048;
export const THUMB_MAX = 400;
const SHA_RE = /^[0-9a-f]{64}$/;

export function uploadsRoot(root?: string): string {
  return path.resolve(root ?? env.PLATEROOM_UPLOADS_DIR);
}

function assertSha(sha: string): void {
  // The hash becomes a path: anything but 64 hex digits is refused before it nears the disk.
  if (!SHA_RE.test(sha)) throw new Error("Not a sha256 hex digest.");
}

const LOOK_RE = /^[a-z0-9-]{1,80}$/;

/** `look`: empty for stills shown as stored; otherwise a short name of how they are shown. */
export function variantPath(sha: string, variant: StillVariant, root?: string, look = ""): string {
  assertSha(sha);
  if (look && !LOOK_RE.test(look)) throw new Error("Not a look name.");
  const base = uploadsRoot(root);
  const shard = sha.slice(0, 2);
  if (variant === "original") return path.join(base, "originals", shard, `${sha}.bin`);
  const name = look ? `${sha}.${look}` : sha;
  if (variant === "display") return path.join(base, "displays", shard, `${name}.png`);
  return path.join(base, variant === "preview" ? "previews" : "thumbs", shard, `${name}.webp`);
}

function incomingDir(root?: string): string {
  return path.join(uploadsRoot(root), "tmp");
}

/** A fresh path for a file being received; the caller creates it with flag "wx". */
export async function newIncomingPath(root?: string): Promise<string> {
  const dir = incomingDir(root);
  await fs.mkdir(dir, { recursive: true, mode: 0o700 });
  return path.join(dir, `upload-${crypto.randomUUID()}.part`);
}

async function fsyncPath(p: string): Promise<void> {
  const fh = await fs.open(p, "r");
  try {
    await fh.sync();
  } catch (error) {
    // Some filesystems refuse fsync on a directory (EINVAL/EISDIR); the rename still stands.
    if (!isCode(error, "EINVAL", "EISDIR", "EBADF", "EPERM")) throw error;
  } finally {
    await fh.close();
  }
}

export function isCode(error: unknown, ...codes: string[]): boolean {
  return typeof error === "object" && error !== null && codes.includes((error as { code?: string }).code ?? "");
}

export async function exists(p: string): Promise<boolean> {
  try {
    await fs.access(p);
    return true;
  } catch {
    return false;
  }
}

/** Writes bytes atomically: a temp file in the target's own folder, fsync, rename, fsync the folder. */
export async function writeFileAtomic(target: string, data: Uint8Array): Promise<void> {
  const dir = path.dirname(target);
  await fs.mkdir(dir, { recursive: true, mode: 0o700 });
  const temp = path.join(dir, `.${path.basename(target)}.${crypto.randomUUID()}.tmp`);
  const fh = await fs.open(temp, "wx", 0o600);
  try {
    await fh.writeFile(data);
    await fh.sync();
  } finally {
    await fh.close();
  }
  try {
    await fs.rename(temp, target);
  } catch (error) {
    await fs.rm(temp, { force: true });
    throw error;
  }
  await fsyncPath(dir);
}

/**
 * Moves a fully received (and fsynced) upload to its content address. Identical content may
 * already be there, or arrive in parallel: renaming over it is harmless because the bytes
 * are the same. Returns whether this call put the file in place. The existing file's time is
 * refreshed so the sweeper's grace period covers the row about to point at it.
 */
export async function storeOriginal(incoming: string, sha: string, root?: string): Promise<{ created: boolean }> {
  const target = variantPath(sha, "original", root);
  if (await exists(target)) {
    const now = new Date();
    await fs.utimes(target, now, now).catch(() => undefined);
    await fs.rm(incoming, { force: true });
    return { created: false };
  }
  const dir = path.dirname(target);
  await fs.mkdir(dir, { recursive: true, mode: 0o700 });
  await fsyncPath(incoming);
  await fs.rename(incoming, target);
  await fsyncPath(dir);
  return { created: true };
}


/**
 * Removes the original and derived files of one hash — plain and under `look` (callers first
 * check no row refers to the hash, so no other look of it can be in use).
 */
export async function removeStored(sha: string, root?: string, look = ""): Promise<void> {
  const files = [variantPath(sha, "original", root)];
  for (const variant of ["preview", "thumb", "display"] as const) {
    files.push(variantPath(sha, variant, root));
    if (look) files.push(variantPath(sha, variant, root, look));
  }
  await Promise.all(files.map((f) => fs.rm(f, { force: true })));
}
