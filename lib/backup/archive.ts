import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { PGlite } from "@electric-sql/pglite";
import * as tar from "tar";

/**
 * One archive holds everything Plateroom keeps: the embedded database as a PGlite data-folder
 * dump, and the uploads folder as it is on disk. Both folders must not be in use by a running
 * app (PGlite allows one process on a data folder).
 */
type BackupPaths = { dataDir: string; uploadsDir: string };
type BackupManifest = { format: "plateroom-backup"; version: 1; createdAt: string; database: "pglite"; files: number };

const MANIFEST = "manifest.json";
const DATABASE = "database.tar.gz";
const UPLOADS = "uploads";

function pgDir(dataDir: string): string {
  return path.join(dataDir, "pg");
}

function countFiles(dir: string): number {
  if (!fs.existsSync(dir)) return 0;
  let n = 0;
  for (const entry of fs.readdirSync(dir, { withFileTypes: true })) n += entry.isDirectory() ? countFiles(path.join(dir, entry.name)) : 1;
  return n;
}

/** Refuses to touch a data folder whose app is running (server.pid names a live process). */
function assertNotRunning(dataDir: string): void {
  const pidFile = path.join(dataDir, "server.pid");
  if (!fs.existsSync(pidFile)) return;
  const pid = Number(fs.readFileSync(pidFile, "utf8"));
  try {
    if (pid > 0) process.kill(pid, 0);
  } catch {
    return; // stale pid file
  }
  throw new Error(`Plateroom is running on this data folder (pid ${pid}). Stop it first.`);
}

export async function createBackup(paths: BackupPaths, archive: string): Promise<BackupManifest> {
  assertNotRunning(paths.dataDir);
  if (!fs.existsSync(pgDir(paths.dataDir))) throw new Error(`No database in ${paths.dataDir}.`);
  const work = fs.mkdtempSync(path.join(os.tmpdir(), "plateroom-backup-"));
  try {
    const db = new PGlite(pgDir(paths.dataDir));
    await db.waitReady;
    const dump = await db.dumpDataDir("gzip");
    await db.close();
    fs.writeFileSync(path.join(work, DATABASE), Buffer.from(await dump.arrayBuffer()));
    // Stored stills only; temp files of unfinished uploads are not worth keeping.
    for (const folder of ["originals", "previews", "thumbs"]) {
      const from = path.join(paths.uploadsDir, folder);
      if (fs.existsSync(from)) fs.cpSync(from, path.join(work, UPLOADS, folder), { recursive: true });
    }
    fs.mkdirSync(path.join(work, UPLOADS), { recursive: true });
    const manifest: BackupManifest = { format: "plateroom-backup", version: 1, createdAt: new Date().toISOString(), database: "pglite", files: countFiles(path.join(work, UPLOADS)) };
    fs.writeFileSync(path.join(work, MANIFEST), JSON.stringify(manifest, null, 2));
    fs.mkdirSync(path.dirname(path.resolve(archive)), { recursive: true });
    await tar.create({ gzip: true, file: archive, cwd: work, portable: true }, [MANIFEST, DATABASE, UPLOADS]);
    return manifest;
  } finally {
    fs.rmSync(work, { recursive: true, force: true });
  }
}

function isEmptyDir(dir: string): boolean {
  return !fs.existsSync(dir) || fs.readdirSync(dir).filter((f) => f !== ".gitkeep").length === 0;
}

/** Restores into an empty data folder (and an empty uploads folder); never over existing data. */
export async function restoreBackup(archive: string, paths: BackupPaths): Promise<BackupManifest> {
  if (!isEmptyDir(pgDir(paths.dataDir))) throw new Error(`${pgDir(paths.dataDir)} is not empty: restore only into an empty data folder.`);
  for (const folder of ["originals", "previews", "thumbs"]) {
    if (!isEmptyDir(path.join(paths.uploadsDir, folder))) throw new Error(`${paths.uploadsDir} already holds stills: restore only into an empty uploads folder.`);
  }
  const work = fs.mkdtempSync(path.join(os.tmpdir(), "plateroom-restore-"));
  try {
    await tar.extract({ file: archive, cwd: work, strict: true });
    const manifest = JSON.parse(fs.readFileSync(path.join(work, MANIFEST), "utf8")) as BackupManifest;
    if (manifest.format !== "plateroom-backup" || manifest.version !== 1) throw new Error("Not a Plateroom backup archive.");
    fs.mkdirSync(pgDir(paths.dataDir), { recursive: true });
    const dump = fs.readFileSync(path.join(work, DATABASE));
    const db = new PGlite(pgDir(paths.dataDir), { loadDataDir: new Blob([dump]) });
    await db.waitReady;
    await db.close();
    fs.mkdirSync(paths.uploadsDir, { recursive: true });
    fs.cpSync(path.join(work, UPLOADS), paths.uploadsDir, { recursive: true });
    return manifest;
  } finally {
    fs.rmSync(work, { recursive: true, force: true });
  }
}
