import "server-only";
import { referencedHashes } from "@/lib/stills/queries";
import { sweepOrphans, type SweepResult } from "@/lib/stills/storage";

/**
 * Removes stored files no still row references, and stale temp files, under the uploads
 * folder (`npm run uploads:sweep`). `remove: false` only lists them.
 */
export function sweepUploads(options: { root?: string; graceMs?: number; now?: number; remove?: boolean } = {}): Promise<SweepResult> {
  return sweepOrphans({ ...options, referenced: referencedHashes });
}
