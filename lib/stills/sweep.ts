import "server-only";
import { referencedHashes } from "@/lib/stills/queries";
import { sweepOrphans, type SweepResult } from "@/lib/stills/storage";

/** Removes stored files no still row references (and stale temp files) under the uploads folder. */
export function sweepUploads(options: { root?: string; graceMs?: number; now?: number } = {}): Promise<SweepResult> {
  return sweepOrphans({ ...options, referenced: referencedHashes });
}
