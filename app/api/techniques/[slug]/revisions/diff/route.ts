import { authedRoute, otherMethods, parseWith, searchParamsOf } from "@/lib/api/handler";
import { revisionDiff } from "@/lib/techniques/history";
import { diffQuerySchema } from "@/lib/techniques/schemas";

/** A readable word-level diff between two revisions this person may see. */
export const GET = authedRoute<{ slug: string }>(async (req, { user, params }) => {
  const { from, to } = parseWith(diffQuerySchema, searchParamsOf(req));
  return Response.json(await revisionDiff(user, params.slug, from, to));
});

export const { HEAD, OPTIONS, POST, PUT, PATCH, DELETE } = otherMethods({ GET });
