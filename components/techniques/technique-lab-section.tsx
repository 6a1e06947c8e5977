import { TechniqueLabLoader, TechniqueLabWithApplyLoader } from "@/components/techniques/technique-lab-loader";
import { RecipeCards } from "@/components/techniques/recipe-cards";
import { Card, CardTitle } from "@/components/ui/card";
import { can } from "@/lib/auth/permissions";
import type { SessionUser } from "@/lib/auth/roles";
import { pairsForPage, stillsForPage } from "@/lib/techniques/page-data";
import type { StillResponse } from "@/lib/stills/schemas";
import type { TechniqueResponse } from "@/lib/techniques/schemas";

/** The recipe as readable cards, and the lab where anyone can run it on the page's stills or their own. */
export async function TechniqueLabSection({ user, technique }: { user: SessionUser; technique: TechniqueResponse }) {
  const [all, pairs] = await Promise.all([stillsForPage(user, technique.id), pairsForPage(user, technique.id)]);
  // The lab opens on the first one: the before still of the first pair, then other before stills, then the rest.
  const pairBefore = pairs.map((p) => p.before.id);
  const rank = (s: StillResponse) => (pairBefore.includes(s.id) ? pairBefore.indexOf(s.id) : s.role === "before" ? pairBefore.length : pairBefore.length + 1);
  const stills = all.filter((s) => s.role !== "after").sort((a, b) => rank(a) - rank(b));
  const labStills = stills.map((s) => ({ id: s.id, alt: s.alt, width: s.width, height: s.height, bitDepth: s.bitDepth, colourSpace: s.colourSpace, format: s.format }));
  return (
    <Card aria-labelledby="parameters-title">
      <CardTitle>
        <span id="parameters-title">Parameters</span>
      </CardTitle>
      <RecipeCards recipe={technique.recipe} stills={all.map((s) => ({ id: s.id, alt: s.alt }))} />
      {technique.recipe.length ? (
        <div className="mt-6 border-t border-line pt-4">
          <h3 className="mb-2 font-semibold">Try it</h3>
          {/* Editors get "Apply to recipe" (a new revision); everyone else tries matrices on a working copy. */}
          {can(user, "technique:write") && !technique.retiredAt ? (
            <TechniqueLabWithApplyLoader
              stills={labStills}
              technique={{
                slug: technique.slug,
                recipe: technique.recipe,
                latestRevision: technique.latestRevision,
                approved: technique.approvedRevision !== null,
              }}
            />
          ) : (
            <TechniqueLabLoader slug={technique.slug} recipe={technique.recipe} stills={labStills} canEditRecipe={false} />
          )}
        </div>
      ) : null}
    </Card>
  );
}
