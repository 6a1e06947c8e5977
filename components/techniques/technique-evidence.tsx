import { Card, CardTitle } from "@/components/ui/card";
import { EvidencePanel } from "@/components/techniques/evidence-panel";
import { can } from "@/lib/auth/permissions";
import type { SessionUser } from "@/lib/auth/roles";
import { listPairsForTechnique, listStillsForTechnique } from "@/lib/stills/queries";
import type { TechniqueResponse } from "@/lib/techniques/schemas";

/** Before/after pairs and the lab: the evidence that the method works. */
export async function TechniqueEvidence({ user, technique }: { user: SessionUser; technique: TechniqueResponse }) {
  const [pairs, stills] = await Promise.all([listPairsForTechnique(user, technique.id), listStillsForTechnique(user, technique.id)]);
  return (
    <Card aria-labelledby="evidence-title">
      <CardTitle>
        <span id="evidence-title">Before and after</span>
      </CardTitle>
      <EvidencePanel
        slug={technique.slug}
        pairs={pairs}
        stills={stills}
        canUpload={can(user, "still:upload") && technique.status !== "retired"}
        isApproved={technique.approvedRevision !== null}
      />
    </Card>
  );
}
