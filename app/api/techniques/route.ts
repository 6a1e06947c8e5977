import { apiRoute, parseJson, parseWith, searchParamsOf } from "@/lib/api/handler";
import { requireUser } from "@/lib/auth/session";
import { createTechnique } from "@/lib/techniques/mutations";
import { listTechniques } from "@/lib/techniques/queries";
import { createTechniqueSchema, listTechniquesQuerySchema, type TechniqueListResponse } from "@/lib/techniques/schemas";

export const GET = apiRoute(async (req) => {
  const user = await requireUser(req);
  const q = parseWith(listTechniquesQuerySchema, searchParamsOf(req));
  const result = await listTechniques(user, { status: q.status, tag: q.tag, mine: Boolean(q.mine), limit: q.limit, offset: q.offset });
  return Response.json(result satisfies TechniqueListResponse);
});

export const POST = apiRoute(async (req) => {
  const user = await requireUser(req);
  const input = await parseJson(req, createTechniqueSchema);
  return Response.json(await createTechnique(user, input), { status: 201 });
});
