import { apiRoute, parseJson } from "@/lib/api/handler";
import { requireUser } from "@/lib/auth/session";
import { updateTechnique } from "@/lib/techniques/mutations";
import { getTechnique } from "@/lib/techniques/queries";
import { updateTechniqueSchema } from "@/lib/techniques/schemas";

type Params = { slug: string };

/** Readers get the approved revision; seniors and leads the newest. A renamed slug still answers. */
export const GET = apiRoute<Params>(async (req, ctx) => {
  const user = await requireUser(req);
  const { renamedFrom: _renamedFrom, ...technique } = await getTechnique(user, (await ctx.params).slug);
  return Response.json(technique);
});

export const PUT = apiRoute<Params>(async (req, ctx) => {
  const user = await requireUser(req);
  const input = await parseJson(req, updateTechniqueSchema);
  return Response.json(await updateTechnique(user, (await ctx.params).slug, input));
});
