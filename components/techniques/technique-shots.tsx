import { Card, CardTitle } from "@/components/ui/card";
import { OutcomeChart } from "@/components/shots/outcome-chart";
import { UsesTable } from "@/components/shots/uses-table";
import { LogUseForm } from "@/components/shots/log-use-form";
import { can } from "@/lib/auth/permissions";
import type { SessionUser } from "@/lib/auth/roles";
import { listTechniqueUses } from "@/lib/uses/queries";
import type { TechniqueResponse } from "@/lib/techniques/schemas";

/** Where the technique was used and how it went: outcome counts, the shot table, and logging a use. */
export async function TechniqueShots({ user, technique }: { user: SessionUser; technique: TechniqueResponse }) {
  const uses = await listTechniqueUses(user, technique.slug, { limit: 500 });
  return (
    <Card aria-labelledby="shots-title">
      <CardTitle>
        <span id="shots-title">Used on shots</span>
      </CardTitle>
      <div className="grid gap-4 md:grid-cols-[14rem_minmax(0,1fr)]">
        <OutcomeChart counts={uses.counts} />
        <UsesTable initial={uses.items} />
      </div>
      {can(user, "use:log") && technique.status !== "retired" ? (
        <details className="mt-4 rounded border border-line p-3">
          <summary className="cursor-pointer text-sm font-medium">Log that you used this on a shot</summary>
          <LogUseForm slug={technique.slug} />
        </details>
      ) : null}
    </Card>
  );
}
