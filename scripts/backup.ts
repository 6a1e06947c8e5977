/**
 * npm run backup [-- archive.tar.gz]   — database and stills in one archive (the app must be stopped)
 * npm run restore -- archive.tar.gz    — into an empty PLATEROOM_DATA_DIR / PLATEROOM_UPLOADS_DIR
 */
import path from "node:path";
import { createBackup, restoreBackup } from "@/lib/backup/archive";

const [mode, archiveArg] = process.argv.slice(2);
const paths = { dataDir: path.resolve(process.env.PLATEROOM_DATA_DIR ?? ".data"), uploadsDir: path.resolve(process.env.PLATEROOM_UPLOADS_DIR ?? "uploads") };
if (process.env.DATABASE_URL) {
  console.error("DATABASE_URL is set: back up the PostgreSQL server with pg_dump, and the uploads folder with your file backups.");
  process.exit(2);
}
try {
  if (mode === "backup") {
    const archive = path.resolve(archiveArg ?? `backups/plateroom-${new Date().toISOString().replace(/[:.]/g, "-")}.tar.gz`);
    const manifest = await createBackup(paths, archive);
    console.log(`Backup written: ${archive} (${manifest.files} stored files)`);
  } else if (mode === "restore" && archiveArg) {
    const manifest = await restoreBackup(path.resolve(archiveArg), paths);
    console.log(`Restored the backup of ${manifest.createdAt} into ${paths.dataDir} and ${paths.uploadsDir}.`);
  } else {
    console.error("Usage: npm run backup [-- archive.tar.gz] | npm run restore -- archive.tar.gz");
    process.exit(2);
  }
} catch (error) {
  console.error((error as Error).message);
  process.exit(1);
}
