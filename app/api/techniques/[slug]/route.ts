import { BODY_LIMITS } from "@/lib/api/body-limits";
import { authedRoute, otherMethods } from "@/lib/api/handler";
import { updateTechnique } from "@/lib/techniques/mutations";
import { getTechnique } from "@/lib/techniques/queries";
import { updateTechniqueSchema } from "@/lib/techniques/schemas";

type Params = { slug: string };

/** Readers get the approved revision; seniors and leads the newest. A renamed slug still answers. */
export const GET = authedRoute<Params>(async (req, { user, params }) => {
  const { renamedFrom: _renamedFrom, ...technique } = await getTechnique(user, params.slug);
  return Response.json(technique);
});

export const PUT = authedRoute<Params>({ permission: "technique:write", bodyLimit: BODY_LIMITS.document }, async (req, { user, params, json }) => {
  const input = await json(updateTechniqueSchema);
  return Response.json(await updateTechnique(user, params.slug, input));
});

export const { HEAD, OPTIONS, POST, PATCH, DELETE } = otherMethods({ GET, PUT });
