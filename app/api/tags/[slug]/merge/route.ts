import { apiRoute, parseJson } from "@/lib/api/handler";
import { requireUser } from "@/lib/auth/session";
import { mergeTags } from "@/lib/tags/mutations";
import { tagMergeSchema } from "@/lib/tags/schemas";

export const POST = apiRoute<{ slug: string }>(async (req, ctx) => {
  const user = await requireUser(req);
  const { into } = await parseJson(req, tagMergeSchema);
  const tag = await mergeTags(user, (await ctx.params).slug, into);
  return Response.json({ slug: tag.slug, name: tag.name, kind: tag.kind, aliases: tag.aliases });
});
