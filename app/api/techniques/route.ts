import { BODY_LIMITS } from "@/lib/api/body-limits";
import { authedRoute, otherMethods, parseWith, searchParamsOf } from "@/lib/api/handler";
import { createTechnique } from "@/lib/techniques/mutations";
import { listTechniques } from "@/lib/techniques/queries";
import { createTechniqueSchema, listTechniquesQuerySchema, type TechniqueListResponse } from "@/lib/techniques/schemas";

export const GET = authedRoute(async (req, { user }) => {
  const q = parseWith(listTechniquesQuerySchema, searchParamsOf(req));
  const result = await listTechniques(user, { status: q.status, tag: q.tag, mine: Boolean(q.mine), limit: q.limit, offset: q.offset });
  return Response.json(result satisfies TechniqueListResponse);
});

export const POST = authedRoute({ permission: "technique:write", bodyLimit: BODY_LIMITS.document }, async (req, { user, json }) => {
  const input = await json(createTechniqueSchema);
  return Response.json(await createTechnique(user, input), { status: 201 });
});

export const { HEAD, OPTIONS, PUT, PATCH, DELETE } = otherMethods({ GET, POST });
