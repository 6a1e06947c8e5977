"use client";

import { useRouter } from "next/navigation";
import { CompareView } from "@/components/stills/compare-view";
import { PairEditor } from "@/components/stills/pair-editor";
import { StillUploader } from "@/components/stills/still-uploader";
import { EmptyState } from "@/components/ui/empty-state";
import type { StillPairResponse, StillResponse } from "@/lib/stills/schemas";

type Props = { slug: string; pairs: StillPairResponse[]; stills: StillResponse[]; canUpload: boolean };

/** The technique's before/after pairs in the compare view, and for writers the place to add and pair stills. */
export function EvidencePanel({ slug, pairs, stills, canUpload }: Props) {
  const router = useRouter();
  return (
    <div className="space-y-6">
      {pairs.length ? (
        pairs.map((pair) => <CompareView key={pair.id} before={pair.before} after={pair.after} caption={pair.caption} />)
      ) : (
        <EmptyState title="No before/after stills yet." />
      )}
      {stills.length ? (
        <p className="flex flex-wrap gap-x-3 gap-y-1 text-sm">
          <span className="text-muted">Plate check of each still:</span>
          {stills.map((s) => (
            <a key={s.id} href={`/stills/${s.id}`} className="text-accent underline-offset-2 hover:underline">
              {s.alt}
            </a>
          ))}
        </p>
      ) : null}
      {canUpload ? (
        <details className="rounded border border-line p-3">
          <summary className="cursor-pointer text-sm font-medium">Add stills and pair them</summary>
          <div className="mt-3 space-y-4">
            <StillUploader technique={slug} owner="technique" role="before" onUploaded={() => router.refresh()} />
            {stills.length >= 2 ? <PairEditor technique={slug} stills={stills} onSaved={() => router.refresh()} /> : <p className="text-sm text-muted">Upload two stills to pair them as before and after.</p>}
          </div>
        </details>
      ) : null}
    </div>
  );
}
