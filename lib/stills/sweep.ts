import "server-only";
import fs from "node:fs/promises";
import path from "node:path";
import { referencedHashes } from "@/lib/stills/queries";
import { isCode, uploadsRoot } from "@/lib/stills/storage";

/*
 * Kept apart from lib/stills/storage.ts, which routes import: walking the whole uploads folder
 * is the maintenance script's job, and a route that could reach it would make the build trace
 * the whole project.
 */

/** Files younger than this are never swept: an upload may be between its file and its row. */
export const SWEEP_GRACE_MS = 60 * 60 * 1000;

/**
 * Removes stored files no still row references, and stale temp files, under the uploads
 * folder (`npm run uploads:sweep`). `remove: false` only lists them.
 */
export function sweepUploads(options: { root?: string; graceMs?: number; now?: number; remove?: boolean } = {}): Promise<SweepResult> {
  return sweepOrphans({ ...options, referenced: referencedHashes });
}

export type SweepResult = { removed: string[]; kept: number };

/**
 * Deletes stored files whose hash no still row references, and stale temp files, when older
 * than the grace period (an upload in flight has its file before its row). `referenced`
 * gets the hashes found and returns those still in use.
 */
async function sweepOrphans(options: {
  root?: string;
  referenced: (hashes: string[]) => Promise<Set<string>>;
  graceMs?: number;
  now?: number;
  /** false lists what would go without deleting it. */
  remove?: boolean;
}): Promise<SweepResult> {
  const base = uploadsRoot(options.root);
  const cutoff = (options.now ?? Date.now()) - (options.graceMs ?? SWEEP_GRACE_MS);
  const files: { file: string; sha: string | null; mtime: number }[] = [];
  for (const folder of ["originals", "previews", "thumbs"]) {
    for (const shard of await listDir(path.join(base, folder))) {
      for (const name of await listDir(path.join(base, folder, shard))) {
        const file = path.join(base, folder, shard, name);
        const stat = await fs.stat(file).catch(() => null);
        if (!stat?.isFile()) continue;
        const match = /^([0-9a-f]{64})\.(bin|webp)$/.exec(name);
        files.push({ file, sha: match?.[1] ?? null, mtime: stat.mtimeMs });
      }
    }
  }
  for (const name of await listDir(path.join(base, "tmp"))) {
    const file = path.join(base, "tmp", name);
    const stat = await fs.stat(file).catch(() => null);
    if (stat?.isFile()) files.push({ file, sha: null, mtime: stat.mtimeMs });
  }
  const hashes = [...new Set(files.map((f) => f.sha).filter((s): s is string => s !== null))];
  const inUse = hashes.length ? await options.referenced(hashes) : new Set<string>();
  const removed: string[] = [];
  let kept = 0;
  for (const f of files) {
    const orphan = f.sha === null || !inUse.has(f.sha);
    if (orphan && f.mtime < cutoff) {
      if (options.remove !== false) await fs.rm(f.file, { force: true });
      removed.push(path.relative(base, f.file));
    } else kept++;
  }
  return { removed, kept };
}

async function listDir(dir: string): Promise<string[]> {
  try {
    return await fs.readdir(dir);
  } catch (error) {
    if (isCode(error, "ENOENT")) return [];
    throw error;
  }
}
