import "server-only";
import crypto from "node:crypto";
import fs from "node:fs/promises";
import path from "node:path";
import sharp from "sharp";
import { env } from "@/lib/env";
import { PIXEL_LIMIT } from "@/lib/stills/inspect";
import type { StillVariant } from "@/lib/stills/schemas";

/**
 * Content-addressed file store under PLATEROOM_UPLOADS_DIR (outside the web root; OWASP
 * File Upload Cheat Sheet, "rename on store"):
 *   originals/ab/<sha256>.bin   the uploaded bytes less identifying metadata (strip-metadata.ts)
 *   previews/ab/<sha256>.webp   longest side ≤ 2048, metadata stripped
 *   thumbs/ab/<sha256>.webp     longest side ≤ 400, metadata stripped
 *   tmp/                        uploads being received (same filesystem, so rename is atomic)
 * Every function takes the root as a parameter (tests use a temporary folder).
 */

const PREVIEW_MAX = 2048;
const THUMB_MAX = 400;
const SHA_RE = /^[0-9a-f]{64}$/;

export function uploadsRoot(root?: string): string {
  return path.resolve(root ?? env.PLATEROOM_UPLOADS_DIR);
}

function assertSha(sha: string): void {
  // The hash becomes a path: anything but 64 hex digits is refused before it nears the disk.
  if (!SHA_RE.test(sha)) throw new Error("Not a sha256 hex digest.");
}

export function variantPath(sha: string, variant: StillVariant, root?: string): string {
  assertSha(sha);
  const base = uploadsRoot(root);
  const shard = sha.slice(0, 2);
  if (variant === "original") return path.join(base, "originals", shard, `${sha}.bin`);
  return path.join(base, variant === "preview" ? "previews" : "thumbs", shard, `${sha}.webp`);
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
async function writeFileAtomic(target: string, data: Uint8Array): Promise<void> {
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
 * Makes the preview and thumbnail once (skipped when present). sharp writes no metadata
 * unless asked (withMetadata/keepMetadata), so EXIF, XMP and ICC profiles are dropped; the
 * pixels are converted to sRGB for display. Orientation tags are not applied, so preview
 * pixels line up with the stored original the lab and the pixel probe read.
 */
export async function ensureDerived(sha: string, root?: string): Promise<void> {
  const original = variantPath(sha, "original", root);
  for (const [variant, max] of [
    ["preview", PREVIEW_MAX],
    ["thumb", THUMB_MAX],
  ] as const) {
    const target = variantPath(sha, variant, root);
    if (await exists(target)) continue;
    const data = await sharp(original, { limitInputPixels: PIXEL_LIMIT })
      .resize({ width: max, height: max, fit: "inside", withoutEnlargement: true })
      .webp({ quality: variant === "thumb" ? 80 : 90 })
      .toBuffer();
    await writeFileAtomic(target, data);
  }
}

/** Removes the original and derived files of one hash (callers first check no row refers to it). */
export async function removeStored(sha: string, root?: string): Promise<void> {
  await Promise.all((["original", "preview", "thumb"] as const).map((v) => fs.rm(variantPath(sha, v, root), { force: true })));
}
