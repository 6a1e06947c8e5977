import { apiRoute, parseWith, searchParamsOf } from "@/lib/api/handler";
import { requireUser } from "@/lib/auth/session";
import { revisionDiff } from "@/lib/techniques/history";
import { diffQuerySchema } from "@/lib/techniques/schemas";

/** A readable word-level diff between two revisions this person may see. */
export const GET = apiRoute<{ slug: string }>(async (req, ctx) => {
  const user = await requireUser(req);
  const { from, to } = parseWith(diffQuerySchema, searchParamsOf(req));
  return Response.json(await revisionDiff(user, (await ctx.params).slug, from, to));
});
