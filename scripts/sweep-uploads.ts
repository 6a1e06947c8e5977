/**
 * `npm run uploads:sweep`: deletes files under PLATEROOM_UPLOADS_DIR that no still row
 * points at, and abandoned temp files, once older than the grace period (default one
 * hour; `--grace-minutes=N`). `--dry-run` only lists them. Run with
 * `tsx --conditions=react-server` so `server-only` imports resolve outside Next.js.
 */
import { closeDb } from "@/db/client";
import { env } from "@/lib/env";
import { SWEEP_GRACE_MS, sweepUploads } from "@/lib/stills/sweep";

async function main(): Promise<void> {
  const graceArg = process.argv.find((a) => a.startsWith("--grace-minutes="));
  const graceMs = graceArg ? Number(graceArg.split("=")[1]) * 60_000 : SWEEP_GRACE_MS;
  if (!Number.isFinite(graceMs) || graceMs < 0) throw new Error("--grace-minutes takes a number of minutes.");
  const dryRun = process.argv.includes("--dry-run");
  const result = await sweepUploads({ graceMs, remove: !dryRun });
  for (const file of result.removed) console.log(`${dryRun ? "would remove" : "removed"} ${file}`);
  console.log(`uploads in ${env.PLATEROOM_UPLOADS_DIR}: ${result.removed.length} ${dryRun ? "orphans found" : "removed"}, ${result.kept} kept`);
}

main()
  .catch((error: unknown) => {
    console.error(error);
    process.exitCode = 1;
  })
  .finally(() => closeDb());
