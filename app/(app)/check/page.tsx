import type { Metadata } from "next";
import Link from "next/link";
import { FrameDrop } from "@/components/plate-check/frame-drop";
import { Card, CardTitle } from "@/components/ui/card";
import { EmptyState } from "@/components/ui/empty-state";
import { requireUser } from "@/lib/auth/session";
import { utcTime } from "@/lib/plate-check/format";
import { listMyChecks } from "@/lib/plate-check/queries";
import { stillUrl } from "@/lib/stills/schemas";
import { env } from "@/lib/env";

export const metadata: Metadata = { title: "Plate check" };

/** Drop a frame to have it measured; the reader's earlier checks below. */
export default async function CheckPage() {
  const user = await requireUser();
  const mine = await listMyChecks(user);
  return (
    <div className="space-y-6">
      <div className="space-y-1">
        <h1 className="text-2xl font-semibold">Plate check</h1>
        <p className="max-w-3xl text-sm text-muted">
          Not sure what to call what you see? Drop the frame. Plateroom measures the backing screen and how even it is, tracking markers and
          their shades, dead or hot pixels, dust and hairs, noise per channel and clipping — says how sure it is of each — then lists the
          department&apos;s methods for what it found and tries them on your frame side by side. The frame stays your private trial.
        </p>
      </div>
      <FrameDrop maxBytes={env.PLATEROOM_MAX_UPLOAD_BYTES} />
      <Card>
        <CardTitle>Frames you checked</CardTitle>
        {mine.length ? (
          <ul className="grid gap-3 sm:grid-cols-2 lg:grid-cols-3">
            {mine.map((c) => (
              <li key={c.stillId}>
                <Link href={`/stills/${c.stillId}`} className="flex gap-3 rounded border border-line p-2 hover:border-accent">
                  {/* eslint-disable-next-line @next/next/no-img-element -- private, permission-checked still */}
                  <img src={stillUrl(c.stillId, "thumb")} alt="" className="h-16 w-24 shrink-0 rounded object-cover" />
                  <span className="min-w-0 text-sm">
                    <span className="block truncate font-medium">{c.alt}</span>
                    <span className="block text-xs text-muted">{utcTime(c.checkedAt)}</span>
                    <span className="line-clamp-2 block text-xs text-muted">{c.summary}</span>
                  </span>
                </Link>
              </li>
            ))}
          </ul>
        ) : (
          <EmptyState title="No frames checked yet.">Drop one above; it opens on its own page with the findings.</EmptyState>
        )}
      </Card>
    </div>
  );
}
