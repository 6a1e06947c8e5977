import { TechniqueLab } from "@/components/lab/technique-lab";
import { RecipeCards } from "@/components/techniques/recipe-cards";
import { Card, CardTitle } from "@/components/ui/card";
import { can } from "@/lib/auth/permissions";
import type { SessionUser } from "@/lib/auth/roles";
import { listStillsForTechnique } from "@/lib/stills/queries";
import type { TechniqueResponse } from "@/lib/techniques/schemas";

/** The recipe as readable cards, and the lab where anyone can run it on the page's stills or their own. */
export async function TechniqueLabSection({ user, technique }: { user: SessionUser; technique: TechniqueResponse }) {
  const stills = (await listStillsForTechnique(user, technique.id)).filter((s) => s.role !== "after");
  return (
    <Card aria-labelledby="parameters-title">
      <CardTitle>
        <span id="parameters-title">Parameters</span>
      </CardTitle>
      <RecipeCards recipe={technique.recipe} />
      {technique.recipe.length ? (
        <div className="mt-6 border-t border-line pt-4">
          <h3 className="mb-2 font-semibold">Try it</h3>
          <TechniqueLab
            slug={technique.slug}
            recipe={technique.recipe}
            stills={stills.map((s) => ({ id: s.id, alt: s.alt, width: s.width, height: s.height, bitDepth: s.bitDepth }))}
            canEditRecipe={can(user, "technique:write")}
          />
        </div>
      ) : null}
    </Card>
  );
}
