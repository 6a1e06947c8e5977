"use client";

import { useRouter } from "next/navigation";
import { StillUploader } from "@/components/stills/still-uploader";
import { EmptyState } from "@/components/ui/empty-state";
import { PairView } from "@/components/techniques/pair-view";
import type { RecipeStep } from "@/lib/lab/recipe";
import type { StillPairResponse, StillResponse } from "@/lib/stills/schemas";

type Props = { slug: string; pairs: StillPairResponse[]; stills: StillResponse[]; recipe: RecipeStep[]; canUpload: boolean };

/** The technique's before/after pairs, and for writers the place to add stills. */
export function EvidencePanel({ slug, pairs, canUpload }: Props) {
  const router = useRouter();
  return (
    <div className="space-y-4">
      {pairs.length ? pairs.map((pair) => <PairView key={pair.id} pair={pair} />) : <EmptyState title="No before/after stills yet." />}
      {canUpload ? (
        <details className="rounded border border-line p-3">
          <summary className="cursor-pointer text-sm font-medium">Add stills</summary>
          <StillUploader technique={slug} owner="technique" role="before" onUploaded={() => router.refresh()} className="mt-3" />
        </details>
      ) : null}
    </div>
  );
}
