import { Card, CardTitle } from "@/components/ui/card";
import { LazyDetails } from "@/components/ui/lazy-details";
import { OutcomeChart } from "@/components/shots/outcome-chart";
import { UsesTableLoader } from "@/components/shots/uses-table-loader";
import { LogUseForm } from "@/components/shots/log-use-form";
import { can } from "@/lib/auth/permissions";
import type { SessionUser } from "@/lib/auth/roles";
import { outcomeCountsForPage } from "@/lib/techniques/page-data";
import type { TechniqueResponse } from "@/lib/techniques/schemas";

/** Where the technique was used and how it went: outcome counts, the shot table, and logging a use. */
export async function TechniqueShots({ user, technique }: { user: SessionUser; technique: TechniqueResponse }) {
  const counts = await outcomeCountsForPage(user, technique.slug);
  return (
    <Card aria-labelledby="shots-title">
      <CardTitle>
        <span id="shots-title">Used on shots</span>
      </CardTitle>
      <div className="grid gap-4 md:grid-cols-[14rem_minmax(0,1fr)]">
        <OutcomeChart counts={counts} />
        <UsesTableLoader slug={technique.slug} />
      </div>
      {can(user, "use:log") && technique.status !== "retired" ? (
        <LazyDetails className="mt-4 rounded border border-line p-3" summary="Log that you used this on a shot">
          <LogUseForm slug={technique.slug} />
        </LazyDetails>
      ) : null}
    </Card>
  );
}
