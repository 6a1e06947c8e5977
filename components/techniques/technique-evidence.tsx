import { Card, CardTitle } from "@/components/ui/card";
import { EvidencePanel } from "@/components/techniques/evidence-panel";
import { can } from "@/lib/auth/permissions";
import type { SessionUser } from "@/lib/auth/roles";
import { pairsForPage, stillsForPage } from "@/lib/techniques/page-data";
import type { TechniqueResponse } from "@/lib/techniques/schemas";

/** Before/after pairs and the lab: the evidence that the method works. */
export async function TechniqueEvidence({ user, technique }: { user: SessionUser; technique: TechniqueResponse }) {
  const [readPairs, stills] = await Promise.all([pairsForPage(user, technique.id), stillsForPage(user, technique.id)]);
  // The same still objects in pairs and list, so the page's payload carries each still once.
  const byId = new Map(stills.map((s) => [s.id, s]));
  const pairs = readPairs.map((p) => ({ ...p, before: byId.get(p.before.id) ?? p.before, after: byId.get(p.after.id) ?? p.after }));
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
